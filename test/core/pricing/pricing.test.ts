// The cost model against the code it prices: the design width it predicts
// from term specifications equals the width buildDesign produces (the
// builder is the reference: pricing must agree with what would be
// allocated); level counting stops past its bound; the answer-size estimate
// is an upper bound of the measured JSON, and not a wild one; every
// candidate form has a price; a search's work cap narrows its budget.
// Data: the demo scenario (scripts/demo-data.ts) and columns made here.
import t from 'tap';
import { demoColumns } from '../../../scripts/demo-data.ts';
import { buildDesign, commonRows } from '../../../src/core/design/index.ts';
import type { CandidateInput } from '../../../src/core/compare.ts';
import { DEFAULT_POLICY } from '../../../src/core/scoring/policy.ts';
import { CANDIDATE_PRICES, priceComparison, priceIssues, priceSearch, type PriceCaps } from '../../../src/core/pricing/index.ts';
import { shapeOfColumns } from '../../../src/core/pricing/data-shape.ts';
import { designWidth } from '../../../src/core/pricing/design-width.ts';
import { DEFAULT_SEARCH_BUDGET, planSearch } from '../../../src/core/search/index.ts';
import { prepareSearch } from '../../../src/core/search/request-problem.ts';
import type { Columns, Term } from '../../../src/core/types.ts';
import { answerSizeBounds } from './answer-size.ts';

const caps = (work = 1e10): PriceCaps => ({
  work: { limit: work, setting: 'MAX_REQUEST_WORK' },
  memoryBytes: { limit: 512 * 2 ** 20, setting: 'MAX_REQUEST_MEMORY_BYTES' },
  resultBytes: { limit: 16 * 2 ** 20, setting: 'MAX_RESULT_BYTES' },
  designColumns: { limit: 2000, setting: 'MAX_DESIGN_COLUMNS' },
});

// A plant's line data: two text factors (5 and 4 levels), a numeric code used as a factor (3 levels), two numeric columns.
const rows = 60;
const lineData: Columns = {
  y: Array.from({ length: rows }, (_, i) => (i * 37) % 11 + 0.5 * (i % 7)),
  speed: Array.from({ length: rows }, (_, i) => 10 + ((i * 13) % 17)),
  load: Array.from({ length: rows }, (_, i) => 1 + ((i * 5) % 9) / 3),
  line: Array.from({ length: rows }, (_, i) => ['north', 'south', 'east', 'west', 'annex'][i % 5]),
  shift: Array.from({ length: rows }, (_, i) => ['early', 'late', 'night', 'weekend'][(i * 3) % 4]),
  crew: Array.from({ length: rows }, (_, i) => [101, 202, 303][(i * 7) % 3]),
};

const specs: [string, Term[], boolean][] = [
  ['numeric columns', ['speed', 'load'], true],
  ['a text column is a factor', ['speed', 'line'], true],
  ['a declared factor of a numeric code', ['speed', { kind: 'factor', of: 'crew' }], true],
  ['power and transform', ['speed', { kind: 'power', of: 'speed', degree: 3 }, { kind: 'transform', of: 'load', fn: 'log' }], true],
  ['numeric × factor', ['speed', 'line', { kind: 'product', of: ['speed', 'line'] }], true],
  ['factor × factor', ['line', 'shift', { kind: 'product', of: ['line', 'shift'] }], true],
  ['three-way with a declared factor', [{ kind: 'factor', of: 'crew', reference: '202' }, { kind: 'product', of: ['line', 'shift', 'crew'] }], true],
  ['a plain numeric term beside its own factor declaration stays numeric', ['crew', { kind: 'factor', of: 'crew' }], true],
  ['no intercept', ['line', { kind: 'product', of: ['speed', 'load'] }], false],
];

t.test('the predicted design width equals the width buildDesign builds', async (t) => {
  const shape = shapeOfColumns(lineData);
  const all = commonRows(lineData, Object.keys(lineData)).rows;
  for (const [name, terms, intercept] of specs) {
    const built = buildDesign(lineData, terms, intercept, all);
    if ('issues' in built) throw new Error(`${name}: ${built.issues[0].message}`);
    const predicted = designWidth(shape, terms, intercept, 2000);
    t.equal(predicted.columns, built.design.labels.length, name);
    t.equal(predicted.atLeast, false);
    t.same(predicted.perTerm, terms.map((_, j) => built.design.termOfColumn.filter((c) => c === j).length), `${name}: per term`);
  }
});

t.test('level counting stops just past its bound, and says the width is a lower bound', async (t) => {
  const many = { y: Array.from({ length: 50_000 }, (_, i) => i % 3), code: Array.from({ length: 50_000 }, (_, i) => `part-${i}`) };
  const shape = shapeOfColumns(many);
  t.equal(shape.levels('code', 10), 11, 'counted to the bound plus one');
  t.equal(shape.levels('code', 5), 6, 'a smaller bound reads the count already made');
  const width = designWidth(shape, ['code'], true, 100);
  t.equal(width.atLeast, true);
  t.ok(width.columns > 100, 'beyond the cap, so refused');
  const product = designWidth(shape, [{ kind: 'product', of: ['code', 'y'] }, { kind: 'factor', of: 'y' }], true, 100);
  t.ok(product.columns > 100);
});

t.test('every candidate form prices itself', async (t) => {
  t.same(Object.keys(CANDIDATE_PRICES).sort(), ['expression', 'fit', 'fitted', 'glm', 'lifetime', 'logLikelihood', 'residuals', 'rss']);
});

t.test('the answer-size estimate is an upper bound of the measured JSON, within a factor of four', async (t) => {
  const columns = demoColumns();
  const newRows = (m: number) => ({ peakTemp: Array.from({ length: m }, (_, i) => 1150 + i % 90), moisture: Array.from({ length: m }, (_, i) => 4 + (i % 30) / 10), kiln: Array.from({ length: m }, (_, i) => (i % 2 ? 'east' : 'west')), holdMinutes: Array.from({ length: m }, () => 30) });
  const shapes: [string, CandidateInput[], number][] = [
    ['two small models', [{ form: 'fit', name: 'a', terms: ['peakTemp'], intercept: true }, { form: 'fit', name: 'b', terms: ['peakTemp', 'kiln'], intercept: true }], 0],
    ['twelve models, nested pairs', Array.from({ length: 12 }, (_, i): CandidateInput => ({ form: 'fit', name: `model ${i}`, terms: (['peakTemp', 'moisture', 'kiln', 'holdMinutes'] as Term[]).slice(0, 1 + (i % 4)), intercept: true })), 0],
    ['four models, 2000 predictions', Array.from({ length: 4 }, (_, i): CandidateInput => ({ form: 'fit', name: `model ${i}`, terms: (['peakTemp', { kind: 'power', of: 'peakTemp', degree: 2 }, 'moisture', 'kiln'] as Term[]).slice(0, 1 + i), intercept: true })), 2000],
  ];
  for (const [name, candidates, m] of shapes) {
    answerSizeBounds(t, name, { columns, response: 'shrinkage', weights: null, candidates, policy: DEFAULT_POLICY, policyHash: 'h', extras: m ? { predict: { columns: newRows(m) } } : undefined });
  }
});

t.test('a wide design\'s work grows with the square of its width (a factor of L levels is L - 1 columns)', async (t) => {
  const n = 3000;
  const price = (levels: number) => priceComparison({
    columns: { y: Array.from({ length: n }, (_, i) => i % 13), batch: Array.from({ length: n }, (_, i) => `batch ${i % levels}`) },
    response: 'y', weights: null, policy: DEFAULT_POLICY, policyHash: 'h',
    candidates: [{ form: 'fit', name: 'by batch', terms: ['batch'], intercept: true }],
  }, null, 2000);
  const narrow = price(100);
  const wide = price(300);
  t.equal(narrow.designColumns, 100);
  t.equal(wide.designColumns, 300);
  t.ok(wide.parts[1].work > 6 * narrow.parts[1].work, 'three times the columns: more than six times the work');
  t.same(wide.parts[1].path, ['candidates', 0, 'terms', 0], 'the part points at the term that makes the columns');
});

t.test('refusals name the estimate, the cap, its setting, and the largest part', async (t) => {
  const columns = demoColumns();
  const price = priceComparison({
    columns, response: 'shrinkage', weights: null, policy: DEFAULT_POLICY, policyHash: 'h',
    candidates: [{ form: 'fit', name: 'small', terms: ['peakTemp'], intercept: true }, { form: 'fit', name: 'large', terms: ['peakTemp', 'moisture', 'kiln', { kind: 'product', of: ['moisture', 'kiln'] }], intercept: true }],
  }, null, 2000);
  const issues = priceIssues(price, caps(price.work / 2));
  t.equal(issues.length, 1);
  t.match(issues[0], { code: 'work_limit', setting: 'MAX_REQUEST_WORK', limit: price.work / 2, estimate: Math.ceil(price.work) });
  t.same(issues[0].path, ['candidates', 1]);
  t.match(issues[0].message, /candidate 1 \("large"/);
  t.same(priceIssues(price, caps()), [], 'within the caps: no issue');
});

t.test('a search: the default budget when every subset is affordable, a narrower one when the cap is not', async (t) => {
  const columns = demoColumns();
  const pool: Term[] = ['peakTemp', 'moisture', 'holdMinutes', 'kiln', { kind: 'power', of: 'peakTemp', degree: 2 }, { kind: 'product', of: ['peakTemp', 'kiln'] }];
  const input = { columns, summary: null, response: 'shrinkage', weights: null, pool, always: [], hierarchy: false, intercept: true, top: 5 };
  const roomy = priceSearch(input, { caps: caps(), exhaustive: false, parallelism: 2 });
  t.same(roomy.budget, DEFAULT_SEARCH_BUDGET);
  const prepared = prepareSearch(input);
  if ('issues' in prepared) throw new Error(prepared.issues[0].message);
  t.equal(prepared.problem.dimension, designWidth(shapeOfColumns(columns), pool, true, 2000).columns, 'd: the design less the intercept, plus the response');
  // A cap that pays for preparing and refitting but only part of the 64 subsets.
  const fixed = roomy.price.parts[0].work + roomy.price.parts[2].work;
  const tight = priceSearch(input, { caps: caps(fixed + roomy.price.parts[1].work / 3), exhaustive: false, parallelism: 2 });
  t.ok(tight.budget.maxSubsets < 64, `the subset budget narrowed to ${tight.budget.maxSubsets}`);
  const plan = planSearch(prepared.problem, {}, tight.budget);
  t.equal(plan.ok && plan.method, 'branchAndBound', 'so the search turns to branch and bound');
  const forced = priceSearch(input, { caps: caps(fixed + roomy.price.parts[1].work / 3), exhaustive: true, parallelism: 2 });
  t.match(priceIssues(forced.price, caps(fixed + roomy.price.parts[1].work / 3)), [{ code: 'work_limit', setting: 'MAX_REQUEST_WORK' }], 'every subset asked for and not affordable: refused');
});
