import t from 'tap';
import tables from '../../reference/tables/distribution-critical-values.json' with { type: 'json' };
import { chiSquareQuantile, chiSquareUpperTail, fQuantile, fUpperTail, tQuantile, tTwoSidedPValue } from '../../../src/core/inference/distributions.ts';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

t.test('critical values agree with the published 5% tables at their printed precision', async (t) => {
  // Source: distribution-critical-values.json (handbook tables).
  for (const row of tables.upperFivePercent.F) {
    const q = fQuantile(0.95, row.df1, row.df2);
    t.ok(Math.abs(q - row.value) <= 0.5 * 10 ** -row.decimals, `F(0.95; ${row.df1}, ${row.df2}) = ${q} vs table ${row.value}`);
    t.ok(Math.abs(fUpperTail(row.value, row.df1, row.df2) - 0.05) < 2e-3, 'p-value at the table value is about 0.05');
  }
  for (const row of tables.upperFivePercent.chiSquare) {
    const q = chiSquareQuantile(0.95, row.df);
    t.ok(Math.abs(q - row.value) <= 0.5 * 10 ** -row.decimals, `chi2(0.95; ${row.df}) = ${q} vs table ${row.value}`);
    t.ok(Math.abs(chiSquareUpperTail(row.value, row.df) - 0.05) < 1e-4);
  }
});

t.test('critical values and tails agree with closed forms to near machine precision', async (t) => {
  // chi-square(2) upper tail is exp(-x/2), so its 95% point is -2 ln 0.05 (closed form).
  const chi2two = -2 * Math.log(0.05);
  t.ok(rel(chiSquareQuantile(0.95, 2), chi2two) < 1e-13);
  t.ok(rel(chiSquareUpperTail(chi2two, 2), 0.05) < 1e-13);
  // F(2, d) upper tail is (1 + 2x/d)^(-d/2) (closed form), so F(0.95; 2, 20) = 10 (0.05^(-1/10) - 1).
  const f220 = 10 * (Math.pow(0.05, -0.1) - 1);
  t.ok(rel(fQuantile(0.95, 2, 20), f220) < 1e-12, `F(0.95;2,20) ${fQuantile(0.95, 2, 20)} vs ${f220}`);
  t.ok(rel(fUpperTail(f220, 2, 20), 0.05) < 1e-12);
  // F(1, 10) = t(10)^2 and chi-square(1) = z^2; t(0.975;10) = 2.228138851986274 and
  // z(0.975) = 1.959963984540054 (standard values, common practice).
  t.ok(rel(fQuantile(0.95, 1, 10), 2.228138851986274 ** 2) < 1e-12);
  t.ok(rel(chiSquareQuantile(0.95, 1), 1.959963984540054 ** 2) < 1e-12);
});

t.test('tiny upper tails keep their relative accuracy (no 1 - cdf cancellation)', async (t) => {
  // chi-square(2): exp(-x/2) exactly; at x = 200 it is 3.72e-44, which 1 - cdf would round to 0.
  for (const x of [50, 200, 1000]) t.ok(rel(chiSquareUpperTail(x, 2), Math.exp(-x / 2)) < 1e-12, `x = ${x}`);
  // chi-square(4): exp(-x/2)(1 + x/2) (closed form).
  t.ok(rel(chiSquareUpperTail(300, 4), Math.exp(-150) * 151) < 1e-12);
  // F(2, d): (1 + 2x/d)^(-d/2); at F = 1e8 on (2, 37) about 1e-130.
  for (const [x, d] of [[1e6, 20], [1e8, 37], [0.3, 5]]) {
    t.ok(rel(fUpperTail(x, 2, d), Math.pow(1 + (2 * x) / d, -d / 2)) < 1e-11, `F(${x}; 2, ${d})`);
  }
});

t.test('edge values', async (t) => {
  t.equal(chiSquareUpperTail(0, 3), 1);
  t.equal(fUpperTail(0, 3, 4), 1);
  t.equal(chiSquareUpperTail(Infinity, 3), 0);
  t.ok(Number.isNaN(fUpperTail(1, 0, 4)));
});

t.test('two-sided t p-values invert the t quantiles; tiny ones keep their digits', async (t) => {
  // t(0.975; 10) = 2.228138851986274 (stack notes, agreeing with closed forms):
  // its two-sided p-value is 0.05.
  t.ok(Math.abs(tTwoSidedPValue(2.228138851986274, 10) - 0.05) < 1e-14);
  t.ok(Math.abs(tTwoSidedPValue(-2.228138851986274, 10) - 0.05) < 1e-14, 'symmetric');
  for (const df of [1, 3, 28, 400]) {
    const q = tQuantile(0.995, df);
    t.ok(Math.abs(tTwoSidedPValue(q, df) - 0.01) < 1e-12, `df ${df}`);
  }
  // df = 1 is the Cauchy distribution: P(|T| > t) = 1 − (2/π) atan t (closed form).
  t.ok(Math.abs(tTwoSidedPValue(40, 1) - (1 - (2 / Math.PI) * Math.atan(40))) < 1e-15);
  // Far tail, evaluated directly rather than as 1 − cdf: scipy 1.10 gives
  // 2·stats.t.sf(30, 110) = 8.785077238856337e-55.
  const tiny = tTwoSidedPValue(30, 110);
  t.ok(Math.abs(tiny - 8.785077238856337e-55) < 1e-12 * 8.785077238856337e-55, `${tiny}`);
  t.equal(tTwoSidedPValue(0, 5), 1);
});
