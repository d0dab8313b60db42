// Newton–Raphson for a maximum of a smooth log-likelihood in a handful of
// parameters, with the safeguards a censored likelihood needs:
// - where -H is not positive definite (far from the maximum), a
//   Levenberg-style damping τ·diag is added until it is, so every step goes
//   uphill;
// - each step is capped in its largest component (MAX_STEP, in the
//   standardised units of the caller's parameters): a trust region against
//   the overshoot a flat censored likelihood invites;
// - a backtracking line search halves the step until the Armijo condition
//   ℓ(θ + αδ) >= ℓ(θ) + 1e-4 α g'δ holds.
// Convergence rule: once the Newton decrement g'(-H)⁻¹g, at a point where
// -H is positive definite, is at most 1e-10 (the maximum is within about
// 1e-5 standard errors in every direction), one final full Newton step is
// taken without line search — in that region convergence is quadratic, so
// it leaves the estimates within about 1e-10 standard errors — and the
// derivatives are recomputed there for the covariance. When no step can
// raise the computed log-likelihood any more and the decrement is already
// below 1e-8, the remaining gain is below the rounding of the sum and the
// point is accepted as converged too (after the same final step).
import { cholesky, choleskySolve } from './small-matrix.ts';

export interface Objective {
  dimension: number;
  value(theta: Float64Array): number;
  /** Value, gradient and Hessian (row-major, dimension²). */
  derivatives(theta: Float64Array): Derivatives;
}

export interface Derivatives {
  value: number;
  gradient: Float64Array;
  hessian: Float64Array;
}

export type NewtonStop = 'iteration_limit' | 'no_ascent' | 'information_singular';

export interface NewtonOutcome {
  converged: boolean;
  reason: NewtonStop | null;
  iterations: number;
  theta: Float64Array;
  at: Derivatives;
  /** Cholesky factor of -H at theta; null unless converged. */
  information: Float64Array | null;
  decrement: number;
}

export const DECREMENT_TOLERANCE = 1e-10;
export const ROUNDING_DECREMENT = 1e-8;
export const MAX_STEP = 5;
const ARMIJO = 1e-4;
const MAX_HALVINGS = 40;

export const NEWTON_RULE = `Newton–Raphson with analytic derivatives; converged when the Newton decrement g'(-H)⁻¹g is at most ${DECREMENT_TOLERANCE} with -H positive definite (or at most ${ROUNDING_DECREMENT} when no step can raise the computed log-likelihood further), after which one full Newton step is taken; steps damped where -H is not positive definite, capped at ${MAX_STEP} in the largest standardised component, and halved until the log-likelihood rises (Armijo)`;

/** -H, damped when needed, factorised. */
function ascentFactor(hessian: Float64Array, m: number): { factor: Float64Array; damped: boolean } | null {
  const minus = hessian.map((v) => -v);
  const exact = cholesky(minus, m);
  if (exact) return { factor: exact, damped: false };
  let largest = 0;
  for (let j = 0; j < m; j++) largest = Math.max(largest, Math.abs(minus[j * m + j]));
  if (!Number.isFinite(largest)) return null;
  const floor = Math.max(largest, 1) * 1e-8;
  for (let tau = 1e-6; tau < 1e12; tau *= 10) {
    const damped = Float64Array.from(minus);
    for (let j = 0; j < m; j++) damped[j * m + j] += tau * Math.max(Math.abs(minus[j * m + j]), floor);
    const factor = cholesky(damped, m);
    if (factor) return { factor, damped: true };
  }
  return null;
}

function dot(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
}

export function maximiseByNewton(objective: Objective, start: Float64Array, maxIterations: number): NewtonOutcome {
  const m = objective.dimension;
  let theta: Float64Array = Float64Array.from(start);
  let at = objective.derivatives(theta);
  const stop = (reason: NewtonStop, iterations: number, decrement: number): NewtonOutcome =>
    ({ converged: false, reason, iterations, theta, at, information: null, decrement });
  // The final full Newton step: kept unless it lowers the log-likelihood by
  // more than its rounding, with the information recomputed where it lands.
  const finish = (iteration: number, step: Float64Array, factor: Float64Array, decrement: number): NewtonOutcome => {
    const trial = theta.map((v, j) => v + step[j]);
    const there = objective.derivatives(trial);
    if (Number.isFinite(there.value) && there.value >= at.value - 1e-12 * Math.max(1, Math.abs(at.value))) {
      const information = cholesky(there.hessian.map((v) => -v), m);
      if (information) {
        const last = dot(there.gradient, choleskySolve(information, m, there.gradient));
        return { converged: true, reason: null, iterations: iteration + 1, theta: trial, at: there, information, decrement: last };
      }
    }
    return { converged: true, reason: null, iterations: iteration, theta, at, information: factor, decrement };
  };
  if (!Number.isFinite(at.value)) return stop('no_ascent', 0, Number.NaN);
  for (let iteration = 0; ; iteration++) {
    const ascent = ascentFactor(at.hessian, m);
    if (!ascent || at.gradient.some((g) => !Number.isFinite(g))) return stop('information_singular', iteration, Number.NaN);
    const step = choleskySolve(ascent.factor, m, at.gradient);
    const decrement = dot(at.gradient, step);
    if (!ascent.damped && decrement <= DECREMENT_TOLERANCE) return finish(iteration, step, ascent.factor, decrement);
    if (ascent.damped && decrement <= DECREMENT_TOLERANCE) return stop('information_singular', iteration, decrement);
    if (iteration >= maxIterations) return stop('iteration_limit', iteration, decrement);
    let largest = 0;
    for (let j = 0; j < m; j++) largest = Math.max(largest, Math.abs(step[j]));
    if (largest > MAX_STEP) for (let j = 0; j < m; j++) step[j] *= MAX_STEP / largest;
    const slope = dot(at.gradient, step);
    // The full step is usually accepted, so it is evaluated with its
    // derivatives at once (one pass over the rows instead of two); shorter
    // steps need only the value until one is accepted.
    let alpha = 1;
    let accepted: Float64Array | null = null;
    let acceptedAt: Derivatives | null = null;
    for (let k = 0; k < MAX_HALVINGS; k++, alpha /= 2) {
      const trial = theta.map((v, j) => v + alpha * step[j]);
      const full = k === 0 ? objective.derivatives(trial) : null;
      const value = full ? full.value : objective.value(trial);
      if (Number.isFinite(value) && value >= at.value + ARMIJO * alpha * slope) {
        accepted = trial;
        acceptedAt = full;
        break;
      }
    }
    if (!accepted) {
      if (!ascent.damped && decrement <= ROUNDING_DECREMENT) return finish(iteration, step, ascent.factor, decrement);
      return stop('no_ascent', iteration, decrement);
    }
    theta = accepted;
    at = acceptedAt ?? objective.derivatives(theta);
  }
}
