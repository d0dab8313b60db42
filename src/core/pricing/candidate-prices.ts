// Each kind of candidate prices itself from the request's shape: one entry
// per candidate form, keyed like CandidateInput['form']. A new kind of model
// (a generalised linear, nonlinear or lifetime fit) adds its entry here — its
// fit's work (an iterative fit: iterations × its per-iteration cost), the
// memory it keeps, its share of the answer, and what predictions from it
// cost — and TypeScript refuses a form without one.
import type { CandidateInput } from '../comparison/compare.ts';
import type { IssuePath } from '../issues.ts';
import type { DataShape } from './data-shape.ts';
import { designWidth } from './design-width.ts';
import { ANSWER_BYTES, FIXED_WORK, leastSquaresFit, leastSquaresFromSummary, leastSquaresPrediction, NO_COST, type Cost } from './least-squares-cost.ts';

export interface CandidateContext {
  shape: DataShape;
  /** The data came as a summary (data.summary): no rows to fit or predict on. */
  fromSummary: boolean;
  /** New rows to predict at (options.predict), 0 when none. */
  predictionRows: number;
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

type OfForm<F extends CandidateInput['form']> = Extract<CandidateInput, { form: F }>;
export type CandidatePricer<F extends CandidateInput['form']> = (candidate: OfForm<F>, ctx: CandidateContext) => CandidateCost;

/** A model fitted elsewhere is scored from its figures: a pass over its residuals at most. */
function scoredElsewhere(values: number): CandidateCost {
  return {
    fit: { work: FIXED_WORK.modelFittedElsewhere + values, heldBytes: 8 * values, passingBytes: 0, resultBytes: ANSWER_BYTES.model },
    prediction: NO_COST,
    designColumns: null,
    widestTerm: null,
    atLeast: false,
  };
}

export const CANDIDATE_PRICES: { [F in CandidateInput['form']]: CandidatePricer<F> } = {
  fit: (c, ctx) => {
    const width = designWidth(ctx.shape, c.terms, c.intercept, ctx.maxDesignColumns);
    const p = width.columns;
    const n = ctx.shape.rows;
    // Worth pointing at only when one term makes several columns (a factor, a product of factors).
    const widest = Math.max(0, ...width.perTerm);
    const widestTerm = widest > 1 ? width.perTerm.indexOf(widest) : null;
    const common = { designColumns: p, widestTerm, atLeast: width.atLeast };
    if (ctx.fromSummary) return { fit: leastSquaresFromSummary(p), prediction: NO_COST, ...common };
    return { fit: leastSquaresFit(n, p), prediction: leastSquaresPrediction(n, p, ctx.predictionRows), ...common };
  },
  residuals: (c) => scoredElsewhere(c.residuals.length),
  rss: () => scoredElsewhere(1),
  logLikelihood: () => scoredElsewhere(1),
};

export function priceCandidate(candidate: CandidateInput, ctx: CandidateContext): CandidateCost {
  const pricer = CANDIDATE_PRICES[candidate.form] as CandidatePricer<CandidateInput['form']>;
  return pricer(candidate, ctx);
}

/** Where a candidate sits in a comparison request. */
export const candidatePath = (index: number): IssuePath => ['candidates', index];
