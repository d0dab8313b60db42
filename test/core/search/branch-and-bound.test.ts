// Branch and bound against exhaustive answers on pools of up to 24 terms,
// for each criterion: the same best subsets in the same order, values to
// 1e-9, every one of the 2^m subsets accounted for exactly once (scored,
// passed over or pruned), and `proven`.
// References: for seeded random pools with correlated regressors
// (scripts/wide-pool-data.ts), the per-size enumeration of best-by-size.ts,
// itself checked here against the exhaustive kernel (which
// search-brute-force.test.ts checks against QR refits of every subset); for
// the demo scenario's pool (scripts/demo-data.ts: factors, powers, products,
// hierarchy), the exhaustive kernel.

import t from 'tap';
import { demoColumns } from '../../../scripts/demo-data.ts';
import { widePool } from '../../../scripts/wide-pool-data.ts';
import { searchSubsets, type SearchCriterion, type SearchOutcome } from '../../../src/core/search/index.ts';
import { bestByCriterion, bestBySize } from './best-by-size.ts';
import { demoPool, problemFor } from './brute-force.ts';

const CRITERIA: SearchCriterion[] = ['aic', 'aicc', 'bic', 'hqc'];
const close = (a: number, b: number, tol = 1e-9) => Math.abs(a - b) <= tol * Math.max(1, Math.abs(b));

/** Subsets scored, passed over or pruned: each of the 2^m once. */
function accounted(o: SearchOutcome): number {
  const deficient = o.rankDeficientRule === 'skip' ? o.rankDeficient : 0;
  return o.evaluated + o.notHierarchical + o.unscorable + deficient + o.sameColumnSpace + o.exactFits + o.pruned;
}

function widePoolProblem(terms: number, rows: number, seed: number, groupShare: number) {
  const w = widePool({ terms, rows, seed, groupShare });
  return problemFor({ columns: w.columns, response: w.response, pool: w.pool, always: [], intercept: true, hierarchy: false }).problem;
}

t.test('the per-size reference gives the exhaustive kernel\'s best subsets for every criterion', (t) => {
  const problem = widePoolProblem(12, 60, 11, 0.5);
  const lists = bestBySize(problem, 15);
  for (const criterion of CRITERIA) {
    const exhaustive = searchSubsets(problem, { criterion, top: 15, rankDeficient: 'skip' }, 'exhaustive');
    const reference = bestByCriterion(problem, lists, criterion, 15);
    t.same(reference.map((s) => s.terms), exhaustive.models.map((s) => s.terms), `${criterion}: same subsets, same order`);
    t.ok(reference.every((s, i) => close(s.value, exhaustive.models[i].value)), `${criterion}: values to 1e-9`);
  }
  t.end();
});

// Seeded pools: sizes up to 24 terms, rows from few to many, mild to strong correlation within groups of readings.
const cases = [
  { terms: 12, rows: 40, seed: 1, groupShare: 0.6, top: 20 },
  { terms: 16, rows: 120, seed: 2, groupShare: 0.25, top: 10 },
  { terms: 16, rows: 500, seed: 5, groupShare: 0.7, top: 1 },
  { terms: 20, rows: 300, seed: 4, groupShare: 0.5, top: 10 },
  { terms: 24, rows: 400, seed: 3, groupShare: 0.5, top: 10 },
];
for (const c of cases) {
  t.test(`${c.terms} correlated readings, ${c.rows} rows (within-group share ${c.groupShare}), best ${c.top}`, (t) => {
    const problem = widePoolProblem(c.terms, c.rows, c.seed, c.groupShare);
    const lists = bestBySize(problem, c.top);
    for (const criterion of CRITERIA) {
      const out = searchSubsets(problem, { criterion, top: c.top, rankDeficient: 'skip' }, 'branchAndBound');
      const reference = bestByCriterion(problem, lists, criterion, c.top);
      t.same(out.models.map((s) => s.terms), reference.map((s) => s.terms), `${criterion}: the exhaustive best ${c.top}, in order`);
      t.ok(out.models.every((s, i) => close(s.value, reference[i].value)), `${criterion}: values to 1e-9`);
      t.ok(out.proven, `${criterion}: proven`);
      t.equal(accounted(out), 2 ** c.terms, `${criterion}: every subset accounted for once`);
      t.ok(out.pruned > 0 && !out.weightsCoverAllSubsets, `${criterion}: pruned, and weights say they cover the evaluated subsets`);
    }
    t.end();
  });
}

for (const hierarchy of [false, true]) {
  t.test(`demo pool of 16 terms (powers, products, a factor), hierarchy ${hierarchy}`, (t) => {
    const { problem } = problemFor({ columns: demoColumns(), response: 'shrinkage', pool: demoPool, always: [], intercept: true, hierarchy });
    for (const criterion of CRITERIA) {
      for (const rankDeficient of ['skip', 'score'] as const) {
        const settings = { criterion, top: 20, rankDeficient };
        const exhaustive = searchSubsets(problem, settings, 'exhaustive');
        const out = searchSubsets(problem, settings, 'branchAndBound');
        t.same(out.models.map((s) => s.terms), exhaustive.models.map((s) => s.terms), `${criterion}, ${rankDeficient}: the exhaustive best 20, in order`);
        t.ok(out.models.every((s, i) => close(s.value, exhaustive.models[i].value)), `${criterion}, ${rankDeficient}: values to 1e-9`);
        t.equal(accounted(out), 2 ** demoPool.length, `${criterion}, ${rankDeficient}: every subset accounted for once`);
        t.ok(out.proven);
      }
    }
    t.end();
  });
}

t.test('always terms and no intercept', (t) => {
  const pool = demoPool.filter((term) => term !== 'moisture');
  for (const intercept of [true, false]) {
    const { problem } = problemFor({ columns: demoColumns(), response: 'shrinkage', pool, always: ['moisture'], intercept, hierarchy: true });
    const settings = { criterion: 'aicc' as const, top: 12, rankDeficient: 'skip' as const };
    const exhaustive = searchSubsets(problem, settings, 'exhaustive');
    const out = searchSubsets(problem, settings, 'branchAndBound');
    t.same(out.models.map((s) => s.terms), exhaustive.models.map((s) => s.terms), `intercept ${intercept}: the exhaustive best 12`);
    t.equal(accounted(out), 2 ** pool.length);
  }
  t.end();
});
