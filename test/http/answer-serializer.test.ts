// RESPONSE_SCHEMA_CHECK=off (production) writes a comparison's answer with plain
// JSON.stringify instead of the schema serializer. That is only sound if the
// schema would neither drop, rename nor re-encode anything in the answer: the
// two must send the same JSON value, and the record must hold the same result.
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import { demoComparison } from '../../scripts/demo-data.ts';
import { answerJson } from '../../src/http/answer-serializer.ts';

const predict = { columns: { peakTemp: [1190, 1230], holdMinutes: [30, 45], moisture: [5.5, 7.0], kiln: ['east', 'west'] } };
const bodies = {
  'the demo': demoComparison(),
  '300 rows': demoComparison(300),
  'the demo with predictions': { ...demoComparison(), options: { predict } },
  'a model fitted elsewhere': {
    data: { columns: { y: [1.2, 2.3, 2.9, 4.2, 5.1, 5.8, 7.2, 8.1] , x: [1, 2, 3, 4, 5, 6, 7, 8] } },
    response: 'y',
    candidates: [{ name: 'line', terms: ['x'] }, { name: 'vendor', rss: 0.6, parameters: 3 }],
  },
};

t.test('plain JSON and the schema serializer send the same answer', async (t) => {
  const checked = await buildTestApp(t, { responseSchemaCheck: true });
  const plain = await buildTestApp(t, { responseSchemaCheck: false });
  for (const [name, payload] of Object.entries(bodies)) {
    const a = await checked.app.inject({ method: 'POST', url: '/v1/comparisons', payload });
    const b = await plain.app.inject({ method: 'POST', url: '/v1/comparisons', payload });
    t.equal(a.statusCode, b.statusCode, `${name}: same status`);
    const { id: idA, createdAt: _a, ...answerA } = a.json();
    const { id: idB, createdAt: _b, ...answerB } = b.json();
    t.strictSame(answerB, answerA, `${name}: same answer`);
    if (a.statusCode !== 200) continue;
    const stored = await plain.store.get(idB);
    const { serviceVersion: _v, ...resultB } = answerB;
    t.strictSame(stored?.result, resultB, `${name}: the record holds what was sent`);
    t.ok(idA);
  }
});

t.test('the answer made from the result text already written is the text JSON.stringify writes', async (t) => {
  const envelope = { id: '0190a1b2-0000-7000-8000-000000000001', createdAt: '2026-03-14T09:30:00.125Z', serviceVersion: '0.1.0' };
  const result = { conventions: { version: '1' }, models: [{ name: 'a "quoted" kiln', aicc: -1.5e-7 }], empty: {}, list: [] };
  t.equal(answerJson(envelope, result, JSON.stringify(result)), JSON.stringify({ ...envelope, ...result }));
  t.equal(answerJson(envelope, { id: 'x', n: 1 }, '{"id":"x","n":1}'), null, 'a result repeating an envelope key is written the ordinary way');
  t.equal(answerJson(envelope, {}, '{}'), null, 'so is an empty result');
});

t.test('production answers: JSON type with its charset, and the bytes JSON.stringify of the same value writes', async (t) => {
  const { app } = await buildTestApp(t, { responseSchemaCheck: false });
  const r = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: demoComparison() });
  t.equal(r.statusCode, 200);
  t.equal(r.headers['content-type'], 'application/json; charset=utf-8');
  t.equal(r.body, JSON.stringify(r.json()), 'no whitespace, keys in the order written');
  t.match(r.body, /^\{"id":"[^"]+","createdAt":"[^"]+","serviceVersion":"[^"]+","/, 'the envelope first');
});
