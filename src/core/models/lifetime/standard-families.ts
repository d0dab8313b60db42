// The three standardised location-scale laws behind seven of the eight
// distributions: the smallest extreme value (log-time of a Weibull or
// exponential life, or time itself), the normal (log-time of a lognormal
// life, or time) and the logistic (log-time of a log-logistic life, or time).
// Each is evaluated in logs and in the ratio forms the likelihood needs
// (hazard f/S, reversed hazard f/F), so that no contribution underflows in a
// tail: a unit censored far beyond the fitted life keeps log S = -e^z (SEV),
// -softplus(z) (logistic) or the normal tail through its Mills ratio.
import erfc from '@stdlib/math-base-special-erfc';
import erfcinv from '@stdlib/math-base-special-erfcinv';
import expm1 from '@stdlib/math-base-special-expm1';
import log1p from '@stdlib/math-base-special-log1p';
import { normalHazard, normalHazardExcess, normalLogSurvival } from './normal-tail.ts';

export interface StandardLaw {
  /** ln f0(z). */
  logDensity(z: number): number;
  /** d/dz ln f0(z). */
  score(z: number): number;
  /** d²/dz² ln f0(z). */
  scoreSlope(z: number): number;
  /** ln S0(z) = ln P(Z > z). */
  logSurvival(z: number): number;
  /** ln F0(z) = ln P(Z <= z). */
  logDistribution(z: number): number;
  /** d/dz ln S0(z) = -f0/S0, minus the hazard. */
  survivalSlope(z: number): number;
  /** d²/dz² ln S0(z). */
  survivalCurvature(z: number): number;
  /** d/dz ln F0(z) = f0/F0, the reversed hazard. */
  distributionSlope(z: number): number;
  /** d²/dz² ln F0(z). */
  distributionCurvature(z: number): number;
  /** z with F0(z) = p. */
  quantile(p: number): number;
  /** Mean and standard deviation of Z, for starting values (moments of the law). */
  mean: number;
  sd: number;
}

const LN_SQRT_2PI = 0.9189385332046728; // ½ ln 2π
const EULER_GAMMA = 0.5772156649015329;

/** f0/F0 of the smallest extreme value: e^z e^{-e^z} / (1 - e^{-e^z}) = w / (e^w - 1), w = e^z. */
function sevReversedHazard(z: number): number {
  const w = Math.exp(z);
  if (w < 1e-300) return 1;
  return w / expm1(w);
}

/** Smallest extreme value: F0(z) = 1 - exp(-e^z). */
export const smallestExtremeValueLaw: StandardLaw = {
  logDensity: (z) => z - Math.exp(z),
  score: (z) => 1 - Math.exp(z),
  scoreSlope: (z) => -Math.exp(z),
  logSurvival: (z) => -Math.exp(z),
  logDistribution(z) {
    const w = Math.exp(z);
    // ln(1 - e^-w) = ln w - w/2 + w²/24 - ... for small w; -expm1 loses w
    // entirely once it underflows (z < -745).
    if (w < 1e-8) return z - w / 2;
    return Math.log(-expm1(-w));
  },
  survivalSlope: (z) => -Math.exp(z),
  survivalCurvature: (z) => -Math.exp(z),
  distributionSlope: sevReversedHazard,
  // r (h - r) with h = 1 - e^z the score.
  distributionCurvature(z) {
    const r = sevReversedHazard(z);
    return r * (1 - Math.exp(z) - r);
  },
  quantile: (p) => Math.log(-log1p(-p)),
  mean: -EULER_GAMMA,
  sd: Math.PI / Math.sqrt(6),
};

/** ln(1 + e^x) without overflow or loss for either sign of x. */
function softplus(x: number): number {
  return x > 0 ? x + log1p(Math.exp(-x)) : log1p(Math.exp(x));
}

/** P(Z <= z) of the standard logistic. */
function logisticCdf(z: number): number {
  return z >= 0 ? 1 / (1 + Math.exp(-z)) : Math.exp(z) / (1 + Math.exp(z));
}

/** Standard logistic: F0(z) = 1 / (1 + e^-z). */
export const logisticLaw: StandardLaw = {
  logDensity: (z) => -Math.abs(z) - 2 * log1p(Math.exp(-Math.abs(z))),
  score: (z) => -Math.tanh(z / 2),
  scoreSlope: (z) => -2 * logisticCdf(z) * logisticCdf(-z),
  logSurvival: (z) => -softplus(z),
  logDistribution: (z) => -softplus(-z),
  // (ln S0)' = -F0, (ln F0)' = S0, and both curvatures are -F0 S0.
  survivalSlope: (z) => -logisticCdf(z),
  survivalCurvature: (z) => -logisticCdf(z) * logisticCdf(-z),
  distributionSlope: (z) => logisticCdf(-z),
  distributionCurvature: (z) => -logisticCdf(z) * logisticCdf(-z),
  quantile: (p) => Math.log(p) - log1p(-p),
  mean: 0,
  sd: Math.PI / Math.sqrt(3),
};

/** Standard normal. */
export const normalLaw: StandardLaw = {
  logDensity: (z) => -0.5 * z * z - LN_SQRT_2PI,
  score: (z) => -z,
  scoreSlope: () => -1,
  logSurvival: normalLogSurvival,
  logDistribution: (z) => normalLogSurvival(-z),
  // (ln S0)' = -λ(z), (ln S0)'' = -λ(z)(λ(z) - z); ln F0(z) = ln S0(-z).
  survivalSlope: (z) => -normalHazard(z),
  survivalCurvature: (z) => -normalHazard(z) * normalHazardExcess(z),
  distributionSlope: (z) => normalHazard(-z),
  distributionCurvature: (z) => -normalHazard(-z) * normalHazardExcess(-z),
  quantile: (p) => (p < 0.5 ? -Math.SQRT2 * erfcinv(2 * p) : Math.SQRT2 * erfcinv(2 * (1 - p))),
  mean: 0,
  sd: 1,
};

/** P(Z > z) for the standard normal, for tests and plots (erfc keeps the upper tail's relative accuracy). */
export function normalSurvival(z: number): number {
  return 0.5 * erfc(z / Math.SQRT2);
}
