// The generalised-linear search kernel on its own: a warm start from the
// parent subset ends where a cold start from the family's starting means
// does (to the convergence rule's tolerance), the exhaustive walk visits
// every subset once, stepwise selection with swaps finds the model the data
// were simulated from in a pool too large to fit subset by subset, and its
// visit budget is obeyed. Data: the R fixture's tile scenarios
// (test/reference/glm/glm-search-reference.json) and seeded simulations.
import { readFileSync } from 'node:fs';
import t from 'tap';
import { DEFAULT_SEARCH_BUDGET } from '../../../src/core/search/index.ts';
import { planGlmSearch, searchGlmSubsets, GLM_EXHAUSTIVE_TERMS } from '../../../src/core/search/glm/glm-search.ts';
import { prepareGlmSearch, type PreparedGlmSearch } from '../../../src/core/search/glm/prepare-glm.ts';
import { fitSubset } from '../../../src/core/search/glm/subset-fit.ts';
import type { GlmFamilyName, GlmLinkName } from '../../../src/core/models/glm/index.ts';
import type { Columns, Term } from '../../../src/core/types.ts';
import { seededNormal, seededUniform } from '../../../scripts/seeded-random.ts';

const REFERENCE = JSON.parse(readFileSync(new URL('../../reference/glm/glm-search-reference.json', import.meta.url), 'utf8'));

function prepare(columns: Columns, response: string, pool: Term[], glm: { family: GlmFamilyName; link?: GlmLinkName; offset?: string; trials?: string }): PreparedGlmSearch {
  const ready = prepareGlmSearch({
    columns, summary: null, response, weights: null, pool, always: [], hierarchy: false, intercept: true, top: 10, glm,
  });
  if ('issues' in ready) throw new Error(JSON.stringify(ready.issues));
  return ready;
}

const CASES = {
  defects: () => prepare(REFERENCE.defects.columns, 'defects', ['peakTemp', 'holdMinutes', 'moisture', 'glazeMicrons', { kind: 'factor', of: 'kiln' }], { family: 'poisson', offset: 'logTiles' }),
  cracks: () => prepare(REFERENCE.cracks.columns, 'cracked', ['peakTemp', 'moisture', 'holdMinutes', 'glazeMicrons'], { family: 'binomial', trials: 'tested' }),
  strength: () => prepare(REFERENCE.strength.columns, 'strength', ['peakTemp', 'moisture', 'holdMinutes'], { family: 'gamma', link: 'log' }),
};

t.test('a warm start from the parent ends where a cold start does', async (t) => {
  for (const [name, make] of Object.entries(CASES)) {
    const { data } = make();
    const m = data.poolSize;
    let worstLogL = 0;
    let worstBeta = 0;
    let warmSolves = 0;
    let coldSolves = 0;
    for (let mask = 1; mask < 2 ** m; mask++) {
      const subset = [...Array(m).keys()].filter((j) => (mask >>> j) & 1);
      const parent = fitSubset(data, subset.slice(0, -1), 'aic');
      if (!parent.ok) throw new Error('parent failed');
      const warm = fitSubset(data, subset, 'aic', parent.coefficients);
      const cold = fitSubset(data, subset, 'aic');
      if (!warm.ok || !cold.ok) throw new Error('fit failed');
      warmSolves += warm.solves;
      coldSolves += cold.solves;
      worstLogL = Math.max(worstLogL, Math.abs(warm.logLikelihood! - cold.logLikelihood!) / Math.abs(cold.logLikelihood!));
      for (const [label, b] of cold.coefficients) worstBeta = Math.max(worstBeta, Math.abs(warm.coefficients.get(label)! - b) / Math.max(1e-3, Math.abs(b)));
      t.equal(warm.parameters, cold.parameters);
    }
    t.ok(worstLogL < 1e-12, `${name}: log-likelihoods agree to 1e-12 (worst ${worstLogL.toExponential(2)})`);
    t.ok(worstBeta < 1e-8, `${name}: coefficients agree to 1e-8 (worst ${worstBeta.toExponential(2)})`);
    t.comment(`${name}: ${warmSolves} weighted solves warm, ${coldSolves} cold`);
  }
});

t.test('the exhaustive walk fits every subset once, each child from its parent', async (t) => {
  const ready = CASES.defects();
  const plan = planGlmSearch(5, false, DEFAULT_SEARCH_BUDGET);
  t.same(plan, { ok: true, method: 'exhaustive', maxVisits: 32 });
  if (!plan.ok) return;
  const outcome = searchGlmSubsets(ready.data, ready.prepared.rules, { criterion: 'aic', top: 32 }, plan);
  t.equal(outcome.visited, 32);
  t.equal(outcome.evaluated, 32);
  t.equal(outcome.warmStarts, 31, 'every subset but the first starts from its parent');
  t.equal(new Set(outcome.models.map((s) => s.terms.join(','))).size, 32, 'each subset once');
  t.ok(outcome.proven);
  const values = outcome.models.map((s) => s.value);
  t.same(values, [...values].sort((a, b) => a - b), 'best first');
});

/** Counts of tile defects per pallet: two firing readings matter, `noise` more do not. */
function widePool(noise: number, rows = 150, seed = 7): { columns: Columns; pool: Term[] } {
  const u = seededUniform(seed);
  const z = seededNormal(u);
  const columns: Record<string, number[]> = { peakTemp: [], moisture: [], defects: [] };
  for (let k = 0; k < noise; k++) columns[`reading${k}`] = [];
  for (let i = 0; i < rows; i++) {
    const temp = z();
    const moisture = z();
    columns.peakTemp.push(temp);
    columns.moisture.push(moisture);
    for (let k = 0; k < noise; k++) columns[`reading${k}`].push(z());
    const mean = Math.exp(1.5 + 0.5 * temp - 0.4 * moisture);
    // Poisson by inversion of the seeded uniform.
    let count = 0;
    let p = Math.exp(-mean);
    let cumulative = p;
    const draw = u();
    while (draw > cumulative && count < 1000) {
      count++;
      p *= mean / count;
      cumulative += p;
    }
    columns.defects.push(count);
  }
  return { columns, pool: ['peakTemp', 'moisture', ...Array.from({ length: noise }, (_, k) => `reading${k}`)] };
}

t.test('stepwise selection with swaps beyond the exhaustive limit', async (t) => {
  const { columns, pool } = widePool(GLM_EXHAUSTIVE_TERMS + 2);
  const ready = prepare(columns, 'defects', pool, { family: 'poisson' });
  const plan = planGlmSearch(pool.length, false, DEFAULT_SEARCH_BUDGET);
  t.equal(plan.ok && plan.method, 'stepwiseSwaps', `${pool.length} terms are beyond ${GLM_EXHAUSTIVE_TERMS}`);
  if (!plan.ok) return;
  const outcome = searchGlmSubsets(ready.data, ready.prepared.rules, { criterion: 'bic', top: 5 }, plan);
  t.equal(outcome.proven, false, 'a heuristic is never proven');
  t.equal(outcome.stopped, false, 'it reached its local optimum within the default budget');
  const best = outcome.models[0];
  t.ok(best.terms.includes(0) && best.terms.includes(1), `the best found holds the two readings the counts were simulated from (${best.terms})`);
  const simulated = fitSubset(ready.data, [0, 1], 'bic');
  t.ok(simulated.ok && best.value <= simulated.value! + 1e-9, 'and scores at least as well as the simulated model itself');
  t.ok(outcome.models.some((s) => s.terms.join() === '0,1'), 'which the search fitted too');
  t.ok(outcome.visited < 2 ** pool.length / 100, `a small share of the subsets fitted (${outcome.visited})`);

  const refused = planGlmSearch(pool.length, true, DEFAULT_SEARCH_BUDGET);
  t.equal(!refused.ok && refused.issue.facts.budget, 'maxSubsets', 'exhaustive: true beyond the limit is refused');

  const tight = searchGlmSubsets(ready.data, ready.prepared.rules, { criterion: 'bic', top: 5 }, { ok: true, method: 'stepwiseSwaps', maxVisits: 25 });
  t.equal(tight.visited, 25, 'the visit budget is obeyed');
  t.equal(tight.stopped, true, 'and reported');
});

t.test('on a small pool the heuristic finds the exhaustive best (these data)', async (t) => {
  for (const [name, make] of Object.entries(CASES)) {
    const ready = make();
    const settings = { criterion: 'aicc' as const, top: 1 };
    const all = searchGlmSubsets(ready.data, ready.prepared.rules, settings, { ok: true, method: 'exhaustive', maxVisits: Infinity });
    const step = searchGlmSubsets(ready.data, ready.prepared.rules, settings, { ok: true, method: 'stepwiseSwaps', maxVisits: 1000 });
    t.same(step.models[0].terms, all.models[0].terms, `${name}: same best subset`);
    t.ok(Math.abs(step.models[0].value - all.models[0].value) < 1e-8, `${name}: same AICc`);
  }
});

t.test('a data summary cannot be reweighted', async (t) => {
  const ready = prepareGlmSearch({
    columns: null, summary: { n: 3 } as never, response: 'defects', weights: null, pool: ['peakTemp'], always: [], hierarchy: false, intercept: true, top: 1,
    glm: { family: 'poisson' },
  });
  t.same('issues' in ready && ready.issues.map((i) => [i.code, i.path]), [['summary_rows_needed', ['family']]]);
});

t.test('the hierarchy rule holds in a GLM search', async (t) => {
  const ready = prepareGlmSearch({
    columns: REFERENCE.strength.columns, summary: null, response: 'strength', weights: null,
    pool: ['peakTemp', { kind: 'power', of: 'peakTemp', degree: 2 }, 'moisture'], always: [], hierarchy: true, intercept: true, top: 8,
    glm: { family: 'gamma', link: 'log' },
  });
  if ('issues' in ready) throw new Error(JSON.stringify(ready.issues));
  const outcome = searchGlmSubsets(ready.data, ready.prepared.rules, { criterion: 'aicc', top: 8 }, { ok: true, method: 'exhaustive', maxVisits: Infinity });
  t.equal(outcome.notHierarchical, 2, 'peakTemp^2 without peakTemp, alone and with moisture');
  t.equal(outcome.evaluated, 6);
  t.ok(outcome.models.every((s) => !s.terms.includes(1) || s.terms.includes(0)), 'no listed subset breaks the rule');
});
