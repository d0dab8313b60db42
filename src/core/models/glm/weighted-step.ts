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
import { rowScaleOf, scaledColumns, streamedR, weightedMeans, type ScaledColumns } from '../../inference/streamed-qr.ts';

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

/** Index of the intercept: a nonzero constant column the design marks as such; -1 without one. */
export function interceptColumn(design: DesignMatrix): number {
  if (!design.intercept) return -1;
  const j = design.termOfColumn.indexOf(-1);
  if (j < 0 || design.rows === 0) return -1;
  const c = design.high[j][0];
  if (!(c !== 0 && Number.isFinite(c))) return -1;
  for (let i = 0; i < design.rows; i++) if (design.high[j][i] !== c || design.low[j][i] !== 0) return -1;
  return j;
}

const EXACT_COLUMNS = new WeakMap<DesignMatrix, (Float64Array | null)[]>();

/**
 * The design's low parts, with null for a column whose low part is all zero
 * (plain columns and dummies): the row loops then skip reading it. Cached per
 * design, since IRLS reads them at every step.
 */
export function lowParts(design: DesignMatrix): (Float64Array | null)[] {
  let parts = EXACT_COLUMNS.get(design);
  if (!parts) {
    parts = design.low.map((l) => (l.some((v) => v !== 0) ? l : null));
    EXACT_COLUMNS.set(design, parts);
  }
  return parts;
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
  const intercept = interceptColumn(design);
  const order = active.includes(intercept) ? [intercept, ...active.filter((j) => j !== intercept)] : [...active];
  const rowScale = rowScaleOf(weights, n)!;
  const high = [...order.map((j) => design.high[j]), rhs];
  const lows = lowParts(design);
  const low = [...order.map((j) => lows[j]), null];
  let centre: Float64Array | null = null;
  let weightTotal = 0;
  if (order[0] === intercept && intercept >= 0) {
    centre = weightedMeans(high, low, rowScale, n);
    centre[0] = 0;
    centre[order.length] = 0;
    for (let i = 0; i < n; i++) weightTotal += rowScale[i] * rowScale[i];
  }
  let v = scaledColumns(high, low, rowScale, n, centre);
  // Aliased by the intercept: Σw x² = Σw (x - m)² + (Σw) m² for the weighted mean m.
  let positions = order.map((_, k) => k).filter((k) => {
    if (!(v.scale[k] > 0)) return false;
    if (!centre || k === 0) return true;
    const raw = Math.sqrt(v.scale[k] * v.scale[k] + weightTotal * centre[k] * centre[k]);
    return v.scale[k] > tolerance * raw;
  });
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
