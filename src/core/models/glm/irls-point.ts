// The model at one set of coefficients, for IRLS: linear predictor, means,
// their derivatives and the deviance; the starting point; the working
// weights and residuals of the next step.
import type { DesignMatrix } from '../../types.ts';
import type { Family } from './families.ts';
import type { Link } from './links.ts';
import { designFacts } from './design-facts.ts';

export interface IrlsProblem {
  design: DesignMatrix;
  family: Family;
  link: Link;
  y: Float64Array;
  prior: Float64Array;
  offset: Float64Array | null;
  /** θ of the negative binomial; ignored by the other families. */
  theta: number;
  /**
   * Steps by the observed information (Newton–Raphson) instead of the expected
   * one (Fisher scoring), where observedInformationFactor has it for the
   * family and link; runIrls takes its last steps by Fisher scoring again.
   */
  observedInformation?: boolean;
}

/**
 * The observed information's weight over the expected one, per row, where it
 * is known and positive: for the negative binomial under the log link (not its
 * canonical link, so Fisher scoring converges only linearly — slowly when θ is
 * small) -d²ℓ/dη² = θμ(y+θ)/(μ+θ)² against the expected θμ/(μ+θ): a factor
 * (y+θ)/(μ+θ) > 0 for every count, so a Newton step is still a weighted least
 * squares with positive weights (the log-likelihood is concave in η).
 */
export function observedInformationFactor(pr: IrlsProblem): ((y: number, mu: number) => number) | null {
  if (!pr.observedInformation || pr.family.name !== 'negativeBinomial' || pr.link.name !== 'log') return null;
  const theta = pr.theta;
  return (y, mu) => (y + theta) / (mu + theta);
}

/** The model at one set of coefficients. */
export interface IrlsPoint {
  beta: Float64Array;
  eta: Float64Array;
  mu: Float64Array;
  complement: Float64Array;
  dmu: Float64Array;
  deviance: number;
  valid: boolean;
}

function emptyPoint(n: number, p: number): IrlsPoint {
  return {
    beta: new Float64Array(p), eta: new Float64Array(n), mu: new Float64Array(n),
    complement: new Float64Array(n), dmu: new Float64Array(n), deviance: Number.NaN, valid: false,
  };
}

/** Means, derivatives and deviance at linear predictors already in point.eta. */
function completePoint(pr: IrlsProblem, point: IrlsPoint): IrlsPoint {
  const { family, link, y, prior, theta } = pr;
  let valid = true;
  let s = 0;
  let c = 0;
  for (let i = 0; i < y.length; i++) {
    const eta = point.eta[i];
    const mu = link.mean(eta);
    const comp = link.complement(eta);
    point.mu[i] = mu;
    point.complement[i] = comp;
    point.dmu[i] = link.derivative(eta);
    if (!link.validEta(eta) || !family.validMean(mu, comp)) {
      valid = false;
      break;
    }
    // Neumaier summation: a deviance of 100,000 rows keeps its last digits for the convergence rule.
    const d = family.deviance(y[i], prior[i], mu, comp, theta);
    const t = s + d;
    c += Math.abs(s) >= Math.abs(d) ? s - t + d : d - t + s;
    s = t;
  }
  point.deviance = s + c;
  point.valid = valid && Number.isFinite(point.deviance);
  return point;
}

/** η = X β + offset (high + low rounded once). */
export function linearPredictor(design: DesignMatrix, beta: ArrayLike<number>, offset: Float64Array | null, out: Float64Array): void {
  if (offset) out.set(offset);
  else out.fill(0);
  const lows = designFacts(design).low;
  for (let j = 0; j < design.labels.length; j++) {
    const b = beta[j];
    if (b === 0) continue;
    const h = design.high[j];
    const l = lows[j];
    if (l) for (let i = 0; i < design.rows; i++) out[i] += (h[i] + l[i]) * b;
    else for (let i = 0; i < design.rows; i++) out[i] += h[i] * b;
  }
}

export function pointAt(pr: IrlsProblem, beta: Float64Array): IrlsPoint {
  const point = emptyPoint(pr.y.length, beta.length);
  point.beta = beta;
  linearPredictor(pr.design, beta, pr.offset, point.eta);
  return completePoint(pr, point);
}

/** The family's starting means (R's mustart), or failing that the weighted mean response, through the link. */
export function startingPoint(pr: IrlsProblem): IrlsPoint | null {
  const n = pr.y.length;
  const { family, link, y, prior } = pr;
  const point = emptyPoint(n, pr.design.labels.length);
  for (let i = 0; i < n; i++) point.eta[i] = link.link(family.start(y[i], prior[i]));
  if (completePoint(pr, point).valid) return point;
  let total = 0;
  let weight = 0;
  for (let i = 0; i < n; i++) {
    total += family.name === 'binomial' ? y[i] : prior[i] * y[i];
    weight += prior[i];
  }
  point.eta.fill(link.link(total / weight));
  return completePoint(pr, point).valid ? point : null;
}

/** IRLS weights w = prior (dμ/dη)² / V(μ) and working residuals (y - μ)/(dμ/dη). */
export function workingQuantities(pr: IrlsProblem, point: IrlsPoint): { weights: Float64Array; residual: Float64Array } {
  const n = pr.y.length;
  const weights = new Float64Array(n);
  const residual = new Float64Array(n);
  const observed = observedInformationFactor(pr);
  for (let i = 0; i < n; i++) {
    const d = point.dmu[i];
    const v = pr.family.variance(point.mu[i], point.complement[i], pr.theta);
    const f = observed ? observed(pr.y[i], point.mu[i]) : 1;
    const w = (pr.prior[i] * d * d * f) / v;
    // A derivative or variance that has underflowed takes the row out of this step only.
    if (!(w > 0) || !Number.isFinite(w) || d === 0) continue;
    weights[i] = w;
    // The score over the weight: the same score, divided by the observed information where Newton steps.
    residual[i] = pr.family.residual(pr.y[i], pr.prior[i], point.mu[i], point.complement[i]) / d / f;
  }
  return { weights, residual };
}
