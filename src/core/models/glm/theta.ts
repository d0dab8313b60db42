// θ of the negative binomial (variance μ + μ²/θ) by maximum likelihood at
// fitted means, as MASS::theta.ml does it, with a safeguarded Newton method
// on ln θ. Score and second derivative of ℓ(θ) = Σ ln Γ(y+θ) - ln Γ(θ)
// - θ ln(1 + μ/θ) - y ln(θ + μ) + const:
//   s(θ)  = Σ ψ(y+θ) - ψ(θ) - ln(1 + μ/θ) + (μ - y)/(θ + μ)
//   s'(θ) = Σ ψ'(y+θ) - ψ'(θ) + (μ² + θ y) / (θ (θ + μ)²)
// with ψ(y+θ) - ψ(θ) = Σ_{j<y} 1/(θ+j) summed directly for small counts
// (the digamma difference cancels when θ is large). The standard error is
// 1/√(-s'(θ̂)), the observed information with μ fixed, as MASS reports it.
import digamma from '@stdlib/math-base-special-digamma';
import trigamma from '@stdlib/math-base-special-trigamma';
import log1p from '@stdlib/math-base-special-log1p';
import { negativeBinomialTerm } from './log-likelihood.ts';
import type { ParameterEstimate } from './dispersion.ts';

const DIRECT_SUM_LIMIT = 64;
/**
 * Passes over the rows allowed per estimate (a score and curvature, or a
 * profile likelihood, each count one); a handful are used from the previous
 * θ. The pricing assumes it.
 */
export const THETA_MAX_PASSES = 60;
/**
 * θ beyond this multiple of the largest fitted mean makes μ²/θ < 1e-8 μ: the
 * variance is the Poisson's to eight digits, and a still rising likelihood
 * means the maximum is at θ = ∞ (no overdispersion).
 */
export const THETA_UNBOUNDED_RATIO = 1e8;

function scoreAndCurvature(y: ArrayLike<number>, mu: ArrayLike<number>, theta: number): { score: number; curvature: number } {
  let score = 0;
  let curvature = 0;
  for (let i = 0; i < y.length; i++) {
    const yi = y[i];
    const m = mu[i];
    let dg: number;
    let tg: number;
    if (yi <= DIRECT_SUM_LIMIT) {
      dg = 0;
      tg = 0;
      for (let j = 0; j < yi; j++) {
        const r = 1 / (theta + j);
        dg += r;
        tg -= r * r;
      }
    } else {
      dg = digamma(yi + theta) - digamma(theta);
      tg = trigamma(yi + theta) - trigamma(theta);
    }
    const tm = theta + m;
    score += dg - log1p(m / theta) + (m - yi) / tm;
    curvature += tg + (m * m + theta * yi) / (theta * tm * tm);
  }
  return { score, curvature };
}

function profile(y: ArrayLike<number>, mu: ArrayLike<number>, theta: number): number {
  let s = 0;
  for (let i = 0; i < y.length; i++) s += negativeBinomialTerm(y[i], mu[i], theta);
  return s;
}

/** MASS's start: n / Σ (y/μ - 1)², the moment estimate. */
export function momentTheta(y: ArrayLike<number>, mu: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < y.length; i++) s += (y[i] / mu[i] - 1) ** 2;
  const t = y.length / s;
  return t > 0 && Number.isFinite(t) ? t : 1;
}

export type ThetaEstimate = ({ ok: true } & ParameterEstimate) | { ok: false; unbounded: number };

export function thetaMaximumLikelihood(y: ArrayLike<number>, mu: ArrayLike<number>, start: number): ThetaEstimate {
  let maxMu = 0;
  for (let i = 0; i < mu.length; i++) maxMu = Math.max(maxMu, mu[i]);
  const limit = THETA_UNBOUNDED_RATIO * Math.max(1, maxMu);
  let theta = Math.min(start, limit);
  let value = profile(y, mu, theta);
  let passes = 1;
  while (passes + 2 <= THETA_MAX_PASSES) {
    const { score, curvature } = scoreAndCurvature(y, mu, theta);
    passes++;
    // Newton on u = ln θ: dℓ/du = θ s, d²ℓ/du² = θ² s' + θ s; a step of at most 1 in u,
    // uphill by the gradient's sign where the curvature is not negative.
    const g = theta * score;
    const h = theta * theta * curvature + g;
    let du = h < 0 ? -g / h : Math.sign(g);
    du = Math.max(-1, Math.min(1, du));
    let next = theta * Math.exp(du);
    let nextValue = profile(y, mu, next);
    passes++;
    while (!(nextValue >= value) && passes < THETA_MAX_PASSES) {
      du /= 2;
      next = theta * Math.exp(du);
      nextValue = profile(y, mu, next);
      passes++;
    }
    if (!(nextValue >= value)) break;
    theta = next;
    value = nextValue;
    if (theta > limit) return { ok: false, unbounded: limit };
    if (Math.abs(du) < 1e-12) break;
  }
  return { ok: true, estimate: theta, standardError: thetaStandardError(y, mu, theta) };
}

/** 1/√(observed information) at θ with the means held fixed; NaN where the curvature is not negative. */
export function thetaStandardError(y: ArrayLike<number>, mu: ArrayLike<number>, theta: number): number {
  const { curvature } = scoreAndCurvature(y, mu, theta);
  return curvature < 0 ? 1 / Math.sqrt(-curvature) : Number.NaN;
}
