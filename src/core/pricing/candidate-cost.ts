// What pricing one candidate yields, and what it is priced from: the shape of
// the request. Each kind of model prices its own candidates (its entry in
// src/core/models/registry.ts) in these terms.
import type { DataShape } from './data-shape.ts';
import { ANSWER_BYTES, FIXED_WORK, NO_COST, type Cost } from './least-squares-cost.ts';

export interface CandidateContext {
  shape: DataShape;
  /** The data came as a summary (data.summary): no rows to fit or predict on. */
  fromSummary: boolean;
  /** New rows to predict at (options.predict), 0 when none. */
  predictionRows: number;
  /** Values a life model gives at each new row: the median, options.percentiles and options.survivalAt (1 when absent). */
  lifeValuesPerRow?: number;
  /** The design-column cap: level counts stop just past it. */
  maxDesignColumns: number;
}

export interface CandidateCost {
  fit: Cost;
  /** Predictions at the new rows (NO_COST for a candidate that cannot predict). */
  prediction: Cost;
  /** Design columns of the model fitted here; null for candidates fitted elsewhere. */
  designColumns: number | null;
  /** The term that makes the design widest, when the width comes from the terms. */
  widestTerm: number | null;
  /** designColumns is a lower bound (a level count stopped past the cap). */
  atLeast: boolean;
}

/** A model fitted elsewhere is scored from its figures: a pass over its residuals at most. */
export function scoredElsewhere(values: number): CandidateCost {
  return {
    fit: { work: FIXED_WORK.modelFittedElsewhere + values, heldBytes: 8 * values, passingBytes: 0, resultBytes: ANSWER_BYTES.model },
    prediction: NO_COST,
    designColumns: null,
    widestTerm: null,
    atLeast: false,
  };
}

