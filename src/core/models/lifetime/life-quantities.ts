// Percentiles and survival probabilities of a fitted life model at one
// design row, with Wald intervals by the delta method:
// - percentiles of the distributions of positive time on the log scale,
//   ln t_p = μ + σ z_p (gamma: μ + ln x_p(κ)), so the interval stays positive
//   (common practice; Meeker & Escobar, Statistical Methods for Reliability
//   Data, ch. 8); of the time-scale distributions on t_p itself;
// - survival of the location-scale distributions through the standardised
//   deviate z = (y - μ)/σ, whose interval S maps monotonically; of the gamma
//   through ln(-ln S) (the complementary log-log scale), since its S is not a
//   function of one standardised deviate. For the Weibull the two agree.
// Likelihood-ratio intervals are not computed.
import { DISTRIBUTIONS, type DistributionName } from './distributions.ts';
import { incompleteGammaTails, logGammaKernel } from './incomplete-gamma.ts';
import { bilinear } from './small-matrix.ts';
import { normalLaw } from './standard-families.ts';
import gammaincinv from '@stdlib/math-base-special-gammaincinv';
import log1p from '@stdlib/math-base-special-log1p';

export interface LifetimeEstimates {
  distribution: DistributionName;
  /** Design column indices with estimates, in the order of `coefficients`. */
  estimable: number[];
  /** Coefficients of the location on the data's scale (ln t or t). */
  coefficients: Float64Array;
  /** ln σ, or ln κ for the gamma; null for the exponential (σ = 1). */
  extra: number | null;
  /** Covariance of (coefficients, extra), row-major. */
  covariance: Float64Array;
  dimension: number;
}

export interface LifePercentile {
  probability: number;
  estimate: number;
  lower: number | null;
  upper: number | null;
}

export interface LifeSurvival {
  time: number;
  estimate: number;
  lower: number | null;
  upper: number | null;
}

/** The two-sided normal quantile of a confidence level. */
export function waldQuantile(level: number): number {
  return normalLaw.quantile((1 + level) / 2);
}

/** μ = x'β at an estimable design row. */
export function locationAt(estimates: LifetimeEstimates, x: ArrayLike<number>): number {
  let mu = 0;
  for (let k = 0; k < estimates.coefficients.length; k++) mu += x[k] * estimates.coefficients[k];
  return mu;
}

/** Gradient of a quantity a μ + b s with respect to (β, s): a x, then b. */
function gradient(estimates: LifetimeEstimates, x: ArrayLike<number>, a: number, b: number): Float64Array {
  const g = new Float64Array(estimates.dimension);
  for (let k = 0; k < estimates.coefficients.length; k++) g[k] = a * x[k];
  if (estimates.extra !== null) g[estimates.dimension - 1] = b;
  return g;
}

function standardError(estimates: LifetimeEstimates, g: Float64Array): number | null {
  const v = bilinear(estimates.covariance, estimates.dimension, g, g);
  return v >= 0 && Number.isFinite(v) ? Math.sqrt(v) : null;
}

/**
 * ln x_p of the standard gamma and d ln x_p / d ln κ (implicit
 * differentiation of P(κ, x_p) = p). @stdlib's inverse starts it; a few
 * Newton steps on ln x against our own P (or Q above the median) finish it,
 * since @stdlib's incomplete gamma loses digits at large shapes.
 */
function gammaQuantile(shape: number, p: number): { log: number; slope: number } {
  const lower = p <= 0.5;
  let x = lower ? gammaincinv(p, shape) : gammaincinv(1 - p, shape, true);
  const target = lower ? Math.log(p) : log1p(-p);
  for (let k = 0; k < 4 && x > 0 && Number.isFinite(x); k++) {
    const tails = incompleteGammaTails(shape, x);
    const tail = lower ? tails.lower : tails.upper;
    // d ln P / d ln x = x g(x) / P = e^{K(x) - ln P}; for Q the same with a minus sign.
    const slope = (lower ? 1 : -1) * Math.exp(logGammaKernel(shape, x) - tail.log);
    const next = x * Math.exp(-(tail.log - target) / slope);
    if (!(next > 0) || !Number.isFinite(next)) break;
    const done = Math.abs(next - x) <= 1e-15 * x;
    x = next;
    if (done) break;
  }
  const tails = incompleteGammaTails(shape, x);
  // P_κ from the smaller tail: P_κ = P d1(P) = -Q d1(Q).
  const dP = tails.lower.log < tails.upper.log
    ? Math.exp(tails.lower.log) * tails.lower.d1
    : -Math.exp(tails.upper.log) * tails.upper.d1;
  // ∂x_p/∂κ = -P_κ / g(x_p) and x g(x) = e^{K(x)}, so ∂ ln x_p/∂κ = -P_κ e^{-K(x_p)}.
  return { log: Math.log(x), slope: -shape * dP * Math.exp(-logGammaKernel(shape, x)) };
}

export function percentileAt(estimates: LifetimeEstimates, x: ArrayLike<number>, probability: number, q: number): LifePercentile {
  const distribution = DISTRIBUTIONS[estimates.distribution];
  const mu = locationAt(estimates, x);
  let centre: number;
  let g: Float64Array;
  if (distribution.form.kind === 'gamma') {
    const quantile = gammaQuantile(Math.exp(estimates.extra!), probability);
    centre = mu + quantile.log;
    g = gradient(estimates, x, 1, quantile.slope);
  } else {
    const sigma = estimates.extra === null ? 1 : Math.exp(estimates.extra);
    const z = distribution.form.law.quantile(probability);
    centre = mu + sigma * z;
    g = gradient(estimates, x, 1, sigma * z);
  }
  const se = standardError(estimates, g);
  const log = distribution.scale === 'log';
  const back = (v: number) => (log ? Math.exp(v) : v);
  return {
    probability,
    estimate: back(centre),
    lower: se === null ? null : back(centre - q * se),
    upper: se === null ? null : back(centre + q * se),
  };
}

export function survivalAt(estimates: LifetimeEstimates, x: ArrayLike<number>, time: number, q: number): LifeSurvival {
  const distribution = DISTRIBUTIONS[estimates.distribution];
  if (distribution.scale === 'log' && !(time > 0)) return { time, estimate: 1, lower: 1, upper: 1 };
  const y = distribution.scale === 'log' ? Math.log(time) : time;
  const mu = locationAt(estimates, x);
  if (distribution.form.kind === 'gamma') {
    const shape = Math.exp(estimates.extra!);
    const u = Math.exp(y - mu);
    const upper = incompleteGammaTails(shape, u).upper;
    const logS = upper.log;
    // S rounds to 1 this early: nothing to put an interval around.
    if (!(logS < 0)) return { time, estimate: 1, lower: 1, upper: 1 };
    // η = ln(-ln S); ∂ ln S/∂μ = e^{K(u)}/Q, ∂ ln S/∂ ln κ = κ Q_κ/Q.
    const dMu = Math.exp(logGammaKernel(shape, u) - logS);
    const g = gradient(estimates, x, dMu / logS, (shape * upper.d1) / logS);
    const se = standardError(estimates, g);
    const eta = Math.log(-logS);
    const at = (v: number) => Math.exp(-Math.exp(v));
    return { time, estimate: Math.exp(logS), lower: se === null ? null : at(eta + q * se), upper: se === null ? null : at(eta - q * se) };
  }
  const law = distribution.form.law;
  const sigma = estimates.extra === null ? 1 : Math.exp(estimates.extra);
  const z = (y - mu) / sigma;
  const se = standardError(estimates, gradient(estimates, x, -1 / sigma, -z));
  const at = (v: number) => Math.exp(law.logSurvival(v));
  return { time, estimate: at(z), lower: se === null ? null : at(z + q * se), upper: se === null ? null : at(z - q * se) };
}

/** -ln S(t) at an estimable design row: the cumulative hazard, for Cox–Snell residuals and pictures. */
export function cumulativeHazardAt(estimates: LifetimeEstimates, mu: number, time: number): number {
  const distribution = DISTRIBUTIONS[estimates.distribution];
  if (distribution.scale === 'log' && !(time > 0)) return 0;
  if (time === Number.POSITIVE_INFINITY) return Number.POSITIVE_INFINITY;
  const y = distribution.scale === 'log' ? Math.log(time) : time;
  if (distribution.form.kind === 'gamma') return -incompleteGammaTails(Math.exp(estimates.extra!), Math.exp(y - mu)).upper.log;
  const sigma = estimates.extra === null ? 1 : Math.exp(estimates.extra);
  return -distribution.form.law.logSurvival((y - mu) / sigma);
}
