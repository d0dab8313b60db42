// Refinement of a converged fit with extended-precision residuals: Gauss–
// Newton steps whose right-hand side is the residual vector computed in
// double-double, accepted while the double-double sum of squares falls. The
// least-squares analogue of the linear engine's iterative refinement: the
// Jacobian only needs to be good enough to point the way, the residuals must
// be right, and near a solution with small residuals (NIST Lanczos1: RSS
// 1.4e-25) the double evaluation of the model leaves them with a few digits.
import { ddAdd, ddMul, ddMulDouble, type DD } from '../../numeric/double-double.ts';
import { lmParameter } from './lm/lm-parameter.ts';
import { pivotedQR } from './lm/pivoted-qr.ts';
import type { ResidualProblem } from './residual-problem.ts';

/** Gauss–Newton refinement steps at most (measured: NIST needs 1 to 3). */
export const MAX_REFINEMENT_STEPS = 8;

export interface RefinedFit {
  x: Float64Array;
  /** y - model at x (unweighted), each to double accuracy from a double-double evaluation. */
  residuals: Float64Array;
  /** Σ w e², accumulated in double-double from those residuals. */
  rss: number;
  /** Steps that lowered the sum of squares. */
  steps: number;
  /** ||D δ|| / ||D x|| of the last step computed (accepted or not), D the Jacobian's column norms. */
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

export function refineFit(
  problem: ResidualProblem,
  start: Float64Array,
  lower: Float64Array,
  upper: Float64Array,
): RefinedFit | null {
  const n = problem.rows;
  const p = problem.parameters;
  const weights = problem.data.weights;
  let x = Float64Array.from(start);
  let current = ddResiduals(problem, x);
  if (!current) return null;
  const jac = new Float64Array(n * p);
  const scratch = new Float64Array(n);
  const f = new Float64Array(n);
  const d = new Float64Array(p);
  let steps = 0;
  let lastRelativeStep = 0;
  let gradientCosine = 0;
  let jacobianAtX = false;
  for (let round = 0; round <= MAX_REFINEMENT_STEPS; round++) {
    if (problem.jacobian(x, scratch, jac) >= 0) return null;
    jacobianAtX = true;
    // f = sqrt(w) (model - y) = -sqrt(w) e, from the double-double residuals.
    let fnorm = 0;
    for (let i = 0; i < n; i++) {
      f[i] = -(weights ? Math.sqrt(weights[i]) : 1) * current.e[i];
      fnorm += f[i] * f[i];
    }
    fnorm = Math.sqrt(fnorm);
    // A parameter on a bound that the gradient pushes outwards stays there.
    const free: number[] = [];
    gradientCosine = 0;
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
    if (round === MAX_REFINEMENT_STEPS || free.length === 0) break;
    const work = new Float64Array(n * free.length);
    free.forEach((j, c) => work.set(jac.subarray(j * n, (j + 1) * n), c * n));
    const qr = pivotedQR(work, n, free.length, f);
    const { step } = lmParameter(qr, Float64Array.from(free, (j) => d[j]), Infinity, 0);
    const trial = Float64Array.from(x);
    let dx = 0;
    let xs = 0;
    free.forEach((j, c) => {
      trial[j] = Math.min(Math.max(x[j] + step[c], lower[j]), upper[j]);
      dx += (d[j] * (trial[j] - x[j])) ** 2;
    });
    for (let j = 0; j < p; j++) xs += (d[j] * x[j]) ** 2;
    lastRelativeStep = xs > 0 ? Math.sqrt(dx / xs) : Math.sqrt(dx);
    if (dx === 0) break;
    const next = ddResiduals(problem, trial);
    if (!next || !below(next.rss, current.rss)) break;
    x = trial;
    current = next;
    steps++;
    jacobianAtX = false;
    // A step this small moves the parameters by tens of units in their last
    // place: what is left is rounding, not a way down.
    if (lastRelativeStep <= 64 * Number.EPSILON) break;
  }
  if (!jacobianAtX && problem.jacobian(x, scratch, jac) >= 0) return null;
  return { x, residuals: current.e, rss: current.rss[0] + current.rss[1], steps, lastRelativeStep, gradientCosine, jacobian: jac };
}
