// The price of this kind's candidates from the request's shape alone, in the
// cost model's unit: priceGlm counts floating-point operations of a fit run
// to its iteration cap, so it is divided by GLM_FLOPS_PER_UNIT, set from
// scripts/bench-pricing.ts (see there).
import { designWidth } from '../../pricing/design-width.ts';
import { ANSWER_BYTES, FIXED_WORK, leastSquaresFit, leastSquaresPrediction, NO_COST } from '../../pricing/least-squares-cost.ts';
import { scoredElsewhere, type CandidateContext, type CandidateCost } from '../../pricing/candidate-cost.ts';
import type { FittedMeansCandidateInput, GlmCandidateInput } from './candidate.ts';
import { priceGlm, priceGlmAfterRanking } from './pricing.ts';

/**
 * priceGlm's floating-point operations per unit of the cost model. Two per
 * multiply-add, times the ratio scripts/bench-pricing.ts measured: at 2, a
 * logistic and a Poisson fit of 100,000 × 31 took 0.58 and 0.46 ns per unit
 * against a median of 11.5 for the other kinds (a busy shared machine), the
 * unit being a calibrated multiply-add rather than a bare one. At 20 a typical
 * fit (5 to 7 weighted solves) sits near half the median rate, so a fit that
 * runs to its 25-solve cap costs at most about twice its priced time.
 */
export const GLM_FLOPS_PER_UNIT = 20;

export function priceGlmCandidate(c: GlmCandidateInput, ctx: CandidateContext): CandidateCost {
  const width = designWidth(ctx.shape, c.terms, c.intercept, ctx.maxDesignColumns);
  const p = width.columns;
  const n = ctx.shape.rows;
  const widest = Math.max(0, ...width.perTerm);
  const common = { designColumns: p, widestTerm: widest > 1 ? width.perTerm.indexOf(widest) : null, atLeast: width.atLeast };
  const work = priceGlm({ rows: n, columns: p, family: c.family, link: c.link }) / GLM_FLOPS_PER_UNIT;
  // The checks after the ranking run least squares' machinery on the weighted design (the geometry for leverages and
  // Cook's distance, the VIFs' factorisation), priced as there. Measured at about 15% of the time of a 6-step Poisson
  // fit of 100,000 × 31 (one run on a busy machine); priced at about 27% of that fit's price (capped at 25 steps).
  const checks = leastSquaresFit(n, p, true).work - leastSquaresFit(n, p, false).work;
  const m = ctx.predictionRows;
  return {
    fit: {
      work: FIXED_WORK.modelFittedHere + work + checks,
      // Held until the answer: the design, response, prior weights, offset, μ, η, IRLS weights and the p×p covariance.
      heldBytes: 8 * n * p + 56 * n + 8 * p * p,
      // While it runs: the weighted copy of the design and its QR, plus the least-squares solve's double-double copy.
      passingBytes: 32 * n * p,
      resultBytes: ANSWER_BYTES.model + p * ANSWER_BYTES.coefficient,
    },
    // As least squares: a design over data and new rows (factors coded alike), then a p² quadratic form and the inverse link per row.
    prediction: m === 0 ? NO_COST : {
      work: leastSquaresPrediction(n, p, m).work + (priceGlmAfterRanking({ rows: 0, columns: p, predictionRows: m }) / GLM_FLOPS_PER_UNIT),
      heldBytes: m * ANSWER_BYTES.prediction,
      passingBytes: 32 * (n + m) * p,
      resultBytes: m * ANSWER_BYTES.prediction,
    },
    ...common,
  };
}

/** Means fitted elsewhere: one pass over them (a log-gamma per row for the negative binomial and gamma). */
export const priceFittedMeansCandidate = (c: FittedMeansCandidateInput): CandidateCost => scoredElsewhere(c.fitted.length * 20);
