// The lifetime kind's price (src/core/models/lifetime/kind.ts): the core's
// operation count halved to multiply-adds at the iteration cap, the design's
// width as buildDesign builds it, and a refusal that names the candidate.
import t from 'tap';
import { buildDesign } from '../../../src/core/design/index.ts';
import { priceLifetime } from '../../../src/core/models/lifetime/index.ts';
import { TURNBULL_MAX_ITERATIONS } from '../../../src/core/models/lifetime/nonparametric/turnbull.ts';
import { CANDIDATE_PRICES, priceComparison, priceIssues, type PriceCaps } from '../../../src/core/pricing/index.ts';
import { shapeOfColumns } from '../../../src/core/pricing/data-shape.ts';
import { FIXED_WORK } from '../../../src/core/pricing/least-squares-cost.ts';
import { DEFAULT_POLICY } from '../../../src/core/scoring/policy.ts';
import type { Columns, Term } from '../../../src/core/types.ts';
import { LIFE_PICTURE_BUDGET, lifePictureDecision, lifePictureWork } from '../../../src/core/comparison/life-picture-budget.ts';

const rows = 400;
const columns: Columns = {
  hours: Array.from({ length: rows }, (_, i) => 100 + ((i * 37) % 53)),
  status: Array.from({ length: rows }, (_, i) => (i % 4 === 0 ? 'right' : 'exact')),
  kelvin: Array.from({ length: rows }, (_, i) => [398, 423, 448][i % 3]),
  finish: Array.from({ length: rows }, (_, i) => ['matte', 'gloss', 'satin'][(i * 7) % 3]),
};
const terms: Term[] = [{ kind: 'transform', of: 'kelvin', fn: 'reciprocal' }, 'finish'];
const ctx = { shape: shapeOfColumns(columns), fromSummary: false, predictionRows: 0, maxDesignColumns: 2000 };

t.test('a lifetime candidate costs its core operation count in multiply-adds, at the iteration cap', async (t) => {
  const cost = CANDIDATE_PRICES.lifetime({ form: 'lifetime', name: 'w', distribution: 'weibull', terms }, ctx);
  const built = buildDesign(columns, terms, true, columns.hours.map((_, i) => i));
  if ('issues' in built) throw new Error('design');
  t.equal(cost.designColumns, built.design.labels.length, 'the width buildDesign builds (intercept, 1/kelvin, two finish columns)');
  t.equal(cost.designColumns, 4);
  t.equal(cost.fit.work, FIXED_WORK.modelFittedHere + priceLifetime({ rows, designColumns: 4, distribution: 'weibull' }) / 2);
  t.equal(cost.widestTerm, 1, 'the factor makes the widest term');
  t.equal(cost.prediction.work, 0, 'no new rows, no prediction cost');
  const gamma = CANDIDATE_PRICES.lifetime({ form: 'lifetime', name: 'g', distribution: 'gamma', terms }, ctx);
  t.ok(gamma.fit.work > cost.fit.work, 'a gamma pays for its incomplete gamma functions on censored rows');
});

t.test('a life comparison over the work cap is refused before anything is fitted', async (t) => {
  const input = {
    columns, response: 'hours', weights: null, censoring: { status: 'status' },
    candidates: [{ form: 'lifetime' as const, name: 'w', distribution: 'weibull' as const, terms }],
    policy: DEFAULT_POLICY, policyHash: 'x',
  };
  const price = priceComparison(input, null, 2000);
  const caps: PriceCaps = {
    work: { limit: price.work / 2, setting: 'MAX_REQUEST_WORK' },
    memoryBytes: { limit: 512 * 2 ** 20, setting: 'MAX_REQUEST_MEMORY_BYTES' },
    resultBytes: { limit: 16 * 2 ** 20, setting: 'MAX_RESULT_BYTES' },
    designColumns: { limit: 2000, setting: 'MAX_DESIGN_COLUMNS' },
  };
  const issues = priceIssues(price, caps);
  t.equal(issues.length, 1);
  t.match(issues[0].message, /MAX_REQUEST_WORK/);
  t.match(JSON.stringify(issues[0]), /candidate 0/);
});

t.test('values at new rows and the life-data picture are priced before anything is fitted', async (t) => {
  const predicting = { ...ctx, predictionRows: 50, lifeValuesPerRow: 4 };
  const cost = CANDIDATE_PRICES.lifetime({ form: 'lifetime', name: 'w', distribution: 'weibull', terms }, predicting);
  t.ok(cost.prediction.work > 50 * 4 * 600 / 2, 'each row pays for each value it gives (a distribution function or quantile, ~600 operations)');
  const more = CANDIDATE_PRICES.lifetime({ form: 'lifetime', name: 'w', distribution: 'weibull', terms }, { ...predicting, lifeValuesPerRow: 8 });
  t.ok(more.prediction.work > cost.prediction.work, 'more percentiles or survival times cost more');
  const base = {
    columns, response: 'hours', weights: null, censoring: { status: 'status' },
    candidates: [{ form: 'lifetime' as const, name: 'w', distribution: 'weibull' as const, terms }],
    policy: DEFAULT_POLICY, policyHash: 'x',
  };
  const picture = (c: Columns) => priceComparison({ ...base, columns: c }, null, 2000).parts.find((p) => p.what.startsWith('the life-data picture'));
  const rightOnly = picture(columns);
  t.ok(rightOnly, 'a comparison with a life model pays for its picture');
  const inspected = picture({ ...columns, status: columns.status.map((s, i) => (i === 7 ? 'interval' : s)) });
  // priceNonparametric: 12 operations per row and innermost interval (at most one per row), twice, per iteration; halved to multiply-adds.
  const turnbullWork = (TURNBULL_MAX_ITERATIONS * 12 * 2 * rows) / 2;
  t.ok(Math.abs(inspected!.work - rightOnly!.work - turnbullWork) < 1e-9 * turnbullWork, "one interval row: Turnbull's iteration cap is paid for");
  const noLife = priceComparison({ ...base, censoring: null, candidates: [{ form: 'fit' as const, name: 'l', terms: [] }] } as never, null, 2000);
  t.notOk(noLife.parts.some((p) => p.what.startsWith('the life-data picture')), 'no life model, no picture');
});

t.test('a picture over its budget is left out with a caution, never the reason for a refusal', async (t) => {
  // 20,000 rows with interval censoring: Turnbull at its iteration cap alone is 20,000 × 12 × 2 × 20,000 / 2 = 4.8e9
  // multiply-adds, over the 4e9 budget; 2,000 such rows are well under it.
  const big = 20_000;
  const intervalColumns = (n: number): Columns => ({
    hours: Array.from({ length: n }, (_, i) => 100 + (i % 97)),
    upper: Array.from({ length: n }, (_, i) => (i % 2 === 0 ? 150 + (i % 97) : null)),
    status: Array.from({ length: n }, (_, i) => (i % 2 === 0 ? 'interval' : 'right')),
  });
  const input = (n: number) => ({
    columns: intervalColumns(n), response: 'hours', weights: null, censoring: { status: 'status', upper: 'upper' },
    candidates: [{ form: 'lifetime' as const, name: 'e', distribution: 'exponential' as const, terms: [] }],
    policy: DEFAULT_POLICY, policyHash: 'x',
  });
  const hasPicture = (n: number) => priceComparison(input(n), null, 2000).parts.some((p) => p.what.startsWith('the life-data picture'));
  t.ok(lifePictureWork(input(big), big)! > LIFE_PICTURE_BUDGET, 'the large sample is over the budget');
  t.notOk(hasPicture(big), 'so its picture is not priced');
  t.equal(lifePictureDecision(input(big)).cautions[0]?.code, 'life_picture_skipped', 'and the comparison says it was left out');
  t.equal(lifePictureDecision(input(big)).draw, false);
  t.ok(hasPicture(2_000), 'a small interval-censored sample pays for its picture');
  t.same(lifePictureDecision(input(2_000)), { draw: true, cautions: [] }, 'and gets no caution');
  t.ok(priceComparison(input(100_000), null, 2000).work < 1e10, '100,000 interval-censored rows stay under the default work cap');
});
