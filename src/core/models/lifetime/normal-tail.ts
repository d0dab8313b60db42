// The standard normal's upper tail in logs. erfc keeps its relative accuracy
// until it underflows near z = 38; from z = 30 on we use Laplace's continued
// fraction for the Mills ratio R(z) = S(z)/φ(z),
//   R(z) = 1/(z + 1/(z + 2/(z + 3/(z + ...)))),
// which at z >= 30 agrees with the true ratio to rounding after a handful of
// levels (40 are evaluated). So ln S(z) stays finite for any finite z: a
// right-censored unit far out in a tail never turns the likelihood into -∞.
import erfc from '@stdlib/math-base-special-erfc';
import log1p from '@stdlib/math-base-special-log1p';

const LN_SQRT_2PI = 0.9189385332046728;
const TAIL_START = 30;
const LEVELS = 40;

/** z + 1/(z + 2/(...)) from level `first` down: 1/R(z) for first = 1, and 1/(λ(z) - z) for first = 2. */
function continuedFraction(z: number, first: number): number {
  let t = z;
  for (let k = LEVELS; k >= first; k--) t = z + k / t;
  return t;
}

/** Mills ratio S(z)/φ(z) for z >= TAIL_START. */
function millsRatio(z: number): number {
  return 1 / continuedFraction(z, 1);
}

/** ln P(Z > z) for Z standard normal. */
export function normalLogSurvival(z: number): number {
  if (Number.isNaN(z)) return Number.NaN;
  if (z < 0) return log1p(-0.5 * erfc(-z / Math.SQRT2));
  if (z < TAIL_START) return Math.log(0.5 * erfc(z / Math.SQRT2));
  if (z === Number.POSITIVE_INFINITY) return Number.NEGATIVE_INFINITY;
  return -0.5 * z * z - LN_SQRT_2PI + Math.log(millsRatio(z));
}

/** φ(z) / S(z), the hazard of the standard normal (the inverse Mills ratio). */
export function normalHazard(z: number): number {
  if (Number.isNaN(z)) return Number.NaN;
  if (z < TAIL_START) return Math.exp(-0.5 * z * z - LN_SQRT_2PI - normalLogSurvival(z));
  if (z === Number.POSITIVE_INFINITY) return Number.POSITIVE_INFINITY;
  return 1 / millsRatio(z);
}

/**
 * λ(z) - z, with λ the hazard: the curvature of ln S is -λ(λ - z), and far in
 * the upper tail λ ≈ z + 1/z, so the difference is taken from the continued
 * fraction's tail (1/(z + 2/(z + ...))) rather than by subtraction.
 */
export function normalHazardExcess(z: number): number {
  if (z < TAIL_START) return normalHazard(z) - z;
  if (z === Number.POSITIVE_INFINITY) return 0;
  return 1 / continuedFraction(z, 2);
}
