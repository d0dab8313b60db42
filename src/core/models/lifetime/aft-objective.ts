// The accelerated-failure-time log-likelihood as a function of the
// parameter vector θ = (γ_0 … γ_{p-1}, s): the location of row i is
// μ_i = Σ_j x_ij γ_j and s is the log of the scale (or of the gamma's shape),
// absent for the exponential. The per-row derivatives in (μ, s) from a
// distribution's contributions become the gradient X'ℓ_μ, Σ ℓ_s and the
// Hessian X' diag(ℓ_μμ) X, X'ℓ_μs, Σ ℓ_ss by the chain rule.
import type { Bounds } from './bounds.ts';
import { rowDerivatives, type RowDerivatives } from './location-scale-likelihood.ts';
import type { Derivatives, Objective } from './newton.ts';

/** Σ ℓ_i for locations mu and extra parameter s, writing per-row derivatives to `out` when given. */
export type Contributions = (bounds: Bounds, mu: Float64Array, s: number, out: RowDerivatives | null) => number;

export interface AftProblem {
  /** Design columns (already standardised), column-major. */
  columns: Float64Array[];
  bounds: Bounds;
  contributions: Contributions;
  /** False for the exponential: s is fixed at `fixedExtra` and not a parameter. */
  extraFree: boolean;
  fixedExtra: number;
}

export function locations(columns: Float64Array[], theta: ArrayLike<number>, out: Float64Array): Float64Array {
  out.fill(0);
  for (let j = 0; j < columns.length; j++) {
    const c = columns[j];
    const b = theta[j];
    if (b === 0) continue;
    for (let i = 0; i < out.length; i++) out[i] += c[i] * b;
  }
  return out;
}

export function aftObjective(problem: AftProblem): Objective {
  const { columns, bounds, contributions, extraFree } = problem;
  const n = bounds.kind.length;
  const p = columns.length;
  const m = p + (extraFree ? 1 : 0);
  const mu = new Float64Array(n);
  const rows = rowDerivatives(n);
  const extra = (theta: Float64Array) => (extraFree ? theta[p] : problem.fixedExtra);
  return {
    dimension: m,
    value(theta) {
      return contributions(bounds, locations(columns, theta, mu), extra(theta), null);
    },
    derivatives(theta): Derivatives {
      const value = contributions(bounds, locations(columns, theta, mu), extra(theta), rows);
      const gradient = new Float64Array(m);
      const hessian = new Float64Array(m * m);
      for (let j = 0; j < p; j++) {
        const xj = columns[j];
        let g = 0;
        let hs = 0;
        for (let i = 0; i < n; i++) {
          g += xj[i] * rows.gMu[i];
          hs += xj[i] * rows.hMuS[i];
        }
        gradient[j] = g;
        if (extraFree) hessian[j * m + p] = hessian[p * m + j] = hs;
        for (let k = 0; k <= j; k++) {
          const xk = columns[k];
          let h = 0;
          for (let i = 0; i < n; i++) h += xj[i] * xk[i] * rows.hMuMu[i];
          hessian[j * m + k] = hessian[k * m + j] = h;
        }
      }
      if (extraFree) {
        let g = 0;
        let h = 0;
        for (let i = 0; i < n; i++) {
          g += rows.gS[i];
          h += rows.hSS[i];
        }
        gradient[p] = g;
        hessian[p * m + p] = h;
      }
      return { value, gradient, hessian };
    },
  };
}
