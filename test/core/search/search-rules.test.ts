// Hierarchy rule cases (marginality principle, common practice: Nelder 1977,
// Peixoto 1987), the compute budget's refusal, and the worker pool agreeing
// with one thread (a node budget that runs out is not a refusal: see
// wide-pool.test.ts).

import t from 'tap';
import { demoColumns } from '../../../scripts/demo-data.ts';
import { widePool } from '../../../scripts/wide-pool-data.ts';
import { MAX_KEYED_TERMS } from '../../../src/core/search/subset-keys.ts';
import { hierarchyRules, planSearch, searchSubsets, DEFAULT_SEARCH_BUDGET } from '../../../src/core/search/index.ts';
import { runSearch, type TaskRunner } from '../../../src/search/workers/index.ts';
import { ComputePool } from '../../../src/compute/index.ts';
import { JOB_WORKER_MODULE } from '../../../src/http/jobs/index.ts';
import type { Term } from '../../../src/core/types.ts';
import { demoPool, problemFor } from './brute-force.ts';

t.test('hierarchy: powers need lower powers, products need every sub-product', (t) => {
  const pool: Term[] = [
    'x',
    { kind: 'power', of: 'x', degree: 2 },
    { kind: 'power', of: 'x', degree: 3 },
    'z',
    { kind: 'product', of: ['x', 'z'] },
    { kind: 'factor', of: 'k' },
    { kind: 'product', of: ['z', 'k', 'x'] },
    { kind: 'transform', of: 'x', fn: 'log' },
    { kind: 'product', of: ['z', 'k'] },
    { kind: 'power', of: 'w', degree: 2 },
  ];
  const r = hierarchyRules(pool, []);
  t.same(r.requires[1], [0], 'x^2 needs x');
  t.same(r.requires[2], [0, 1], 'x^3 needs x and x^2');
  t.same(r.requires[4], [0, 3], 'x:z needs x and z');
  t.same(r.requires[6], [0, 3, 4, 5, 8], 'z:k:x needs x, z, k, x:z, z:k (and x:k, missing)');
  t.same(r.requires[7], [], 'log(x) needs nothing');
  t.same(r.unreachable.map((u) => u.term), [6, 9], 'z:k:x lacks x:k; w^2 lacks w');
  const withAlways = hierarchyRules(pool, ['w', { kind: 'product', of: ['x', 'k'] }]);
  t.same(withAlways.unreachable, [], 'always terms meet the needs');
  t.same(withAlways.requires[6], [0, 3, 4, 5, 8]);
  t.end();
});

t.test('a pool beyond the budget is refused with the budget named', (t) => {
  const demo = demoColumns();
  const pool: Term[] = ['peakTemp', 'holdMinutes', 'moisture', { kind: 'factor', of: 'kiln' }, { kind: 'power', of: 'peakTemp', degree: 2 }];
  const { problem } = problemFor({ columns: demo, response: 'shrinkage', pool, always: [], intercept: true, hierarchy: false });
  const budget = { ...DEFAULT_SEARCH_BUDGET, maxSubsets: 16, maxBranchAndBoundTerms: 4 };
  const plan = planSearch(problem, {}, budget);
  t.equal(plan.ok ? '' : plan.issue.facts.budget, 'maxBranchAndBoundTerms');
  const exhaustive = planSearch(problem, { exhaustive: true }, budget);
  t.same(exhaustive.ok ? null : exhaustive.issue.facts, { budget: 'maxSubsets', limit: 16, required: 32, poolTerms: 5 });
  const bb = planSearch(problem, {}, { ...budget, maxBranchAndBoundTerms: 40 });
  t.equal(bb.ok && bb.method, 'branchAndBound', 'over the exhaustive budget, branch and bound');
  t.end();
});

t.test('branch and bound stops where a subset key stops being exact, whatever budget is configured', (t) => {
  // A subset is named by the exact double sum of 2^t (subset-keys.ts): 52 terms at most.
  const wide = widePool({ terms: MAX_KEYED_TERMS + 1, rows: 80 });
  const { problem } = problemFor({ columns: wide.columns, response: wide.response, pool: wide.pool, always: [], intercept: true, hierarchy: false });
  const plan = planSearch(problem, {}, { ...DEFAULT_SEARCH_BUDGET, maxBranchAndBoundTerms: 64 });
  t.same(plan.ok ? null : plan.issue.facts, { budget: 'maxBranchAndBoundTerms', limit: MAX_KEYED_TERMS, required: 53, poolTerms: 53 });
  t.end();
});

t.test('the compute pool\'s workers give the single-thread results', async (t) => {
  const workers = new ComputePool({ size: 2, queueLength: 0, deadlineMs: 120_000, workerModule: JOB_WORKER_MODULE });
  t.teardown(() => workers.close());
  const session = workers.open();
  t.teardown(() => session.close());
  const run: TaskRunner = (task) => session.runOn({ kind: 'searchTask', task });
  const demo = demoColumns();
  const pool = demoPool.slice(0, 15);
  const { problem } = problemFor({ columns: demo, response: 'shrinkage', pool, always: [], intercept: true, hierarchy: false });
  const settings = { criterion: 'aicc', top: 10, rankDeficient: 'score' } as const;
  const one = searchSubsets(problem, settings, 'exhaustive');
  const progress: number[] = [];
  const two = await runSearch(problem, settings, { run, parallelism: 2, onProgress: (p) => progress.push(p.covered / p.total) });
  t.ok(two.ok);
  if (!two.ok) return;
  // Which workers take the tasks is the pool's choice (a worker slow to start may take none): at most two.
  t.ok(two.threads >= 1 && two.threads <= 2, 'ran on the pool\'s workers');
  t.equal(two.outcome.evaluated, one.evaluated);
  t.same(two.outcome.models.map((m) => [m.terms, m.value, m.rss]), one.models.map((m) => [m.terms, m.value, m.rss]), 'same models, bit-identical values');
  t.ok(two.outcome.models.every((m, i) => Math.abs(m.weight - one.models[i].weight) < 1e-13), 'weights agree');
  t.ok(two.outcome.importance.every((x, i) => Math.abs(x.weight - one.importance[i].weight) < 1e-13), 'importance agrees');
  t.equal(progress.at(-1), 1, 'progress reaches the whole');
  const bb = await runSearch(problem, settings, { run, parallelism: 2, budget: { ...DEFAULT_SEARCH_BUDGET, maxSubsets: 1000 } });
  t.ok(bb.ok && bb.outcome.method === 'branchAndBound' && !bb.outcome.weightsCoverAllSubsets);
  if (bb.ok) t.same(bb.outcome.models.map((m) => m.terms), one.models.map((m) => m.terms), 'branch and bound on workers finds the same top');
  const starved = await runSearch(problem, settings, { run, parallelism: 1, budget: { ...DEFAULT_SEARCH_BUDGET, maxSubsets: 1000, maxNodes: 10 } });
  t.ok(starved.ok && !starved.outcome.proven && starved.outcome.models.length === 10, 'node budget exhausted: the best found so far, not proven');
});
