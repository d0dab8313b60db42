// Iteratively reweighted least squares (Fisher scoring) for one family, link
// and fixed θ, after McCullagh & Nelder (1989, §2.5) and R's glm.fit, with
// these choices:
//  - Each step solves the weighted least squares by Householder QR
//    (weighted-step.ts), for the increment δ on the working residual
//    (y - μ)/(dμ/dη) once coefficients exist: like iterative refinement, the
//    solver's rounding then shrinks with δ, and the fixed point is set by the
//    score equations alone. The first step from starting means (no
//    coefficients yet) solves for β on the working response z = η - offset + r.
//  - Convergence needs two things: the relative change of the deviance
//    |D_k - D_{k-1}| / (|D_k| + 0.1) below DEVIANCE_TOLERANCE (R's rule, with
//    1e-10 for its 1e-8), and the last step below STEP_TOLERANCE of every
//    coefficient's standard error. The deviance is flat at its minimum, so
//    its change is the square of the step: under a non-canonical link, where
//    Fisher scoring converges only linearly, the deviance rule alone leaves
//    the estimates some 1e-6 of a standard error from the maximum.
//  - The R factor of the last step gives the model's (X'WX)^-1 (as R's
//    glm.fit takes it from its last QR), by the least-squares engine's plain
//    route. Where that engine would take its extended-precision route instead
//    (2 κ eps above DOUBLE_COVARIANCE_LIMIT), the converged fit takes one more
//    step through fitLeastSquares itself (equilibration, pivoted QR, the
//    double-double Gram covariance), whose covariance and aliasing are then
//    the model's; should that step still move the estimates, the remaining
//    steps are all such solves.
//  - Step halving (Marschner 2011, R's glm2) while the deviance rises or a
//    mean leaves the family's range or η the link's domain.
import type { DesignMatrix, LeastSquaresFit } from '../../types.ts';
import { fitLeastSquares } from '../../fit/index.ts';
import { DOUBLE_COVARIANCE_LIMIT } from '../../fit/covariance.ts';
import { factorCondition, factorCovariance } from './step-factor.ts';
import type { Family } from './families.ts';
import type { Link } from './links.ts';
import { solveWeightedStep, type StepSolution } from './weighted-step.ts';
import { designFacts } from './design-facts.ts';

export const DEVIANCE_TOLERANCE = 1e-10;
export const STEP_TOLERANCE = 1e-9;
export const MAX_STEP_HALVINGS = 30;
/** Halvings over a whole run, which bounds the work the pricing assumes. */
export const MAX_RUN_HALVINGS = 60;
export const DEFAULT_MAX_ITERATIONS = 25;
export const CONVERGENCE_RULE = `Fisher scoring (IRLS, each weighted least-squares step solved by Householder QR) until |D_k - D_{k-1}| / (|D_k| + 0.1) < ${DEVIANCE_TOLERANCE} for the deviance D after step k and the step moves no coefficient by more than ${STEP_TOLERANCE} of its standard error; a step is halved, up to ${MAX_STEP_HALVINGS} times (${MAX_RUN_HALVINGS} in a whole fit), while the deviance rises or a fitted mean leaves the family's range`;
const EPS = 2 ** -52;

export interface IrlsProblem {
  design: DesignMatrix;
  family: Family;
  link: Link;
  y: Float64Array;
  prior: Float64Array;
  offset: Float64Array | null;
  /** θ of the negative binomial; ignored by the other families. */
  theta: number;
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

export interface IrlsOptions {
  maxIterations: number;
  /** Starting coefficients per design column (a warm start), or null for the family's starting means. */
  start: Float64Array | null;
  /** End on a fitLeastSquares step (needed for the covariance); false inside a negative binomial's alternation. */
  finalStep: boolean;
}

export type IrlsOutcome =
  | {
      ok: true;
      point: IrlsPoint;
      converged: boolean;
      iterations: number;
      stepHalvings: number;
      lastChange: number | null;
      /** The last step's largest coefficient move in standard errors (Infinity for a solve for β itself). */
      lastStepInStandardErrors: number | null;
      /** β after the last step minus β before it (null when only one step from starting means was taken). */
      lastStep: Float64Array | null;
      /**
       * The last weighted solve as a least-squares fit (its covariance,
       * aliasing and condition number are the model's), with the weights it used.
       */
      final: { fit: LeastSquaresFit; weights: Float64Array } | null;
      active: number[];
    }
  | { ok: false; failure: 'no_valid_start' }
  /** `lastStep`: the last accepted step, or the one refused, for the separation check. */
  | { ok: false; failure: 'step_outside_domain'; iteration: number; lastStep: Float64Array | null };

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

function pointAt(pr: IrlsProblem, beta: Float64Array): IrlsPoint {
  const point = emptyPoint(pr.y.length, beta.length);
  point.beta = beta;
  linearPredictor(pr.design, beta, pr.offset, point.eta);
  return completePoint(pr, point);
}

/** The family's starting means (R's mustart), or failing that the weighted mean response, through the link. */
function startingPoint(pr: IrlsProblem): IrlsPoint | null {
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
function workingQuantities(pr: IrlsProblem, point: IrlsPoint): { weights: Float64Array; residual: Float64Array } {
  const n = pr.y.length;
  const weights = new Float64Array(n);
  const residual = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const d = point.dmu[i];
    const v = pr.family.variance(point.mu[i], point.complement[i], pr.theta);
    const w = (pr.prior[i] * d * d) / v;
    // A derivative or variance that has underflowed takes the row out of this step only.
    if (!(w > 0) || !Number.isFinite(w) || d === 0) continue;
    weights[i] = w;
    residual[i] = pr.family.residual(pr.y[i], pr.prior[i], point.mu[i], point.complement[i]) / d;
  }
  return { weights, residual };
}

interface Solve {
  beta: Float64Array;
  active: number[];
  /** The solve as a least-squares fit: fitLeastSquares's own, or built from the lean step's R. */
  fit: LeastSquaresFit;
  /** Whether fitLeastSquares made it. */
  full: boolean;
  /** The step's largest coefficient move in standard errors; Infinity for a solve for β itself. */
  stepInStandardErrors: number;
}

function largestInStandardErrors(fit: LeastSquaresFit): number {
  let largest = 0;
  fit.estimable.forEach((j, k) => {
    largest = Math.max(largest, Math.abs(fit.coefficients[j] ?? 0) / Math.sqrt(fit.unscaledCovariance[k][k]));
  });
  return largest;
}

/** One weighted solve, for the increment when coefficients exist (falling back to β itself if a column with a nonzero β turns aliased). */
function solve(
  pr: IrlsProblem, point: IrlsPoint, hasBeta: boolean, weights: Float64Array, residual: Float64Array,
  active: number[], full: boolean,
): Solve {
  const n = pr.y.length;
  const p = pr.design.labels.length;
  const z = () => {
    const out = new Float64Array(n);
    for (let i = 0; i < n; i++) out[i] = point.eta[i] - (pr.offset ? pr.offset[i] : 0) + residual[i];
    return out;
  };
  const lost = (kept: readonly number[]) => {
    const set = new Set(kept);
    return point.beta.some((b, j) => b !== 0 && !set.has(j));
  };
  if (full) {
    let fit = fitLeastSquares(pr.design, hasBeta ? residual : z(), weights, { maxRefinementSteps: hasBeta ? 0 : undefined });
    let increment = hasBeta;
    if (hasBeta && lost(fit.estimable)) {
      fit = fitLeastSquares(pr.design, z(), weights);
      increment = false;
    }
    const beta = new Float64Array(p);
    fit.coefficients.forEach((c, j) => { beta[j] = (increment ? point.beta[j] : 0) + (c ?? 0); });
    return { beta, active: fit.estimable, fit, full: true, stepInStandardErrors: increment ? largestInStandardErrors(fit) : Infinity };
  }
  let step = solveWeightedStep(pr.design, hasBeta ? residual : z(), weights, active);
  let increment = hasBeta;
  if (hasBeta && lost(step.active)) {
    step = solveWeightedStep(pr.design, z(), weights, step.active);
    increment = false;
  }
  const beta = new Float64Array(p);
  for (let j = 0; j < p; j++) beta[j] = (increment ? point.beta[j] : 0) + step.coefficients[j];
  return { beta, active: step.active, fit: leanFit(pr, step), full: false, stepInStandardErrors: increment ? step.largestInStandardErrors : Infinity };
}

/**
 * A lean step as a least-squares fit: what the model reports and the
 * after-ranking statistics read (covariance, estimable and aliased columns,
 * condition). Its coefficients and residuals are set by result.ts; the
 * working regression's sums of squares are not used and are NaN.
 */
function leanFit(pr: IrlsProblem, step: StepSolution): LeastSquaresFit {
  const { design } = pr;
  const { estimable, covariance } = factorCovariance(step.factor);
  const accepted = new Set(estimable);
  return {
    observations: design.rows,
    rank: estimable.length,
    coefficients: design.labels.map((_, j) => (accepted.has(j) ? step.coefficients[j] : null)),
    standardErrors: design.labels.map(() => null),
    aliased: design.labels.filter((_, j) => !accepted.has(j)),
    unscaledCovariance: covariance,
    estimable,
    residuals: new Float64Array(0),
    fitted: new Float64Array(0),
    rss: Number.NaN,
    tss: Number.NaN,
    sigma: null,
    exactFit: false,
    conditionNumber: factorCondition(step.factor),
    refinement: { steps: 0, lastCorrection: 0 },
  };
}

export function runIrls(pr: IrlsProblem, options: IrlsOptions): IrlsOutcome {
  const p = pr.design.labels.length;
  let point: IrlsPoint | null = null;
  let hasBeta = false;
  if (options.start) {
    const warm = pointAt(pr, Float64Array.from(options.start));
    if (warm.valid) {
      point = warm;
      hasBeta = true;
    }
  }
  point ??= startingPoint(pr);
  if (!point) return { ok: false, failure: 'no_valid_start' };

  let active = [...Array(p).keys()];
  let iterations = 0;
  let stepHalvings = 0;
  let lastChange: number | null = null;
  let lastStepInStandardErrors: number | null = null;
  let lastStep: Float64Array | null = null;
  let full = false;
  let final: { fit: LeastSquaresFit; weights: Float64Array } | null = null;
  let converged = false;
  // The cap counts every solve; the confirming solve may come one past it.
  while (iterations < options.maxIterations || (full && final === null)) {
    iterations++;
    const { weights, residual } = workingQuantities(pr, point);
    const step = solve(pr, point, hasBeta, weights, residual, active, full);
    let candidate = pointAt(pr, step.beta);
    if (!candidate.valid && !hasBeta) {
      // From starting means there is nothing to halve towards: take the
      // coefficients that best reproduce the starting η, if they are valid.
      const eta0 = new Float64Array(point.eta.length);
      for (let i = 0; i < eta0.length; i++) eta0[i] = point.eta[i] - (pr.offset ? pr.offset[i] : 0);
      const anchor = pointAt(pr, solveWeightedStep(pr.design, eta0, weights, active).coefficients);
      if (!anchor.valid) return { ok: false, failure: 'step_outside_domain', iteration: iterations, lastStep: null };
      point = anchor;
      hasBeta = true;
    }
    const rises = (c: IrlsPoint) => hasBeta && c.deviance - point!.deviance > DEVIANCE_TOLERANCE * (Math.abs(point!.deviance) + 0.1);
    let halvings = 0;
    while ((!candidate.valid || rises(candidate)) && halvings < MAX_STEP_HALVINGS && stepHalvings + halvings < MAX_RUN_HALVINGS) {
      const beta = new Float64Array(p);
      for (let j = 0; j < p; j++) beta[j] = (candidate.beta[j] + point.beta[j]) / 2;
      candidate = pointAt(pr, beta);
      halvings++;
    }
    stepHalvings += halvings;
    if (!candidate.valid) {
      const refused = Float64Array.from(step.beta, (b, j) => b - point!.beta[j]);
      return { ok: false, failure: 'step_outside_domain', iteration: iterations, lastStep: lastStep ?? refused };
    }
    lastChange = Math.abs(candidate.deviance - point.deviance) / (Math.abs(candidate.deviance) + 0.1);
    if (hasBeta) lastStep = Float64Array.from(candidate.beta, (b, j) => b - point!.beta[j]);
    final = { fit: step.fit, weights };
    active = step.active;
    point = candidate;
    hasBeta = true;
    lastStepInStandardErrors = step.stepInStandardErrors / 2 ** halvings;
    const settled = lastChange < DEVIANCE_TOLERANCE && lastStepInStandardErrors < STEP_TOLERANCE;
    if (!settled) continue;
    // The plain covariance is the least-squares engine's choice too below its limit.
    if (!options.finalStep || step.full || !(2 * step.fit.conditionNumber * EPS > DOUBLE_COVARIANCE_LIMIT)) {
      converged = true;
      break;
    }
    full = true;
    final = null;
  }
  return { ok: true, point, converged, iterations, stepHalvings, lastChange, lastStepInStandardErrors, lastStep, final, active };
}
