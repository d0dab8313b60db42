import t from 'tap';
import longley from '../../reference/nist/longley.json' with { type: 'json' };
import pontius from '../../reference/nist/pontius.json' with { type: 'json' };
import { nestedTest, nestedTests, nestingOrder, type NestedCandidate } from '../../../src/core/inference/nested.ts';
import { designWithIntercept, makeDesign, projectFit, referenceFit } from './reference-fit.ts';
import type { DesignMatrix, Term } from '../../../src/core/types.ts';
import { buildDesign } from '../../../src/core/design/index.ts';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

function candidate(name: string, design: DesignMatrix, y: number[], weights?: number[], sample = 'y'): NestedCandidate {
  // Test designs are built column by column with distinct names, so their labels serve as keys.
  return { name, keys: design.labels, fit: projectFit(design, y, weights), sample };
}

function interceptOnly(n: number): DesignMatrix {
  return makeDesign(['intercept'], [new Array(n).fill(1)], true);
}

/** Gaussian log-likelihood of the contract (api.md, Conventions). */
function logLikelihood(rss: number, n: number, weights?: number[]): number {
  const wTerm = weights ? 0.5 * weights.reduce((s, w) => s + Math.log(w), 0) : 0;
  return (-n / 2) * (Math.log(2 * Math.PI) + Math.log(rss / n) + 1) + wTerm;
}

t.test('intercept-only against the full model reproduces the NIST certified ANOVA F', async (t) => {
  // Source: NIST StRD certified values (regression F, sums of squares), Longley and Pontius.
  for (const ds of [longley, pontius]) {
    const y = ds.data.y;
    const n = y.length;
    const full = ds.name === 'Longley'
      ? designWithIntercept(Object.fromEntries(ds.predictors.map((p) => [p, (ds.data as Record<string, number[]>)[p]])))
      : designWithIntercept({ x: (ds.data as { x: number[] }).x, 'x^2': (ds.data as { x: number[] }).x.map((v) => v * v) });
    const small = candidate('mean', interceptOnly(n), y);
    const large = candidate('full', full, y);
    t.same(nestingOrder(large, small)?.smaller.name, 'mean');
    const test = nestedTest(small, large);
    const anova = ds.certified.anova;
    t.equal(test.df, anova.regression.df);
    t.equal(test.residualDf, anova.residual.df);
    t.ok(rel(test.fStatistic!, Number(anova.regression.F)) < 1e-8, `${ds.name} F ${test.fStatistic} vs ${anova.regression.F}`);
    // LR = n ln(TSS / RSS) from the certified sums of squares.
    const ssReg = Number(anova.regression.sumOfSquares);
    const ssRes = Number(anova.residual.sumOfSquares);
    t.ok(rel(test.lrStatistic!, n * Math.log((ssReg + ssRes) / ssRes)) < 1e-8);
    t.equal(test.reason, null);
  }
});

t.test('F p-values agree with the finite-sum form of the incomplete beta for even df1', async (t) => {
  // For integer a = df1/2: P(F > f) = sum_{j<a} [Gamma(b+j) / (Gamma(b) j!)] x^j (1-x)^b,
  // x = df1 f / (df1 f + df2), b = df2/2 (the beta-negative-binomial identity, common practice).
  const y = longley.data.y;
  const small = candidate('mean', interceptOnly(y.length), y);
  const large = candidate('full', designWithIntercept({ x1: longley.data.x1, x6: longley.data.x6, x4: longley.data.x4, x3: longley.data.x3 }), y);
  const test = nestedTest(small, large);
  const a = test.df / 2, b = test.residualDf / 2, f = test.fStatistic!;
  const x = (test.df * f) / (test.df * f + test.residualDf);
  let term = Math.pow(1 - x, b), sum = 0;
  for (let j = 0; j < a; j++) { sum += term; term *= ((b + j) / (j + 1)) * x; }
  t.ok(rel(test.fPValue!, sum) < 1e-10, `${test.fPValue} vs ${sum}`);
  // Chi-square with even df: exp(-x/2) sum_{j<df/2} (x/2)^j / j! (closed form).
  const h = test.lrStatistic! / 2;
  let c = 1, s = 0;
  for (let j = 0; j < test.df / 2; j++) { s += c; c *= h / (j + 1); }
  t.ok(rel(test.lrPValue!, Math.exp(-h) * s) < 1e-10);
});

t.test('LR statistic equals 2 (logL_large - logL_small) under the contract convention, weights included', async (t) => {
  const x = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
  const z = [3, 1, 4, 1, 5, 9, 2, 6, 5, 3];
  const y = [2.1, 3.9, 6.2, 7.8, 10.1, 12.3, 13.8, 16.4, 17.9, 20.2];
  const w = [1, 2, 1, 0.5, 1, 3, 1, 1, 2, 1];
  const small = candidate('s', designWithIntercept({ x }), y, w);
  const large = candidate('l', designWithIntercept({ x, z }), y, w);
  const test = nestedTest(small, large);
  const expected = 2 * (logLikelihood(large.fit.rss, 10, w) - logLikelihood(small.fit.rss, 10, w));
  t.ok(rel(test.lrStatistic!, expected) < 1e-10);
  // Partial F by definition (larger model's residual variance).
  const fByHand = ((small.fit.rss - large.fit.rss) / 1) / (large.fit.rss / (10 - 3));
  t.ok(rel(test.fStatistic!, fByHand) < 1e-12);
});

t.test('automatic detection: subsets of labels, same sample; ranks decide df; df = 0 skipped', async (t) => {
  const x = [1, 2, 3, 4, 5, 6, 7, 8];
  const z = [2, 7, 1, 8, 2, 8, 1, 8];
  const y = [1.2, 2.3, 2.9, 4.4, 5.1, 5.8, 7.2, 8.1];
  const a = candidate('a', designWithIntercept({ x }), y);
  const b = candidate('b', designWithIntercept({ x, z }), y);
  // "c" adds an aliased copy of x: 3 columns, rank 2, so it spans the same space as "a".
  const c = candidate('c', designWithIntercept({ x, twiceX: x.map((v) => 2 * v) }), y);
  // Same columns as "b" on a different response: not comparable.
  const d = candidate('d', designWithIntercept({ x, z }), y.map(Math.log), undefined, 'log(y)');
  const e = candidate('e', designWithIntercept({ z }), y);
  const { tests, issues } = nestedTests([a, b, c, d, e], [{ smaller: 'a', larger: 'c' }, { smaller: 'b', larger: 'a' }, { smaller: 'a', larger: 'zzz' }]);
  t.same(tests.map((x) => [x.smaller, x.larger, x.df]), [['a', 'b', 1], ['e', 'b', 1]]);
  t.same(issues.map((i) => i.code), ['nested-test-not-nested', 'nested-test-unknown-candidate']);
  t.equal(c.fit.rank, 2);
  // A larger model with an aliased column: df from ranks (3 - 2 = 1), not column counts (4 - 2).
  const bAliased = candidate('b2', designWithIntercept({ x, z, zCopy: z.slice() }), y);
  const test = nestedTest(a, bAliased);
  t.equal(test.df, 1);
  t.ok(rel(test.fStatistic!, nestedTest(a, b).fStatistic!) < 1e-9);
});

t.test('an exact larger fit gives null statistics with a reason', async (t) => {
  const x = [1, 2, 3, 4, 5, 6];
  const y = x.map((v) => 1 + 2 * v + 0.5 * v * v);
  const small = candidate('line', designWithIntercept({ x }), y);
  const large = candidate('quad', designWithIntercept({ x, 'x^2': x.map((v) => v * v) }), y);
  t.ok(large.fit.exactFit);
  const test = nestedTest(small, large);
  t.equal(test.fStatistic, null);
  t.equal(test.lrPValue, null);
  t.match(test.reason, /exactly/);
});

t.test('nesting follows column keys from buildDesign, not labels a data column can imitate', async (t) => {
  // The reviewer's cases: a data column named "x^2" holding sin(x) is not the
  // power x^2, and a data column named "intercept" is not the intercept.
  const x = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12];
  const y = x.map((v, i) => 1 + 0.5 * v + 0.2 * v * v + [0.3, -0.2, 0.1, 0.4, -0.5, 0.2, -0.1, 0, 0.3, -0.4, 0.2, -0.1][i]);
  const columns = { y, x, 'x^2': x.map(Math.sin), 'intercept': x.map(Math.cos) };
  const rows = x.map((_, i) => i);
  const built = (name: string, terms: Term[], intercept: boolean): NestedCandidate => {
    const r = buildDesign(columns, terms, intercept, rows);
    if (!('design' in r)) throw new Error(JSON.stringify(r.issues));
    return { name, keys: r.design.keys!, fit: projectFit(r.design, y), sample: 'y' };
  };
  const rawColumn = built('raw', ['x^2'], true);
  const poly = built('poly', ['x', { kind: 'power', of: 'x', degree: 2 }], true);
  const line = built('line', ['x'], true);
  const fakeIntercept = built('fake', ['intercept'], false);
  t.equal(nestingOrder(rawColumn, poly), null);
  t.equal(nestingOrder(fakeIntercept, line), null);
  // Positive control: the same builder's x is inside x + x^2.
  t.equal(nestingOrder(line, poly)?.smaller.name, 'line');
  const { tests, issues } = nestedTests([rawColumn, poly, line, fakeIntercept], [{ smaller: 'raw', larger: 'poly' }]);
  t.same(tests.map((s) => [s.smaller, s.larger]), [['line', 'poly']]);
  t.same(issues.map((i) => i.code), ['nested-test-not-nested']);
  // A design without keys nests with nothing.
  t.equal(nestingOrder({ ...line, keys: null }, poly), null);
});
