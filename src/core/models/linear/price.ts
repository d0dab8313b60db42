// The price of a candidate fitted here by least squares, from the request's
// shape alone: its design's width (level counts stop just past the cap), the
// QR fit on the rows or the sweep of a summary, and its predictions.
import { designWidth } from '../../pricing/design-width.ts';
import { leastSquaresFit, leastSquaresFromSummary, leastSquaresPrediction, NO_COST } from '../../pricing/least-squares-cost.ts';
import type { CandidateContext, CandidateCost } from '../../pricing/candidate-cost.ts';
import type { FittedCandidateInput } from './fitted-model.ts';

export function priceLeastSquaresCandidate(c: FittedCandidateInput, ctx: CandidateContext): CandidateCost {
  const width = designWidth(ctx.shape, c.terms, c.intercept, ctx.maxDesignColumns);
  const p = width.columns;
  const n = ctx.shape.rows;
  // Worth pointing at only when one term makes several columns (a factor, a product of factors).
  const widest = Math.max(0, ...width.perTerm);
  const widestTerm = widest > 1 ? width.perTerm.indexOf(widest) : null;
  const common = { designColumns: p, widestTerm, atLeast: width.atLeast };
  if (ctx.fromSummary) return { fit: leastSquaresFromSummary(p), prediction: NO_COST, ...common };
  return { fit: leastSquaresFit(n, p), prediction: leastSquaresPrediction(n, p, ctx.predictionRows), ...common };
}
