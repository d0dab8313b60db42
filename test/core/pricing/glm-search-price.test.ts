// The price of a generalised-linear search: (subsets fitted) × one IRLS fit
// priced as a comparison candidate's (its iteration cap of weighted QR solves
// at the pool's full width), so the kernel part doubles with each pool term
// and grows with the rows; a work cap too small for every subset leaves the
// heuristic as many fits as it pays for, and one below a forward pass is over
// the cap. Data: columns of the tile scenario made here.
import t from 'tap';
import { priceIssues, priceSearch, type PriceCaps } from '../../../src/core/pricing/index.ts';
import { priceGlm } from '../../../src/core/models/glm/pricing.ts';
import { GLM_FLOPS_PER_UNIT } from '../../../src/core/models/glm/price.ts';
import { planGlmSearch } from '../../../src/core/search/glm/glm-search.ts';
import type { SearchRequestInput } from '../../../src/core/search/request-problem.ts';
import type { Columns } from '../../../src/core/types.ts';

const caps = (work = 1e10): PriceCaps => ({
  work: { limit: work, setting: 'MAX_REQUEST_WORK' },
  memoryBytes: { limit: 512 * 2 ** 20, setting: 'MAX_REQUEST_MEMORY_BYTES' },
  resultBytes: { limit: 16 * 2 ** 20, setting: 'MAX_RESULT_BYTES' },
  designColumns: { limit: 2000, setting: 'MAX_DESIGN_COLUMNS' },
});

function input(rows: number, poolTerms: number): SearchRequestInput {
  const pool = Array.from({ length: poolTerms }, (_, k) => `reading${k}`);
  const columns: Columns = {
    defects: Array.from({ length: rows }, (_, i) => i % 7),
    ...Object.fromEntries(pool.map((name) => [name, Array.from({ length: rows }, (_, i) => (i * 37) % 11)])),
  };
  return { columns, summary: null, response: 'defects', weights: null, pool, always: [], hierarchy: false, intercept: true, top: 5, glm: { family: 'poisson' } };
}

const kernel = (p: ReturnType<typeof priceSearch>) => p.price.parts[1].work;

t.test('every subset an IRLS fit at the full width', async (t) => {
  const a = priceSearch(input(500, 6), { caps: caps(), exhaustive: false, parallelism: 2 });
  const perFit = priceGlm({ rows: 500, columns: 7, family: 'poisson' }) / GLM_FLOPS_PER_UNIT;
  t.equal(kernel(a), 64 * perFit, '2^6 subsets × one fit of 500 × 7 to its cap');
  t.equal(a.budget.maxSubsets, 64);
  const b = priceSearch(input(500, 7), { caps: caps(), exhaustive: false, parallelism: 2 });
  t.ok(kernel(b) > 2 * kernel(a), 'one more pool term: twice the subsets, each wider');
  const c = priceSearch(input(1000, 6), { caps: caps(), exhaustive: false, parallelism: 2 });
  t.ok(kernel(c) > 1.9 * kernel(a) && kernel(c) < 2.1 * kernel(a), 'twice the rows: about twice the work');
  const leastSquares = priceSearch({ ...input(500, 6), glm: null }, { caps: caps(), exhaustive: false, parallelism: 2 });
  t.ok(kernel(a) > 100 * leastSquares.price.parts[1].work, 'far above sweeping the same subsets');
});

t.test('the cap sets how many fits the heuristic may make', async (t) => {
  const all = priceSearch(input(500, 10), { caps: caps(), exhaustive: false, parallelism: 2 });
  const cap = all.price.work / 4;
  const narrowed = priceSearch(input(500, 10), { caps: caps(cap), exhaustive: false, parallelism: 2 });
  t.ok(narrowed.price.work <= cap, 'priced within the cap');
  t.ok(narrowed.budget.maxSubsets < 1024, 'not every subset');
  const plan = planGlmSearch(10, false, narrowed.budget);
  t.equal(plan.ok && plan.method, 'stepwiseSwaps', 'so the search runs the heuristic');
  t.equal(plan.ok && plan.maxVisits, narrowed.budget.maxNodes, 'within the fits the price allowed');
  t.same(priceIssues(narrowed.price, caps(cap)), [], 'and is admitted');

  const tiny = priceSearch(input(500, 10), { caps: caps(all.price.parts[2].work), exhaustive: false, parallelism: 2 });
  t.equal(tiny.budget.maxNodes, 11, 'never fewer than one forward pass (1 + m fits)');
  t.equal(priceIssues(tiny.price, caps(all.price.parts[2].work))[0]?.code, 'work_limit', 'which is over a cap that cannot pay for it');

  const forced = priceSearch(input(500, 10), { caps: caps(cap), exhaustive: true, parallelism: 2 });
  t.equal(priceIssues(forced.price, caps(cap))[0]?.code, 'work_limit', 'exhaustive: true beyond the cap is a work limit');
});
