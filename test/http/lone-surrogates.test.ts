// A lone UTF-16 surrogate is not Unicode text (a surrogate code point is only
// valid as half of a pair; common practice) and has no UTF-8 encoding. The body
// parser (src/http/json-body.ts) refuses it with a 400 at the field, wherever
// it sits; the core's fingerprint keeps such text distinct all the same
// (test/core/fingerprint.test.ts). Paired surrogates (an emoji) and U+FFFD
// itself are text.
import t from 'tap';
import { buildTestApp } from '../helper.ts';

const base = {
  data: { columns: { shrinkage: [6.1, 6.5, 7.2, 7.0, 7.9, 8.4], kiln: ['east', 'west', 'east', 'west', 'east', 'west'] } },
  response: 'shrinkage',
  candidates: [{ name: 'by-kiln', terms: ['kiln'] }],
};

// JSON text with the escape itself, as a client would send it.
const send = (text: string) => ({ method: 'POST' as const, url: '/v1/comparisons', headers: { 'content-type': 'application/json' }, payload: text });

t.test('a lone surrogate in a text value is a 400 naming the cell', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject(send(JSON.stringify(base).replace('"west"', '"\\ud800"')));
  t.equal(res.statusCode, 400, res.body.slice(0, 300));
  const errors = res.json().errors as { path: string; message: string }[];
  t.ok(errors.some((e) => e.path === 'data/columns/kiln/1' && /lone UTF-16 surrogate/.test(e.message)), JSON.stringify(errors));
});

t.test('a lone surrogate in a column name is a 400 naming the column', async (t) => {
  const { app } = await buildTestApp(t);
  const text = JSON.stringify(base).replace('"kiln":', '"kiln\\udc00":');
  const res = await app.inject(send(text));
  t.equal(res.statusCode, 400, res.body.slice(0, 300));
  const errors = res.json().errors as { path: string; message: string }[];
  t.ok(errors.some((e) => e.path.startsWith('data/columns/kiln') && /lone UTF-16 surrogate/.test(e.message)), JSON.stringify(errors));
  // The same name where a term refers to it.
  const inTerm = await app.inject(send(JSON.stringify(base).replace('["kiln"]', '["kiln\\ud800"]')));
  t.equal(inTerm.statusCode, 400);
  t.ok((inTerm.json().errors as { path: string }[]).some((e) => e.path.startsWith('candidates/0/terms/0')));
});

t.test('paired surrogates and U+FFFD are text, and fingerprint differently', async (t) => {
  const { app } = await buildTestApp(t);
  const emoji = await app.inject(send(JSON.stringify(base).replaceAll('"west"', '"\\ud83d\\udd25"')));
  const replacement = await app.inject(send(JSON.stringify(base).replaceAll('"west"', '"\\ufffd"')));
  t.equal(emoji.statusCode, 200, emoji.body.slice(0, 300));
  t.equal(replacement.statusCode, 200, replacement.body.slice(0, 300));
  t.not(emoji.json().dataset.fingerprint, replacement.json().dataset.fingerprint);
});
