// Nonlinear candidates run where their price puts them, with the same answer
// to the last digit either way (one pure function, two places to run it). A
// nonlinear fit is priced at its iteration cap, and the bookkeeping of 1,000
// iterations alone (about 25 ms of CPU, measured: price-candidate.ts) is more
// than COMPUTE_INLINE_WORK allows the main thread, so even a small one runs on
// a worker unless the setting is raised.
// Data: kiln drying of our own making (moisture = 6 + 36 e^(−0.045 h) plus a
// deterministic wobble), no randomness in tests.
import t from 'tap';
import { buildTestApp } from '../../helper.ts';
import { defaultConfig } from '../../../src/config.ts';
import { priceCaps } from '../../../src/http/compute/caps.ts';
import { priceComparisonRequest } from '../../../src/http/compute/price-request.ts';
import { ComparisonRequest } from '../../../src/http/schemas/comparison-request.ts';
import { DEFAULT_ACTIVE_POLICY } from '../../../src/policy-file.ts';

function kiln(rows: number) {
  const hours = Array.from({ length: rows }, (_, i) => (96 * i) / (rows - 1));
  const moisture = hours.map((h, i) => 6 + 36 * Math.exp(-0.045 * h) + 0.5 * Math.sin(12.9898 * i) * Math.cos(0.37 * i));
  return {
    data: { columns: { hours, moisture } },
    response: 'moisture',
    candidates: [
      { name: 'equilibrium', expression: 'eq + (m0 - eq)*exp(-k*hours)', starts: [{ eq: 5, m0: 40, k: 0.03 }, { eq: 0, m0: 50, k: 0.1 }], bounds: { k: [0, null] } },
      { name: 'quadratic', terms: ['hours', { kind: 'power', of: 'hours', degree: 2 }] },
    ],
    options: { predict: { columns: { hours: [12, 48] } } },
  };
}

const workOf = (payload: object) => {
  const priced = priceComparisonRequest(ComparisonRequest.parse(payload), DEFAULT_ACTIVE_POLICY, priceCaps(defaultConfig()));
  if ('issues' in priced) throw new Error(priced.issues[0].message);
  return priced.price.work;
};

t.test('a nonlinear comparison is priced at its iteration cap: on a worker by default, more work for more rows', async (t) => {
  const inline = defaultConfig().computeInlineWork;
  const small = workOf(kiln(20));
  t.ok(small > inline, `20 rows, two starts: ${small.toExponential(2)} > COMPUTE_INLINE_WORK ${inline} (the cap's worst case)`);
  t.ok(small <= 10 * inline, 'but within ten times the inline limit: the bookkeeping of 2,000 iterations, not a large fit');
  t.ok(workOf(kiln(4000)) > 10 * small, `4,000 rows: ${workOf(kiln(4000)).toExponential(2)}, over ten times the 20-row price`);
});

for (const rows of [20, 4000]) {
  t.test(`${rows} rows: inline and pooled answers agree exactly`, async (t) => {
    const payload = kiln(rows);
    const a = await (await buildTestApp(t, { computeInlineWork: 1e15 })).app.inject({ method: 'POST', url: '/v1/comparisons', payload });
    const pooled = (await buildTestApp(t, { computeInlineWork: 0 })).app;
    const b = await pooled.inject({ method: 'POST', url: '/v1/comparisons', payload });
    t.equal(a.statusCode, 200, a.statusCode === 200 ? 'inline' : a.body.slice(0, 300));
    t.equal(b.statusCode, 200, b.statusCode === 200 ? 'pooled' : b.body.slice(0, 300));
    const strip = (r: Record<string, unknown>) => ({ ...r, id: undefined, createdAt: undefined });
    t.same(strip(b.json()), strip(a.json()), 'the same answer');
    t.equal(b.json().models[0].convergence.starts.length, 2);
    t.equal(b.json().models[0].predictions.length, 2, 'predictions made on the worker');
    const replay = await pooled.inject({ method: 'POST', url: `/v1/comparisons/${b.json().id}/replay` });
    t.equal(replay.json().identical, true, 'a replay reproduces the stored result');
  });
}
