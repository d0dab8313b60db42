// Full log-likelihoods of the families, every constant included, so that the
// same observations score the same under every tool (the contract's
// conventions):
//   binomial   Σ ln C(m, y) + y ln μ + (m - y) ln(1 - μ)
//   Poisson    Σ y ln μ - μ - ln y!
//   neg. bin.  Σ ln Γ(y + θ) - ln Γ(θ) - ln y! + θ ln(θ/(θ + μ)) + y ln(μ/(θ + μ))
//   gamma      Σ ν ln(ν y/μ) - ν y/μ - ln y - ln Γ(ν)            (shape ν, variance μ²/ν)
//   inv. Gauss Σ -½ [ln(2π φ y³) + (y - μ)²/(φ μ² y)]             (variance φ μ³)
//   Gaussian   the least-squares convention: -n/2 (ln 2π + ln(RSS/n) + 1) + ½ Σ ln w
// One function serves models fitted here and means fitted elsewhere, so a
// model's own fitted means reproduce its log-likelihood exactly. Rows are
// summed with compensation (ddSum): 100,000 terms lose no digit to the order.
import gammaln from '@stdlib/math-base-special-gammaln';
import log1p from '@stdlib/math-base-special-log1p';
import { ddSum } from '../../numeric/double-double.ts';
import { gaussianLogLikelihood, sumOfLogs } from '../../likelihood.ts';
import type { GlmFamilyName } from './types.ts';

const LN_2PI = 1.8378770664093453;
/** Below this count ln Γ(y + θ) - ln Γ(θ) is summed as Σ ln(θ + j), which keeps its digits when θ is large. */
const DIRECT_SUM_LIMIT = 64;

export interface LikelihoodRows {
  /** The response as sent: successes for the binomial. */
  y: ArrayLike<number>;
  /** Trials for the binomial, relative weights for the Gaussian; 1 for every row when null. */
  prior: ArrayLike<number> | null;
  mu: ArrayLike<number>;
  /** 1 - μ formed without cancellation (binomial); computed as 1 - μ when null. */
  complement?: ArrayLike<number> | null;
}

/** ln C(m, y), exactly 0 at y = 0 and y = m so that 0/1 rows add nothing. */
export function logBinomialCoefficient(m: number, y: number): number {
  if (y === 0 || y === m) return 0;
  return gammaln(m + 1) - gammaln(y + 1) - gammaln(m - y + 1);
}

/** ln Γ(y + θ) - ln Γ(θ) for a count y. */
function logRisingFactorial(theta: number, y: number): number {
  if (y <= DIRECT_SUM_LIMIT) {
    let s = 0;
    for (let j = 0; j < y; j++) s += Math.log(theta + j);
    return s;
  }
  return gammaln(y + theta) - gammaln(theta);
}

function binomialTerm(y: number, m: number, mu: number, c: number): number {
  return logBinomialCoefficient(m, y) + (y > 0 ? y * Math.log(mu) : 0) + (m - y > 0 ? (m - y) * Math.log(c) : 0);
}

function poissonTerm(y: number, mu: number): number {
  return (y > 0 ? y * Math.log(mu) : 0) - mu - gammaln(y + 1);
}

/** The negative binomial term; θ ln(θ/(θ+μ)) = -θ ln(1 + μ/θ) and y ln(μ/(θ+μ)) = -y ln(1 + θ/μ). */
export function negativeBinomialTerm(y: number, mu: number, theta: number): number {
  return logRisingFactorial(theta, y) - gammaln(y + 1) - theta * log1p(mu / theta) - (y > 0 ? y * log1p(theta / mu) : 0);
}

function gammaTerm(y: number, mu: number, shape: number): number {
  const r = y / mu;
  return shape * Math.log(shape * r) - shape * r - Math.log(y) - gammaln(shape);
}

function inverseGaussianTerm(y: number, mu: number, dispersion: number): number {
  const d = y - mu;
  return -0.5 * (LN_2PI + Math.log(dispersion) + 3 * Math.log(y) + (d * d) / (dispersion * mu * mu * y));
}

/**
 * The log-likelihood of the rows under the family at the given means.
 * `parameter` is θ (negativeBinomial), the shape (gamma) or the dispersion
 * (inverseGaussian); the Gaussian takes σ² = RSS/n by maximum likelihood and
 * needs none. Null when the value is not finite (a Gaussian exact fit, a mean
 * of 0 where the response is positive).
 */
export function familyLogLikelihood(family: GlmFamilyName, rows: LikelihoodRows, parameter: number | null): number | null {
  const { y, prior, mu } = rows;
  const n = y.length;
  const weight = (i: number) => (prior ? prior[i] : 1);
  if (family === 'gaussian') {
    const squares = new Float64Array(n);
    for (let i = 0; i < n; i++) squares[i] = weight(i) * (y[i] - mu[i]) * (y[i] - mu[i]);
    const [rh, rl] = ddSum(squares);
    return gaussianLogLikelihood({ n, rss: rh + rl, sumLogWeights: prior ? sumOfLogs(prior) : 0 });
  }
  const terms = new Float64Array(n);
  const p = parameter ?? Number.NaN;
  for (let i = 0; i < n; i++) {
    switch (family) {
      case 'binomial':
        terms[i] = binomialTerm(y[i], weight(i), mu[i], rows.complement ? rows.complement[i] : 1 - mu[i]);
        break;
      case 'poisson':
        terms[i] = poissonTerm(y[i], mu[i]);
        break;
      case 'negativeBinomial':
        terms[i] = negativeBinomialTerm(y[i], mu[i], p);
        break;
      case 'gamma':
        terms[i] = gammaTerm(y[i], mu[i], p);
        break;
      case 'inverseGaussian':
        terms[i] = inverseGaussianTerm(y[i], mu[i], p);
        break;
    }
  }
  const [h, l] = ddSum(terms);
  const value = h + l;
  return Number.isFinite(value) ? value : null;
}
