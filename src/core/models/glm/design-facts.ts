// Facts about a design that every IRLS step reads and that do not change
// with the weights, computed once per design and cached: the intercept
// column, the low parts that are not all zero, and a centre for each column.
import type { DesignMatrix } from '../../types.ts';

export interface DesignFacts {
  /** Index of the intercept (a nonzero constant column the design marks as such), or -1. */
  intercept: number;
  /** The low parts, null where all zero (plain columns and dummies), so the row loops skip them. */
  low: (Float64Array | null)[];
  /**
   * The plain mean of each column (0 for the intercept, and all 0 without
   * one). Centring against the intercept only has to bring a column near its
   * weighted mean to spare the QR the cancellation of a large offset (a
   * column of years or kelvins); the plain mean does that for every set of
   * IRLS weights, so it is computed once rather than at every step.
   */
  centre: Float64Array;
}

const CACHE = new WeakMap<DesignMatrix, DesignFacts>();

function findIntercept(design: DesignMatrix): number {
  if (!design.intercept) return -1;
  const j = design.termOfColumn.indexOf(-1);
  if (j < 0 || design.rows === 0) return -1;
  const c = design.high[j][0];
  if (!(c !== 0 && Number.isFinite(c))) return -1;
  for (let i = 0; i < design.rows; i++) if (design.high[j][i] !== c || design.low[j][i] !== 0) return -1;
  return j;
}

export function designFacts(design: DesignMatrix): DesignFacts {
  let facts = CACHE.get(design);
  if (facts) return facts;
  const intercept = findIntercept(design);
  const low = design.low.map((l) => (l.some((v) => v !== 0) ? l : null));
  const centre = new Float64Array(design.labels.length);
  if (intercept >= 0) {
    for (let j = 0; j < centre.length; j++) {
      if (j === intercept) continue;
      const h = design.high[j];
      const l = low[j];
      let s = 0;
      for (let i = 0; i < design.rows; i++) s += l ? h[i] + l[i] : h[i];
      centre[j] = s / design.rows;
    }
  }
  facts = { intercept, low, centre };
  CACHE.set(design, facts);
  return facts;
}

/** Index of the intercept column, or -1. */
export function interceptColumn(design: DesignMatrix): number {
  return designFacts(design).intercept;
}
