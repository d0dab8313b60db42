// The regularised incomplete gamma functions P(κ, x) and Q(κ, x) = 1 - P in
// logs, with their first and second derivatives in the shape κ. A censored
// gamma observation needs those derivatives, and they have no closed form.
// We differentiate the two classical expansions term by term, in the same
// loop that sums them, and stop only when the value and both derivatives have
// settled:
// - x < κ + 1: the power series P = e^{κ ln x - x - lnΓ(κ+1)} Σ_n x^n / ((κ+1)…(κ+n))
//   (Abramowitz & Stegun 6.5.29); each term's log-derivative is -Σ_{m<=n} 1/(κ+m),
//   so the derivatives are sums of positive-weighted terms without cancellation;
// - x >= κ + 1: Legendre's continued fraction for Q (A&S 6.5.31, in the form
//   of Numerical Recipes' gcf), differentiated through the three-term
//   recurrence of its convergents A_k/B_k, with A', A'', B', B'' carried
//   alongside and rescaled together.
// The other tail follows by complement (P = 1 - Q), which in each region
// loses at most a few digits (P or Q <= ~0.98 there). Checked against mpmath
// (arbitrary precision) and against central differences in
// test/core/models/lifetime/incomplete-gamma.test.ts.
//
// For very large shapes (κ >> 10^4) the prefactor κ ln x - x - lnΓ(κ) loses
// digits to cancellation (about κ ε relative); the values stay usable for
// fitting but are not full precision there.
import digamma from '@stdlib/math-base-special-digamma';
import gammaln from '@stdlib/math-base-special-gammaln';
import log1p from '@stdlib/math-base-special-log1p';
import trigamma from '@stdlib/math-base-special-trigamma';

/** One tail X in logs: ln X, X_κ / X and X_κκ / X. */
export interface GammaTail {
  log: number;
  d1: number;
  d2: number;
}

const RELATIVE_TOLERANCE = 1e-16;
/**
 * The continued fraction's convergents stop changing at rounding level, not
 * below it: its value is settled at a change of 1e-15 of itself and its
 * derivatives (carried through longer recurrences) at 1e-13, which is far
 * below what the likelihood's derivatives need and well above their noise.
 */
const FRACTION_TOLERANCE = 1e-15;
const FRACTION_DERIVATIVE_TOLERANCE = 1e-13;
const MAX_TERMS = 100_000;

/** ln(x^κ e^-x / Γ(κ)), the log of x times the standard gamma density at x. */
export function logGammaKernel(shape: number, x: number): number {
  return shape * Math.log(x) - x - gammaln(shape);
}

/**
 * The tail e^L · V from its log prefix L (with L', L'') and the sum or
 * fraction V (with V', V''): ln X = L + ln V, X'/X = L' + V'/V,
 * X''/X = L'² + L'' + 2 L' V'/V + V''/V.
 */
function withPrefix(prefix: number, dPrefix: number, d2Prefix: number, v: number, dv: number, d2v: number): GammaTail {
  const r1 = dv / v;
  const r2 = d2v / v;
  return { log: prefix + Math.log(v), d1: dPrefix + r1, d2: dPrefix * dPrefix + d2Prefix + 2 * dPrefix * r1 + r2 };
}

function lowerBySeries(shape: number, x: number): GammaTail {
  const lnX = Math.log(x);
  const prefix = shape * lnX - x - gammaln(shape + 1);
  const dPrefix = lnX - digamma(shape + 1);
  const d2Prefix = -trigamma(shape + 1);
  let term = 1;
  let a = 0; // -Σ 1/(κ+m): d ln(term)/dκ
  let b = 0; // Σ 1/(κ+m)²: -d² ln(term)/dκ²
  let s0 = 1;
  let s1 = 0;
  let s2 = 0;
  for (let n = 1; n < MAX_TERMS; n++) {
    const k = shape + n;
    term *= x / k;
    a -= 1 / k;
    b += 1 / (k * k);
    const t1 = term * a;
    const t2 = term * (a * a + b);
    s0 += term;
    s1 += t1;
    s2 += t2;
    if (term <= RELATIVE_TOLERANCE * s0 && Math.abs(t1) <= RELATIVE_TOLERANCE * Math.abs(s1) && t2 <= RELATIVE_TOLERANCE * s2) break;
  }
  return withPrefix(prefix, dPrefix, d2Prefix, s0, s1, s2);
}

/**
 * Q by the continued fraction 1/(b0 + a1/(b1 + a2/(b2 + ...))), b_n = x + 2n + 1 - κ,
 * a_n = n(κ - n); as a general continued fraction with partial numerators
 * α = (1, a1, a2, ...) and denominators β = (b0, b1, ...), whose κ-derivatives
 * are α' = (0, 1, 2, ...), β' = -1, α'' = β'' = 0.
 */
function upperByContinuedFraction(shape: number, x: number): GammaTail {
  const lnX = Math.log(x);
  const prefix = shape * lnX - x - gammaln(shape);
  const dPrefix = lnX - digamma(shape);
  const d2Prefix = -trigamma(shape);
  // Convergents k-2 and k-1: (A, A', A'') and (B, B', B'').
  let a0 = 1, a0d = 0, a0dd = 0, b0 = 0, b0d = 0, b0dd = 0; // k = -1
  let a1 = 0, a1d = 0, a1dd = 0, b1 = 1, b1d = 0, b1dd = 0; // k = 0
  let f = 0, fd = 0, fdd = 0;
  for (let k = 1; k < MAX_TERMS; k++) {
    const n = k - 1;
    const alpha = k === 1 ? 1 : n * (shape - n);
    const alphaD = k === 1 ? 0 : n;
    const beta = x + 2 * n + 1 - shape;
    const betaD = -1;
    const a2 = beta * a1 + alpha * a0;
    const a2d = betaD * a1 + beta * a1d + alphaD * a0 + alpha * a0d;
    const a2dd = 2 * betaD * a1d + beta * a1dd + 2 * alphaD * a0d + alpha * a0dd;
    const b2 = beta * b1 + alpha * b0;
    const b2d = betaD * b1 + beta * b1d + alphaD * b0 + alpha * b0d;
    const b2dd = 2 * betaD * b1d + beta * b1dd + 2 * alphaD * b0d + alpha * b0dd;
    // Rescale both kept convergents by 1/B_k so nothing overflows; ratios are unchanged.
    const s = 1 / b2;
    a0 = a1 * s; a0d = a1d * s; a0dd = a1dd * s; b0 = b1 * s; b0d = b1d * s; b0dd = b1dd * s;
    a1 = a2 * s; a1d = a2d * s; a1dd = a2dd * s; b1 = 1; b1d = b2d * s; b1dd = b2dd * s;
    const nf = a1;
    const nfd = a1d - nf * b1d;
    const nfdd = a1dd - 2 * nfd * b1d - nf * b1dd;
    const settled = k > 2
      && Math.abs(nf - f) <= FRACTION_TOLERANCE * Math.abs(nf)
      && Math.abs(nfd - fd) <= FRACTION_DERIVATIVE_TOLERANCE * (Math.abs(nfd) + Math.abs(nf))
      && Math.abs(nfdd - fdd) <= FRACTION_DERIVATIVE_TOLERANCE * (Math.abs(nfdd) + Math.abs(nf));
    f = nf; fd = nfd; fdd = nfdd;
    if (settled) break;
  }
  return withPrefix(prefix, dPrefix, d2Prefix, f, fd, fdd);
}

/** The complement 1 - X of a tail X, with its κ-derivatives -X_κ and -X_κκ rescaled to the complement. */
function complement(tail: GammaTail): GammaTail {
  const value = Math.exp(tail.log);
  const log = log1p(-value);
  const ratio = Math.exp(tail.log - log); // X / (1 - X)
  return { log, d1: -tail.d1 * ratio, d2: -tail.d2 * ratio };
}

const ZERO_TAIL: GammaTail = { log: Number.NEGATIVE_INFINITY, d1: 0, d2: 0 };
const ONE_TAIL: GammaTail = { log: 0, d1: 0, d2: 0 };

/** Both tails of the regularised incomplete gamma function at shape κ > 0 and x >= 0. */
export function incompleteGammaTails(shape: number, x: number): { lower: GammaTail; upper: GammaTail } {
  if (x <= 0) return { lower: ZERO_TAIL, upper: ONE_TAIL };
  if (x === Number.POSITIVE_INFINITY) return { lower: ONE_TAIL, upper: ZERO_TAIL };
  if (x < shape + 1) {
    const lower = lowerBySeries(shape, x);
    return { lower, upper: complement(lower) };
  }
  const upper = upperByContinuedFraction(shape, x);
  return { lower: complement(upper), upper };
}
