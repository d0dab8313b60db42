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
import type { LeastSquaresFit } from '../../types.ts';
import { DOUBLE_COVARIANCE_LIMIT } from '../../fit/covariance.ts';
import { solveWeightedStep } from './weighted-step.ts';
import { observedInformationFactor, pointAt, startingPoint, workingQuantities, type IrlsPoint, type IrlsProblem } from './irls-point.ts';
import { weightedSolve } from './irls-step.ts';

export { linearPredictor, type IrlsPoint, type IrlsProblem } from './irls-point.ts';

export const DEVIANCE_TOLERANCE = 1e-10;
export const STEP_TOLERANCE = 1e-9;
export const MAX_STEP_HALVINGS = 30;
/** Halvings over a whole run, which bounds the work the pricing assumes. */
export const MAX_RUN_HALVINGS = 60;
export const DEFAULT_MAX_ITERATIONS = 25;
export const CONVERGENCE_RULE = `Fisher scoring (IRLS, each weighted least-squares step solved by Householder QR) until |D_k - D_{k-1}| / (|D_k| + 0.1) < ${DEVIANCE_TOLERANCE} for the deviance D after step k and the step moves no coefficient by more than ${STEP_TOLERANCE} of its standard error (for the negative binomial under the log link, Newton–Raphson steps by the observed information until then, and Fisher steps until the rule holds again, so the covariance is the expected information's); a step is halved, up to ${MAX_STEP_HALVINGS} times (${MAX_RUN_HALVINGS} in a whole fit), while the deviance rises or a fitted mean leaves the family's range`;
const EPS = 2 ** -52;

export interface IrlsOptions {
  maxIterations: number;
  /** Starting coefficients per design column (a warm start), or null for the family's starting means. */
  start: Float64Array | null;
  /**
   * Whether the run must leave the covariance the model reports (with a
   * fitLeastSquares solve where the extended route applies); false inside a
   * negative binomial's alternation and for the null model.
   */
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
  // Newton steps where the observed information is known and positive (irls-point.ts), then Fisher's.
  let newton = observedInformationFactor(pr) !== null;
  let confirming = false;
  const fisher: IrlsProblem = newton ? { ...pr, observedInformation: false } : pr;
  // The cap counts every solve; the confirming solve may come one past it.
  while (iterations < options.maxIterations || (full && final === null) || confirming) {
    iterations++;
    confirming = false;
    const stepProblem = newton ? pr : fisher;
    const { weights, residual } = workingQuantities(stepProblem, point);
    const step = weightedSolve(stepProblem, point, hasBeta, weights, residual, active, full);
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
    // Settled by Newton steps: the last steps are Fisher scoring's, so the
    // covariance, leverage and the convergence rule are the expected information's.
    if (newton) {
      newton = false;
      confirming = true;
      continue;
    }
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
