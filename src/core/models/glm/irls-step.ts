// One weighted least-squares solve of IRLS: the lean QR step
// (weighted-step.ts) or, where the covariance needs it, fitLeastSquares
// itself; for the increment on the working residual once coefficients exist,
// or for the coefficients themselves when there are none yet or a column
// with a nonzero coefficient has turned aliased. Either way the result reads
// as a least-squares fit, whose covariance and aliasing the model reports.
import type { LeastSquaresFit } from '../../types.ts';
import { fitLeastSquares } from '../../fit/index.ts';
import { factorCondition, factorCovariance } from './step-factor.ts';
import { solveWeightedStep, type StepSolution } from './weighted-step.ts';
import type { IrlsPoint, IrlsProblem } from './irls-point.ts';

export interface Solve {
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
export function weightedSolve(
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
