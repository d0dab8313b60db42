// Refinement of a converged fit: Gauss–Newton steps from the
// Levenberg–Marquardt solution, then the final residuals and sum of squares
// in double-double. The least-squares analogue of the linear engine's
// iterative refinement: the Jacobian only needs to point the way, the
// residuals must be right. The residuals at the Levenberg–Marquardt solution
// are computed in double-double. Where the double evaluation of the model
// agrees with them to 1e-10 of their root mean square, the steps and the
// final residuals use the double evaluation, summed in double-double; where
// it does not — residuals near the rounding of the model's values (NIST
// Lanczos1: residuals near 1e-13 on values near 1) — every step's residuals
// come from the double-double evaluation. The refined point is kept only if
// its sum of squares is no larger than at the start.
import { ddAdd, ddMul, ddMulDouble, type DD } from '../../numeric/double-double.ts';
import { residualSumOfSquares } from '../../likelihood.ts';
import { lmParameter } from './lm/lm-parameter.ts';
import { pivotedQR } from './lm/pivoted-qr.ts';
import type { ResidualProblem } from './residual-problem.ts';

/** Gauss–Newton refinement steps at most (measured: the NIST problems take 0 to 8). */
export const MAX_REFINEMENT_STEPS = 8;
/**
 * Largest difference of a double residual from the double-double one,
 * relative to the residuals' root mean square, for the steps and the final
 * residuals to use the double evaluation: the sum of squares then keeps at
 * least 9 digits (two per residual difference, 1e-10 each).
 */
const DOUBLE_RESIDUAL_TOLERANCE = 1e-10;
/** Besides the double residuals' measured errors, a relative rise of the sum of squares within this is rounding. */
const ROUNDING_RISE = 1e-15;
/** A step at most this fraction of the previous one counts as progress; otherwise refinement stops. */
const CONTRACTION = 0.9;

export interface RefinedFit {
  x: Float64Array;
  /** y - model at x (unweighted): from a double-double evaluation, or a double one checked against it. */
  residuals: Float64Array;
  /** Σ w e², accumulated in double-double. */
  rss: number;
  /** Gauss–Newton steps kept. */
  steps: number;
  /** ||D δ|| / ||D x|| of the Gauss–Newton step computed at x (not taken), D the Jacobian's column norms. */
  lastRelativeStep: number;
  /** Largest cosine between the residual vector and a free parameter's Jacobian column at x. */
  gradientCosine: number;
  /** The weighted Jacobian at x (column-major n x p), for the covariance. */
  jacobian: Float64Array;
}

interface Residuals {
  /** y - model, rounded to double (each accurate to double precision). */
  e: Float64Array;
  /** Σ w e² from the unrounded double-double residuals, as hi + lo. */
  rss: DD;
}

/**
 * Residuals in double-double and Σ w e² from them, so that two sums of
 * squares a tiny step apart can be told apart (near a large-residual
 * minimum they differ in the 17th digit or later).
 */
function ddResiduals(problem: ResidualProblem, x: Float64Array): Residuals | null {
  const n = problem.rows;
  const eh = new Float64Array(n);
  const el = new Float64Array(n);
  if (problem.residualsDD(x, eh, el) >= 0) return null;
  const w = problem.data.weights;
  let sum: DD = [0, 0];
  for (let i = 0; i < n; i++) {
    let sq = ddMul(eh[i], el[i], eh[i], el[i]);
    if (w) sq = ddMulDouble(sq[0], sq[1], w[i]);
    sum = ddAdd(sum[0], sum[1], sq[0], sq[1]);
  }
  return { e: eh, rss: sum };
}

function below(a: DD, b: DD): boolean {
  return a[0] < b[0] || (a[0] === b[0] && a[1] < b[1]);
}

/** The Gauss–Newton step at x over the free parameters (a parameter on a bound pushed outwards stays). */
function gaussNewtonStep(
  jac: Float64Array, f: Float64Array, x: Float64Array, lower: Float64Array, upper: Float64Array, n: number, p: number,
): { trial: Float64Array; relativeStep: number; gradientCosine: number } {
  let fnorm = 0;
  for (let i = 0; i < n; i++) fnorm += f[i] * f[i];
  fnorm = Math.sqrt(fnorm);
  const d = new Float64Array(p);
  const free: number[] = [];
  let gradientCosine = 0;
  for (let j = 0; j < p; j++) {
    let s = 0;
    let g = 0;
    for (let i = 0; i < n; i++) {
      s += jac[j * n + i] ** 2;
      g += jac[j * n + i] * f[i];
    }
    d[j] = Math.sqrt(s) || 1;
    if ((x[j] <= lower[j] && g > 0) || (x[j] >= upper[j] && g < 0)) continue;
    free.push(j);
    if (fnorm > 0) gradientCosine = Math.max(gradientCosine, Math.abs(g) / (d[j] * fnorm));
  }
  const trial = x.slice();
  const q = free.length;
  if (q === 0) return { trial, relativeStep: 0, gradientCosine };
  const work = new Float64Array(n * q);
  const freeD = new Float64Array(q);
  for (let c = 0; c < q; c++) {
    work.set(jac.subarray(free[c] * n, (free[c] + 1) * n), c * n);
    freeD[c] = d[free[c]];
  }
  const { step } = lmParameter(pivotedQR(work, n, q, f), freeD, Infinity, 0);
  let dx = 0;
  let xs = 0;
  for (let c = 0; c < q; c++) {
    const j = free[c];
    trial[j] = Math.min(Math.max(x[j] + step[c], lower[j]), upper[j]);
    dx += (d[j] * (trial[j] - x[j])) ** 2;
  }
  for (let j = 0; j < p; j++) xs += (d[j] * x[j]) ** 2;
  return { trial, relativeStep: xs > 0 ? Math.sqrt(dx / xs) : Math.sqrt(dx), gradientCosine };
}

export function refineFit(
  problem: ResidualProblem,
  start: Float64Array,
  lower: Float64Array,
  upper: Float64Array,
): RefinedFit | null {
  const n = problem.rows;
  const p = problem.parameters;
  const rootWeights = problem.data.weights ? problem.data.weights.map(Math.sqrt) : new Float64Array(n).fill(1);
  const initial = ddResiduals(problem, start);
  if (!initial) return null;
  // f = sqrt(w) (model - y) = -sqrt(w) e.
  const f = new Float64Array(n);
  for (let i = 0; i < n; i++) f[i] = -rootWeights[i] * initial.e[i];
  const plain = new Float64Array(n);
  if (problem.residuals(start, plain) >= 0) return null;
  let deviation = 0;
  let squares = 0;
  for (let i = 0; i < n; i++) {
    deviation = Math.max(deviation, Math.abs(plain[i] - f[i]));
    squares += f[i] * f[i];
  }
  // The double residuals' largest error relative to the residuals' size.
  const noise = squares > 0 ? deviation / Math.sqrt(squares / n) : Infinity;
  const extended = !(noise <= DOUBLE_RESIDUAL_TOLERANCE);

  const jac = new Float64Array(n * p);
  const scratch = new Float64Array(n);
  let x = start;
  let latest: Residuals | null = initial;
  let steps = 0;
  let previous = Infinity;
  let atStart = { lastRelativeStep: 0, gradientCosine: 0 };
  let measured = atStart;
  const trialF = new Float64Array(n);
  for (let round = 0; ; round++) {
    if (problem.jacobian(x, scratch, jac) >= 0) return null;
    const { trial, relativeStep, gradientCosine } = gaussNewtonStep(jac, f, x, lower, upper, n, p);
    measured = { lastRelativeStep: relativeStep, gradientCosine };
    if (round === 0) atStart = measured;
    // Stop without taking the step: the cap, nothing left but rounding, or no progress.
    if (round === MAX_REFINEMENT_STEPS || relativeStep <= 64 * Number.EPSILON || relativeStep > CONTRACTION * previous) break;
    // Residuals at the trial point; a step into values the expression does not have is not taken.
    if (extended) {
      const next = ddResiduals(problem, trial);
      if (!next) break;
      latest = next;
      for (let i = 0; i < n; i++) trialF[i] = -rootWeights[i] * next.e[i];
    } else if (problem.residuals(trial, trialF) >= 0) {
      break;
    }
    f.set(trialF);
    previous = relativeStep;
    x = trial;
    steps++;
  }
  if (steps === 0) {
    return { x, residuals: initial.e, rss: initial.rss[0] + initial.rss[1], steps, ...measured, jacobian: jac };
  }
  if (extended) {
    if (latest && !below(initial.rss, latest.rss)) {
      return { x, residuals: latest.e, rss: latest.rss[0] + latest.rss[1], steps, ...measured, jacobian: jac };
    }
  } else {
    // The double residuals at x carry the digits the check found; their sum
    // of squares is accumulated in double-double. A rise beyond what their
    // errors allow (the steps ran away) keeps the starting point.
    const e = new Float64Array(n);
    for (let i = 0; i < n; i++) e[i] = -f[i] / rootWeights[i];
    const rss = residualSumOfSquares(e, problem.data.weights ?? undefined);
    if (rss <= (initial.rss[0] + initial.rss[1]) * (1 + 4 * noise + ROUNDING_RISE)) {
      return { x, residuals: e, rss, steps, ...measured, jacobian: jac };
    }
  }
  // The steps did not lower the sum of squares: keep the Levenberg–Marquardt solution.
  if (problem.jacobian(start, scratch, jac) >= 0) return null;
  return { x: start, residuals: initial.e, rss: initial.rss[0] + initial.rss[1], steps: 0, ...atStart, jacobian: jac };
}
