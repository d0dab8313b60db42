// Model averaging says truly why a model of another kind is left out of the
// averaged coefficients (found by trying the new kinds as a new user would).
import t from 'tap';
import { buildTestApp } from '../helper.ts';

// A nonlinear fit is priced at its iteration cap, which puts even a small one
// above COMPUTE_INLINE_WORK (price-candidate.ts); these tests check numbers,
// not where they are computed (limits/nonlinear-inline-and-pool does that), so
// they compute on the main thread rather than start a worker pool per app.
const ON_MAIN_THREAD = { computeInlineWork: 1e12 };

t.test('a nonlinear model beside a linear one: left out of the coefficients as a nonlinear model', async (t) => {
  const { app } = await buildTestApp(t, ON_MAIN_THREAD);
  const x = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
  const y = x.map((v, i) => 2 + 0.5 * v + ((i * 7) % 5) / 10);
  const res = await app.inject({
    method: 'POST', url: '/v1/comparisons',
    payload: { data: { columns: { x, y } }, response: 'y', candidates: [{ name: 'line', terms: ['x'] }, { name: 'curve', expression: 'a + b*x^c', start: { a: 2, b: 0.5, c: 1 } }] },
  });
  t.equal(res.statusCode, 200, res.body.slice(0, 300));
  const excluded = (res.json().averaged?.excluded ?? []) as { name: string; reason: string }[];
  const curve = excluded.find((e) => e.name === 'curve');
  t.match(curve?.reason, /nonlinear model/, JSON.stringify(excluded));
  t.notMatch(curve?.reason, /design columns carry no identity/);
});
