// One IRLS step: the weighted least-squares solution of a right-hand side on
// the design, by Householder QR of the augmented matrix [√W X, √W b] (its R
// factor holds R of √W X and Q'√W b, so R x = Q'b is the least-squares
// solution: no normal equations are formed). The QR is the row-blocked,
// cache-resident one the leverages already use (inference/streamed-qr.ts),
// about twice as fast here as the fit's pivoted QR at 100,000 × 30, which
// matters because a GLM repeats it every iteration. The R factor of the last
// step also gives the model's covariance (step-factor.ts), unless the design
// is so ill-conditioned that the least-squares engine would take its
// extended-precision route; then the fit ends on fitLeastSquares itself.
//
// Columns are centred on their weighted means against the intercept and
// scaled to unit length, then taken in order (the intercept first); a column
// is aliased under the least-squares rule (fit/index.ts): when the part of it
// the earlier columns do not explain is at most ALIAS_TOLERANCE of its norm,
// or when centring alone leaves that little of it.
import type { DesignMatrix } from '../../types.ts';
import { ALIAS_TOLERANCE } from '../../fit/index.ts';
import { rowScaleOf, streamedR, type ScaledColumns } from '../../inference/streamed-qr.ts';
import { designFacts } from './design-facts.ts';

/** The R factor of [√W X D, √W b] over the accepted columns, and how they were centred and scaled. */
export interface StepFactor {
  /** Row-major, (q + 1) × (q + 1); the last column belongs to the right-hand side. */
  r: Float64Array;
  /** Design columns in factorisation order (the intercept first when accepted). */
  columns: number[];
  /** 2-norm of each √W (x - centre) column, in factorisation order. */
  scale: Float64Array;
  /** Weighted column means (0 for the intercept), or null without an intercept. */
  centre: Float64Array | null;
  /** Value of the constant intercept column; 1 without one. */
  interceptValue: number;
  intercept: boolean;
}

export interface StepSolution {
  /** Per design column; 0 for a column outside `active`. */
  coefficients: Float64Array;
  factor: StepFactor;
  /** Columns solved for, in design order. */
  active: number[];
  /**
   * The largest |coefficient| / (its unscaled standard error) in the centred,
   * unit-length basis: read as the size of an increment step in standard
   * errors, which the convergence rule bounds.
   */
  largestInStandardErrors: number;
}

/**
 * ||√w (x - c)|| per column in one pass, and whether the intercept (at
 * position `intercept`, or -1) explains a column: the least-squares rule,
 * its norm about the weighted mean at most `tolerance` of its raw weighted
 * norm. With S1 = Σ w (x - c), S2 = Σ w (x - c)², W = Σ w: about the weighted
 * mean S2 - S1²/W, raw S2 + 2c S1 + c² W. A sum of squares that overflows
 * is taken again with the column scaled by its largest entry.
 */
function weightedNorms(
  high: Float64Array[], low: (Float64Array | null)[], rowScale: Float64Array, centre: Float64Array | null,
  intercept: number, tolerance: number,
): { scale: Float64Array; aliasedByIntercept: boolean[] } {
  const n = rowScale.length;
  let total = 0;
  for (let i = 0; i < n; i++) total += rowScale[i] * rowScale[i];
  const scale = new Float64Array(high.length);
  const aliasedByIntercept = high.map(() => false);
  for (let k = 0; k < high.length; k++) {
    const h = high[k];
    const l = low[k];
    const c = centre ? centre[k] : 0;
    const value = (i: number) => (l ? h[i] - c + l[i] : h[i] - c) * rowScale[i];
    let s1 = 0;
    let s2 = 0;
    if (l) {
      for (let i = 0; i < n; i++) {
        const x = (h[i] - c + l[i]) * rowScale[i];
        s1 += x * rowScale[i];
        s2 += x * x;
      }
    } else {
      for (let i = 0; i < n; i++) {
        const x = (h[i] - c) * rowScale[i];
        s1 += x * rowScale[i];
        s2 += x * x;
      }
    }
    if (!Number.isFinite(s2)) {
      let max = 0;
      for (let i = 0; i < n; i++) max = Math.max(max, Math.abs(value(i)));
      let t = 0;
      for (let i = 0; i < n; i++) t += (value(i) / max) ** 2;
      scale[k] = max * Math.sqrt(t);
      continue;
    }
    scale[k] = Math.sqrt(s2);
    if (intercept >= 0 && k !== intercept && total > 0) {
      const aboutMean = Math.max(0, s2 - (s1 * s1) / total);
      const raw = s2 + 2 * c * s1 + c * c * total;
      aliasedByIntercept[k] = !(aboutMean > tolerance * tolerance * raw);
    }
  }
  return { scale, aliasedByIntercept };
}

function keep(v: ScaledColumns, positions: number[]): ScaledColumns {
  return {
    rows: v.rows,
    high: positions.map((k) => v.high[k]),
    low: positions.map((k) => v.low[k]),
    rowScale: v.rowScale,
    centre: v.centre ? Float64Array.from(positions, (k) => v.centre![k]) : null,
    scale: Float64Array.from(positions, (k) => v.scale[k]),
  };
}

/**
 * Least squares of `rhs` on the columns `active` (a subset of the design's,
 * in design order) with weights w >= 0. Columns found aliased are dropped
 * from the returned `active`.
 */
export function solveWeightedStep(
  design: DesignMatrix,
  rhs: Float64Array,
  weights: Float64Array,
  active: readonly number[],
  tolerance = ALIAS_TOLERANCE,
): StepSolution {
  const n = design.rows;
  const facts = designFacts(design);
  const intercept = facts.intercept;
  const order = active.includes(intercept) ? [intercept, ...active.filter((j) => j !== intercept)] : [...active];
  const rowScale = rowScaleOf(weights, n)!;
  const centred = order[0] === intercept && intercept >= 0;
  const columns0 = [...order, -1];
  const high = columns0.map((j) => (j < 0 ? rhs : design.high[j]));
  const low = columns0.map((j) => (j < 0 ? null : facts.low[j]));
  const centre = centred ? Float64Array.from(columns0, (j) => (j < 0 ? 0 : facts.centre[j])) : null;
  const { scale, aliasedByIntercept } = weightedNorms(high, low, rowScale, centre, centred ? 0 : -1, tolerance);
  let v: ScaledColumns = { rows: n, high, low, rowScale, centre, scale };
  let positions = order.map((_, k) => k).filter((k) => scale[k] > 0 && !aliasedByIntercept[k]);
  let columns = positions.map((k) => order[k]);
  v = keep(v, [...positions, order.length]);
  let r: Float64Array;
  let q: number;
  for (;;) {
    q = columns.length;
    r = streamedR(v);
    // A column dependent on earlier ones leaves r_kk at rounding level, and the
    // reflection built from that noise would distort the later columns: drop the
    // first such column and factorise again (limited pivoting in design order).
    let dependent = -1;
    for (let k = 0; k < q; k++) {
      if (!(r[k * (q + 1) + k] > tolerance)) {
        dependent = k;
        break;
      }
    }
    if (dependent < 0) break;
    const rest = [...Array(q + 1).keys()].filter((k) => k !== dependent);
    columns = columns.filter((_, k) => k !== dependent);
    v = keep(v, rest);
  }
  // R11 γ = r12, then back to the caller's units and uncentred basis.
  const width = q + 1;
  const gamma = new Float64Array(q);
  for (let k = q - 1; k >= 0; k--) {
    let s = r[k * width + q];
    for (let l = k + 1; l < q; l++) s -= r[k * width + l] * gamma[l];
    gamma[k] = s / r[k * width + k];
  }
  const rhsScale = v.scale[q];
  const factor: StepFactor = {
    r, columns, scale: v.scale.slice(0, q), centre: v.centre ? v.centre.slice(0, q) : null,
    interceptValue: intercept >= 0 ? design.high[intercept][0] : 1, intercept: columns[0] === intercept && intercept >= 0,
  };
  const inverse = inverseUpper(r, width, q);
  let largestInStandardErrors = 0;
  for (let k = 0; k < q; k++) {
    let d = 0;
    for (let l = k; l < q; l++) d += inverse[k * q + l] * inverse[k * q + l];
    largestInStandardErrors = Math.max(largestInStandardErrors, Math.abs(gamma[k] * rhsScale) / Math.sqrt(d));
  }
  const coefficients = new Float64Array(design.labels.length);
  let shift = 0;
  for (let k = 0; k < q; k++) {
    const g = rhsScale > 0 ? (gamma[k] * rhsScale) / v.scale[k] : 0;
    coefficients[columns[k]] = g;
    if (v.centre && columns[k] !== intercept) shift += g * v.centre[k];
  }
  if (intercept >= 0 && columns.includes(intercept)) coefficients[intercept] -= shift / design.high[intercept][0];
  return { coefficients, factor, active: [...columns].sort((a, b) => a - b), largestInStandardErrors };
}

/**
 * U = R11^-1 (q × q, row-major) of the leading q columns of R (row-major,
 * `width` wide), by back substitution column by column. (R'R)^-1 = U U', so
 * the squared row norms of U are the unscaled variances in the factor's basis.
 */
export function inverseUpper(r: Float64Array, width: number, q: number): Float64Array {
  const u = new Float64Array(q * q);
  for (let col = 0; col < q; col++) {
    u[col * q + col] = 1 / r[col * width + col];
    for (let i = col - 1; i >= 0; i--) {
      let s = 0;
      for (let m = i + 1; m <= col; m++) s += r[i * width + m] * u[m * q + col];
      u[i * q + col] = -s / r[i * width + i];
    }
  }
  return u;
}
