// Tail probabilities and critical values of the distributions the tests use.
// All special functions come from @stdlib (see stack-notes, "Distributions").
// Upper tails are evaluated with the upper-tail flag of the regularised
// incomplete gamma / beta functions, never as 1 - cdf: a p-value of 1e-20
// would otherwise round to exactly 0 (1 - (1 - 1e-20) = 0 in doubles).
import betainc from '@stdlib/math-base-special-betainc';
import gammainc from '@stdlib/math-base-special-gammainc';
import F from '@stdlib/stats-base-dists-f';
import chisquare from '@stdlib/stats-base-dists-chisquare';
import normal from '@stdlib/stats-base-dists-normal';
import T from '@stdlib/stats-base-dists-t';
import gammaln from '@stdlib/math-base-special-gammaln';

/** P(X > x) for X ~ chi-square(df): Q(df/2, x/2), the upper regularised incomplete gamma. */
export function chiSquareUpperTail(x: number, df: number): number {
  if (!(df > 0) || Number.isNaN(x)) return Number.NaN;
  if (x <= 0) return 1;
  if (x === Number.POSITIVE_INFINITY) return 0;
  return gammainc(x / 2, df / 2, true, true);
}

/**
 * P(X > x) for X ~ F(df1, df2). With t = df1 x / (df1 x + df2), P(X <= x) is
 * I_t(df1/2, df2/2), so the upper tail is the upper regularised incomplete
 * beta at the same point. When t rounds towards 1 (huge x) we evaluate the
 * mirror form I_{1-t}(df2/2, df1/2) with 1 - t = df2 / (df1 x + df2) formed
 * directly, which keeps the relative accuracy of tiny p-values.
 */
export function fUpperTail(x: number, df1: number, df2: number): number {
  if (!(df1 > 0) || !(df2 > 0) || Number.isNaN(x)) return Number.NaN;
  if (x <= 0) return 1;
  if (x === Number.POSITIVE_INFINITY) return 0;
  const denominator = df1 * x + df2;
  const t = (df1 * x) / denominator;
  if (t > 0.5) return betainc(df2 / denominator, df2 / 2, df1 / 2, true, false);
  return betainc(t, df1 / 2, df2 / 2, true, true);
}

/** The value exceeded with probability 1 - p by an F(df1, df2) variable. */
export function fQuantile(p: number, df1: number, df2: number): number {
  return F.quantile(p, df1, df2);
}

/** The value exceeded with probability 1 - p by a chi-square(df) variable. */
export function chiSquareQuantile(p: number, df: number): number {
  return chisquare.quantile(p, df);
}

/**
 * P(|T| > |t|) for T ~ Student's t(df): the two-sided p-value of a t test.
 * P(|T| > t) = I_x(df/2, 1/2) with x = df / (df + t²), the regularised
 * incomplete beta function (Abramowitz & Stegun 26.7.1), evaluated directly
 * so that small p-values keep their digits.
 */
export function tTwoSidedPValue(t: number, df: number): number {
  if (!(df > 0) || Number.isNaN(t)) return Number.NaN;
  if (!Number.isFinite(t)) return 0;
  const t2 = t * t;
  if (t2 === 0) return 1;
  // For |t| beyond about 1e154, t² overflows; x = df/(df + t²) is then 0 to double precision.
  const x = Number.isFinite(t2) ? df / (df + t2) : 0;
  return x === 0 ? 0 : betainc(x, df / 2, 0.5, true, false);
}

/** The value a Student's t(df) variable stays below with probability p. */
export function tQuantile(p: number, df: number): number {
  return T.quantile(p, df);
}

/** The value a standard normal variable stays below with probability p. */
export function normalQuantile(p: number): number {
  return normal.quantile(p, 0, 1);
}

/** P(T <= x) for T ~ Student's t(df); df = Infinity gives the standard normal. */
export function tCdf(x: number, df: number): number {
  return Number.isFinite(df) ? T.cdf(x, df) : normal.cdf(x, 0, 1);
}

/** ln of the t(df) density's constant, Γ((df+1)/2) / (Γ(df/2) √(df π)), by df: a model's df repeats for every row. */
const tLogNormaliser = new Map<number, number>();

/**
 * The density of Student's t(df) at x; df = Infinity gives the standard
 * normal. Written out, (1 + x²/df)^(−(df+1)/2) times the cached constant,
 * since it is called for every row and model of an averaged prediction.
 */
export function tPdf(x: number, df: number): number {
  if (!Number.isFinite(df)) return Math.exp(-0.5 * x * x) / Math.sqrt(2 * Math.PI);
  let c = tLogNormaliser.get(df);
  if (c === undefined) {
    c = gammaln((df + 1) / 2) - gammaln(df / 2) - 0.5 * Math.log(df * Math.PI);
    tLogNormaliser.set(df, c);
  }
  return Math.exp(c - ((df + 1) / 2) * Math.log1p((x * x) / df));
}
