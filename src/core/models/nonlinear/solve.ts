// One candidate from each of its start vectors: Levenberg–Marquardt, then
// refinement with extended-precision residuals, then the convergence
// certificate. The best converged solution (smallest sum of squares) wins;
// the others are reported so a reader can see whether the starts agreed.
import { levenbergMarquardt, type LmSettings, type LmStop } from './lm/levenberg-marquardt.ts';
import { refineFit, type RefinedFit } from './refine.ts';
import type { ResidualProblem } from './residual-problem.ts';
import { jacobianGeometry, type JacobianFactor } from './covariance.ts';

/** Tolerances of Moré's tests (MINPACK's ftol, xtol, gtol): at rounding level, so the fit runs to the end of double precision. */
export const LM_TOLERANCES = { ftol: 1e-15, xtol: 1e-15, gtol: 1e-15 } as const;
/** Default iteration cap (Jacobian evaluations) per start vector; NIST Bennett5 from its first start needs 747. */
export const DEFAULT_MAX_ITERATIONS = 1000;
/** Residual evaluations per start, trial steps included, as a multiple of the iteration cap. */
export const EVALUATIONS_PER_ITERATION = 2;
/**
 * The certificate of convergence: after refinement, the Gauss–Newton step
 * from the solution changes the parameters by at most this fraction of
 * their size, both measured in the scaling D (the Jacobian's column norms).
 * At every NIST StRD solution it is at most 3.3e-9 (measured, Thurber); a point where
 * Levenberg–Marquardt stopped without reaching a minimum leaves a step
 * orders larger.
 */
export const CERTIFICATE_STEP = 1e-6;

export type StartOutcome =
  | {
    start: number; status: 'converged'; rss: number; iterations: number; evaluations: number; stop: LmStop;
    refined: RefinedFit;
    /** (J'WJ)^-1 and R at the solution (full rank, or the outcome would be rank-deficient). */
    covariance: { unscaled: number[][]; factor: JacobianFactor; conditionNumber: number | null };
  }
  /** The iteration or evaluation cap came first. */
  | { start: number; status: 'iteration-cap'; iterations: number; evaluations: number }
  /** Levenberg–Marquardt stopped, but the certificate says the point is no minimum. */
  | { start: number; status: 'no-minimum'; iterations: number; evaluations: number; relativeStep: number }
  /** Where it stopped, some parameters are not identified (their Jacobian columns depend on the others). */
  | { start: number; status: 'rank-deficient'; iterations: number; evaluations: number; dependent: number[] }
  | { start: number; status: 'non-finite'; iterations: number; evaluations: number; row: number }
  | { start: number; status: 'start-not-finite'; row: number };

export function solveFromStart(
  problem: ResidualProblem,
  start: Float64Array,
  index: number,
  bounds: { lower: Float64Array; upper: Float64Array },
  maxIterations: number,
): StartOutcome {
  const probe = new Float64Array(problem.rows);
  const bad = problem.residuals(start, probe);
  if (bad >= 0) return { start: index, status: 'start-not-finite', row: bad };
  const settings: LmSettings = {
    ...bounds, ...LM_TOLERANCES, maxIterations, maxEvaluations: EVALUATIONS_PER_ITERATION * maxIterations,
  };
  const lm = levenbergMarquardt(problem, start, settings);
  const { iterations, evaluations } = lm;
  if (lm.stop === 'non-finite') return { start: index, status: 'non-finite', iterations, evaluations, row: lm.nonFiniteRow };
  if (lm.stop === 'iterations' || lm.stop === 'evaluations') return { start: index, status: 'iteration-cap', iterations, evaluations };
  const refined = refineFit(problem, lm.x, bounds.lower, bounds.upper);
  if (!refined) return { start: index, status: 'non-finite', iterations, evaluations, row: -1 };
  const { dependent, unscaledCovariance, factor, conditionNumber } = jacobianGeometry(refined.jacobian, problem.rows, problem.parameters);
  if (dependent.length > 0 || !unscaledCovariance || !factor) return { start: index, status: 'rank-deficient', iterations, evaluations, dependent };
  if (!(refined.lastRelativeStep <= CERTIFICATE_STEP)) {
    return { start: index, status: 'no-minimum', iterations, evaluations, relativeStep: refined.lastRelativeStep };
  }
  const covariance = { unscaled: unscaledCovariance, factor, conditionNumber };
  return { start: index, status: 'converged', rss: refined.rss, iterations, evaluations, stop: lm.stop, refined, covariance };
}

/** The converged outcome with the smallest sum of squares (the first on a tie), or null. */
export function bestOutcome(outcomes: readonly StartOutcome[]): Extract<StartOutcome, { status: 'converged' }> | null {
  let best: Extract<StartOutcome, { status: 'converged' }> | null = null;
  for (const o of outcomes) {
    if (o.status === 'converged' && (best === null || o.rss < best.rss)) best = o;
  }
  return best;
}
