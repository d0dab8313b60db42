// Branch and bound where exhaustive search cannot go: 40 mildly correlated
// process readings, 2,000 rows, eight real effects (scripts/wide-pool-data.ts,
// seeded). For each criterion the top 10 is proven, its values agree with an
// independent normal-equations fit, it is locally best (no subset one add,
// drop or swap away from a listed model beats the tenth), and its best model
// is at least as good as stepwise selection with swaps (stepwise-swaps.ts).
// Then: the same answer on one thread and on two, progress that reports
// nodes and the bound, and a node budget that runs out giving the best found
// so far, marked unproven.

import t from 'tap';
import { widePool } from '../../../scripts/wide-pool-data.ts';
import { DEFAULT_SEARCH_BUDGET, searchSubsets, type SearchCriterion } from '../../../src/core/search/index.ts';
import { runInThread, runSearch, type SearchProgress } from '../../../src/search/workers/index.ts';
import { ComputePool } from '../../../src/compute/index.ts';
import { JOB_WORKER_MODULE } from '../../../src/http/jobs/index.ts';
import { DEFAULT_POLICY } from '../../../src/core/scoring/policy.ts';
import { prepareSearch } from '../../../src/core/search/request-problem.ts';
import { searchRankBy, searchReport } from '../../../src/core/search/report.ts';
import { problemFor } from './brute-force.ts';
import { neighbours, NormalEquations, stepwiseWithSwaps } from './stepwise-swaps.ts';

const wide = widePool();
const { problem } = problemFor({ columns: wide.columns, response: wide.response, pool: wide.pool, always: [], intercept: true, hierarchy: false });
const reference = new NormalEquations(wide.columns, wide.pool, wide.response);
const m = wide.pool.length;
const TOP = 10;
const key = (terms: readonly number[]) => terms.join(',');
const close = (a: number, b: number, tol = 1e-9) => Math.abs(a - b) <= tol * Math.max(1, Math.abs(b));

t.test('the generator: 40 readings, 2,000 rows, eight real effects', (t) => {
  t.equal(m, 40);
  t.equal(reference.n, 2000);
  t.equal(wide.real.length, 8);
  t.end();
});

for (const criterion of ['aicc', 'aic', 'bic', 'hqc'] as SearchCriterion[]) {
  t.test(`40 terms by ${criterion}: the proven top ${TOP}`, (t) => {
    const out = searchSubsets(problem, { criterion, top: TOP, rankDeficient: 'skip' }, 'branchAndBound', DEFAULT_SEARCH_BUDGET);
    t.ok(out.proven, 'proven within the default node budget');
    t.equal(out.models.length, TOP);
    const deficient = out.rankDeficient;
    t.equal(out.evaluated + out.notHierarchical + out.unscorable + deficient + out.sameColumnSpace + out.exactFits + out.pruned, 2 ** m, 'all 2^40 subsets accounted for');
    for (const s of out.models) t.ok(close(s.value, reference.value(criterion, s.terms)), `{${key(s.terms)}}: value ${s.value} agrees with the normal equations`);
    const tenth = out.models[TOP - 1].value;
    const listed = new Set(out.models.map((s) => key(s.terms)));
    let beaten = 0;
    for (const s of out.models) {
      for (const n of neighbours(s.terms, m)) {
        if (!listed.has(key(n)) && reference.value(criterion, n) < tenth - 1e-9 * Math.abs(tenth)) beaten++;
      }
    }
    t.equal(beaten, 0, 'no neighbour of a listed model (one add, drop or swap) beats the tenth');
    const stepwise = stepwiseWithSwaps(reference, m, criterion);
    t.ok(out.models[0].value <= stepwise.value + 1e-9 * Math.abs(stepwise.value), `best ${out.models[0].value} at least as good as stepwise with swaps ${stepwise.value} (${stepwise.moves} moves)`);
    if (criterion === 'bic') t.same(out.models[0].terms, [...wide.real].sort((a, b) => a - b), 'BIC\'s best is the eight real effects (a property of these data: every effect has t >= 3 at 2,000 rows)');
    t.end();
  });
}

t.test('one thread or two: the same answer; progress reports nodes and the bound', async (t) => {
  const settings = { criterion: 'aicc', top: TOP, rankDeficient: 'skip' } as const;
  const progress: SearchProgress[] = [];
  const workers = new ComputePool({ size: 2, queueLength: 0, deadlineMs: 300_000, workerModule: JOB_WORKER_MODULE });
  t.teardown(() => workers.close());
  const session = workers.open();
  t.teardown(() => session.close());
  const one = await runSearch(problem, settings, { run: runInThread, parallelism: 1, onProgress: (p) => progress.push(p) });
  const two = await runSearch(problem, settings, { run: (task) => session.runOn({ kind: 'searchTask', task }), parallelism: 2 });
  t.ok(one.ok && two.ok);
  if (!one.ok || !two.ok) return;
  t.equal(one.outcome.method, 'branchAndBound');
  t.same(two.outcome.models.map((s) => [s.terms, s.value, s.rss]), one.outcome.models.map((s) => [s.terms, s.value, s.rss]), 'same models, bit-identical values');
  for (const k of ['evaluated', 'pruned', 'nodes', 'notHierarchical'] as const) t.equal(two.outcome[k], one.outcome[k], `same ${k}`);
  t.ok(two.outcome.importance.every((x, i) => x.weight === one.outcome.importance[i].weight), 'same importance');
  const last = progress.at(-1) as SearchProgress;
  t.equal(last.covered, 2 ** m, 'progress reaches every subset');
  t.equal(last.nodes, one.outcome.nodes, 'and every node');
  t.equal(last.bound, one.outcome.models[TOP - 1].value, 'the final bound is the tenth model\'s value');
  t.ok(progress.every((p) => p.bound !== null && p.bound >= (last.bound as number)), 'the bound only falls');
  t.ok(progress.every((p, i) => i === 0 || p.nodes >= progress[i - 1].nodes), 'nodes only rise');
});

t.test('a node budget that runs out: the best found so far, marked unproven', async (t) => {
  const settings = { criterion: 'aicc', top: TOP, rankDeficient: 'skip' } as const;
  const starved = await runSearch(problem, settings, { run: runInThread, parallelism: 1, budget: { ...DEFAULT_SEARCH_BUDGET, maxNodes: 20 } });
  t.ok(starved.ok, 'answered, not refused');
  if (!starved.ok) return;
  const out = starved.outcome;
  t.notOk(out.proven, 'not proven');
  t.ok(out.stopped);
  t.equal(out.models.length, TOP, 'still the best found so far');
  const stepwise = stepwiseWithSwaps(reference, m, 'aicc');
  t.ok(out.models[0].value <= stepwise.value + 1e-9 * Math.abs(stepwise.value), 'at least as good as stepwise with swaps');
  t.ok(out.evaluated + out.pruned < 2 ** m, 'some subsets neither scored nor ruled out');
  // The report a caller reads: the models refitted, and a caution that they are not proven.
  const prepared = prepareSearch({ columns: wide.columns, summary: null, response: wide.response, weights: null, pool: wide.pool, always: [], hierarchy: false, intercept: true, top: TOP });
  if ('issues' in prepared) return t.fail('prepared');
  const report = searchReport(prepared, out, searchRankBy('aicc', DEFAULT_POLICY, null), { policy: DEFAULT_POLICY, hash: 'h' });
  const caution = report.cautions.find((c) => c.code === 'search_not_proven');
  t.ok(caution, 'a search_not_proven caution');
  t.match(caution?.message, /best found so far/);
  t.ok(report.cautions.some((c) => c.code === 'ranking_is_not_validation'), 'with the standing caution');
  t.equal(report.models.length, TOP);
});
