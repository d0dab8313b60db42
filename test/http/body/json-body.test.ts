// The JSON body parser (src/http/json-body.ts): deep nesting and duplicate
// keys are 400s naming where they are, today's refusals keep their paths, and
// anything else parses exactly as JSON.parse would. I-JSON (RFC 7493 §2.3)
// requires object member names to be unique; that is the rule checked here.
import t from 'tap';
import fc from 'fast-check';
import { parseJsonBody } from '../../../src/http/json-body.ts';
import { buildTestApp } from '../../helper.ts';

// Demo scenario (invented): glaze thickness against kiln settings.
const valid = {
  data: { columns: { thickness: [0.41, 0.44, 0.47, 0.45, 0.52, 0.55], dwell: [20, 22, 25, 24, 28, 30] } },
  response: 'thickness',
  candidates: [{ name: 'by-dwell', terms: ['dwell'] }, { name: 'dwell-squared', terms: ['dwell', { kind: 'power', of: 'dwell', degree: 2 }] }],
};
const post = (payload: string) => ({ method: 'POST' as const, url: '/v1/comparisons', headers: { 'content-type': 'application/json' }, payload });

const refusedAt = (text: string, depth = 64) => {
  const parsed = parseJsonBody(text, depth);
  return 'refused' in parsed ? { kind: parsed.refused.kind, path: parsed.refused.path, facts: parsed.refused.facts, message: parsed.refused.message } : null;
};

t.test('nesting: the limit itself is accepted, one level more is refused with the depth, the limit and the path', async (t) => {
  const nest = (levels: number) => '{"a":'.repeat(levels - 1) + '[1]' + '}'.repeat(levels - 1);
  t.equal(refusedAt(nest(64)), null, '64 levels with a limit of 64');
  const over = refusedAt(nest(65));
  t.equal(over?.kind, 'too-deep');
  t.same(over?.facts, { depth: 65, limit: 64, setting: 'JSON_MAX_DEPTH' });
  t.equal(over?.path, Array(64).fill('a').join('/'), 'the path of the container that crossed the limit');
  t.match(over?.message, /65 levels deep.*limit is 64 \(JSON_MAX_DEPTH\)/);
  t.equal(refusedAt('[[[1]]]', 2)?.path, '0/0');
  // Brackets inside strings are text, not nesting.
  t.equal(refusedAt(JSON.stringify({ label: '[[[[[[[[{{{{{{{{', q: '\\"[[[[' }), 2), null);
});

t.test('a deeply nested body over HTTP: 400 naming the depth, quickly, and the service still answers', async (t) => {
  const { app } = await buildTestApp(t);
  // A million levels in 2 MB: JSON.parse alone would build a million arrays.
  const text = `{"data":${'['.repeat(1_000_000)}${']'.repeat(1_000_000)}}`;
  const res = await app.inject(post(text));
  t.equal(res.statusCode, 400, res.body.slice(0, 300));
  t.match(res.headers['content-type'], /^application\/problem\+json/);
  const body = res.json();
  t.equal(body.type, 'urn:parsimetry:problem:invalid-request');
  t.equal(body.limit, 64);
  t.equal(body.depth, 65);
  t.equal(body.setting, 'JSON_MAX_DEPTH');
  t.equal(body.errors[0].code, 'too-deep');
  t.equal(body.errors[0].path, `data/${Array(63).fill(0).join('/')}`);
  t.match(body.detail, /JSON_MAX_DEPTH/);
  t.equal((await app.inject('/healthz')).statusCode, 200, 'liveness');
  t.equal((await app.inject(post(JSON.stringify(valid)))).statusCode, 200, 'the next comparison is computed');
});

t.test('JSON_MAX_DEPTH is the setting that decides', async (t) => {
  const { app } = await buildTestApp(t, { jsonMaxDepth: 4 });
  const res = await app.inject(post(JSON.stringify(valid)));
  t.equal(res.statusCode, 400, 'a power term sits 5 levels deep');
  t.equal(res.json().errors[0].path, 'candidates/1/terms/1');
  t.equal(res.json().limit, 4);
});

t.test('duplicate keys at several depths are 400s naming the repeated key', async (t) => {
  const { app } = await buildTestApp(t);
  const text = JSON.stringify(valid);
  const cases: [string, string, string][] = [
    ['the top level', text.replace('"response":"thickness"', '"response":"thickness","response":"dwell"'), 'response'],
    ['a column name', text.replace('"dwell":[20', '"thickness":[20'), 'data/columns/thickness'],
    ['a candidate', text.replace('"name":"by-dwell"', '"name":"by-dwell","terms":[],"name":"other"'), 'candidates/0/name'],
    ['a term object, written differently', text.replace('"degree":2', '"degree":2,"degr\\u0065e":3'), 'candidates/1/terms/1/degree'],
    ['with white space around the colon', text.replace('"response":"thickness"', '"response" :"thickness", "response"\n:"x"'), 'response'],
  ];
  for (const [where, body, path] of cases) {
    const res = await app.inject(post(body));
    t.equal(res.statusCode, 400, `${where}: ${res.body.slice(0, 200)}`);
    const problem = res.json();
    t.equal(problem.title, 'The request repeats a key', where);
    t.equal(problem.errors[0].path, path, where);
    t.equal(problem.errors[0].code, 'duplicate-key', where);
    t.match(problem.detail, /RFC 7493/, where);
  }
  t.equal((await app.inject(post(text))).statusCode, 200, 'the same body without the repetition is computed');
});

t.test('the same key in different objects is not a duplicate; a key equal to a string value is not either', async (t) => {
  t.equal(refusedAt('{"a":{"x":1},"b":{"x":2},"c":[{"x":1},{"x":2}]}'), null);
  t.equal(refusedAt('{"a":"a","b":["a","b"],"c":{"a":"c"}}'), null);
  t.equal(refusedAt('{"a\\"b":1,"a\\\\":2,"a":3}'), null, 'escaped quotes and backslashes inside keys');
  t.equal(refusedAt('[{"x":1,"y":2},{"x":3,"x":4}]')?.path, '1/x');
  // Strings that look like a key's end to the quick count take the exact path, and pass.
  t.equal(refusedAt('{"label":":x","note":"said \\": so","c":[": y", " :z"]}'), null);
});

t.test("today's refusals keep their paths", async (t) => {
  t.same(refusedAt('{"a":{"__proto__":{"polluted":true}}}'), { kind: 'unsafe-key', path: 'a/__proto__', facts: {}, message: 'the key "__proto__" is refused: it could alter object prototypes' });
  t.equal(refusedAt('{"candidates":[{"constructor":{"prototype":{}}}]}')?.path, 'candidates/0/constructor');
  t.equal(refusedAt('{"constructor":"kiln"}'), null, 'a plain constructor key is data');
  t.equal(refusedAt('{"data":{"columns":{"kiln":["east","we\\u0000st"]}}}')?.path, 'data/columns/kiln/1');
  t.equal(refusedAt('{"data":{"columns":{"kiln":["east","\\ud800"]}}}')?.kind, 'bad-text');
  t.equal(refusedAt('{"k\\udc00":1}')?.path, 'k\udc00');
  t.equal(refusedAt('"\\u0000"')?.path, '', 'the root itself');
  // The first offender in document order is the one named.
  t.equal(refusedAt('{"a":{"b":"\\u0000"},"c":"\\u0000"}')?.path, 'a/b');
  t.equal(refusedAt('{"a":[1,2,{"b":[null,"\\ud800"]}],"c":"\\u0000"}')?.path, 'a/2/b/1');
  t.equal(refusedAt('')?.kind, 'invalid-json');
  t.equal(refusedAt('{"a":')?.kind, 'invalid-json');
  t.equal(refusedAt('[[[[[[', 3)?.kind, 'too-deep', 'unclosed but already too deep');
});

t.test('any JSON value without repeated keys parses exactly as JSON.parse does', async (t) => {
  // Object keys from a small alphabet so that nested objects share names.
  const key = fc.constantFrom('a', 'b', 'x', 'kiln', 'é', '"q"', 'a\\b');
  const value = fc.letrec((tie) => ({
    node: fc.oneof({ depthSize: 'small' }, fc.double({ noNaN: true, noDefaultInfinity: true }), fc.constantFrom(null, true, false), fc.string({ unit: 'grapheme' }),
      fc.array(tie('node'), { maxLength: 4 }), fc.dictionary(key, tie('node'), { maxKeys: 4 })),
  })).node;
  fc.assert(fc.property(value, fc.boolean(), (v, pretty) => {
    const text = JSON.stringify(v, null, pretty ? 2 : undefined);
    const parsed = parseJsonBody(text, 64);
    return 'value' in parsed && JSON.stringify(parsed.value) === JSON.stringify(JSON.parse(text));
  }), { numRuns: 500 });
});

t.test('a key repeated anywhere in a random value is found', async (t) => {
  const value = fc.letrec((tie) => ({
    node: fc.oneof({ depthSize: 'small' }, fc.integer(), fc.string(), fc.array(tie('node'), { maxLength: 3 }), fc.dictionary(fc.constantFrom('a', 'b', 'c'), tie('node'), { maxKeys: 3 })),
  })).node;
  fc.assert(fc.property(fc.dictionary(fc.constantFrom('p', 'q'), value, { minKeys: 1, maxKeys: 2 }), (v) => {
    // Write the first key of the top object twice.
    const [first] = Object.keys(v);
    const text = JSON.stringify(v).replace(/^\{/, `{${JSON.stringify(first)}:0,`);
    const r = refusedAt(text);
    return r?.kind === 'duplicate-key' && r.path === first;
  }), { numRuns: 300 });
});
