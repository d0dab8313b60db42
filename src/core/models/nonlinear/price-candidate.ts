// The price of one nonlinear candidate from the request's shape, for the cost
// model: priceNonlinear's worst case (every start run to the iteration cap),
// with the tape's length read from the expression itself (parsing it is
// linear in its at most 2,000 characters). priceNonlinear counts
// floating-point operations; the cost model counts multiply-adds, about half
// as many (DEVELOPERS.md, "Its price").
import type { CandidateContext, CandidateCost } from '../../pricing/candidate-cost.ts';
import { ANSWER_BYTES, FIXED_WORK, NO_COST } from '../../pricing/least-squares-cost.ts';
import type { NonlinearCandidateSpec } from './candidate.ts';
import { namesUsed, parseExpression } from './expression/parse.ts';
import { compileTape } from './expression/tape.ts';
import { priceNonlinear } from './price.ts';
import { DEFAULT_MAX_ITERATIONS } from './solve.ts';
import { CONVERGENCE_RULE, NONLINEAR_CONVENTIONS } from './conventions.ts';
import { LINEARISATION_CAUTION } from './model-result.ts';

/**
 * Words a nonlinear model adds to the answer: its convergence rule and the
 * linearisation caution, and the nonlinear conventions (once per answer,
 * counted with each candidate: an upper bound). Characters × 1.2 for the
 * multi-byte ones (–, ², ε) in UTF-8.
 */
const WORDS_BYTES = Math.ceil(1.2 * (CONVERGENCE_RULE.length + LINEARISATION_CAUTION.message.length + JSON.stringify(NONLINEAR_CONVENTIONS).length));

const FLOPS_PER_MULTIPLY_ADD = 2;
/**
 * Each tape entry is interpreted per row (a dispatch, and for exp, log or a
 * real power a library call) and takes the time of more multiply-adds than
 * priceNonlinear counts for it. Measured by scripts/bench-pricing.ts (CPU
 * time, least of three runs, on a busy shared 2-core machine): with weight 2,
 * a fit run to its 1,000-iteration cap on 10,000 rows (Bennett5's curve) ran
 * at 1.65× the median nanoseconds per estimated multiply-add of all kinds,
 * and NIST Bennett5 (154 rows, 747 iterations) at 1.78×. Weight 4 with the
 * per-iteration overhead below brings both to about the median: the price of
 * a fit that runs to its cap bounds its work. A fit that stops early runs far
 * below its price: the price is the iteration cap's, the worst case.
 */
const TAPE_ENTRY_WEIGHT = 4;
/** Predictions evaluate the tape once per row; not re-measured, so they keep the weight the first calibration gave. */
const PREDICTION_TAPE_WEIGHT = 2;
/**
 * Work of one Levenberg–Marquardt iteration that does not grow with rows (the
 * search for the trust region's λ, the pivoted QR's set-up, short-lived
 * arrays), in multiply-adds: about 25 µs of CPU per iteration, measured on
 * NIST MGH10 (16 rows, where it is nearly all of an iteration) and as the
 * part of Bennett5's iterations that its 154 rows do not explain; 8,000
 * multiply-adds at the median rate of about 3 ns.
 */
export const ITERATION_OVERHEAD = 8_000;

function tapeEntries(spec: NonlinearCandidateSpec, parameters: string[]): number {
  const parsed = parseExpression(spec.expression);
  // An expression that does not parse is refused before it runs; its length bounds its tape.
  if ('failure' in parsed) return Math.max(1, spec.expression.length);
  const columns = [...namesUsed(parsed.tree).keys()].filter((name) => !parameters.includes(name));
  return compileTape(parsed.tree, parameters, columns).ops.length;
}

export function priceNonlinearCandidate(spec: NonlinearCandidateSpec, ctx: CandidateContext): CandidateCost {
  const parameters = Object.keys(spec.start ?? spec.starts?.[0] ?? {});
  const p = Math.max(1, parameters.length);
  const n = ctx.shape.rows;
  const t = tapeEntries(spec, parameters);
  const starts = spec.starts?.length ?? 1;
  const common = { designColumns: null, widestTerm: null, atLeast: false };
  if (ctx.fromSummary) return { fit: { work: FIXED_WORK.modelFittedHere, heldBytes: 0, passingBytes: 0, resultBytes: ANSWER_BYTES.model }, prediction: NO_COST, ...common };
  const m = ctx.predictionRows;
  return {
    fit: {
      work: FIXED_WORK.modelFittedHere + priceNonlinear({ rows: n, parameters: p, tapeEntries: TAPE_ENTRY_WEIGHT * t, starts }) / FLOPS_PER_MULTIPLY_ADD
        + starts * DEFAULT_MAX_ITERATIONS * ITERATION_OVERHEAD,
      // The Jacobian (n×p), residuals, fitted values, weights and the tape's values per row stay until the answer.
      heldBytes: 8 * n * p + 24 * n + 8 * p * p,
      // Per row and tape entry: values and adjoints in double and double-double while evaluating; the QR's copy of J.
      passingBytes: 32 * n * t + 8 * n * p,
      resultBytes: ANSWER_BYTES.model + WORDS_BYTES + p * ANSWER_BYTES.coefficient + starts * 96,
    },
    prediction: m === 0 ? NO_COST : {
      work: m * (FIXED_WORK.predictionRow + 3 * PREDICTION_TAPE_WEIGHT * t + p * p),
      heldBytes: m * ANSWER_BYTES.prediction,
      passingBytes: 8 * m * (t + p),
      resultBytes: m * ANSWER_BYTES.prediction,
    },
    ...common,
  };
}
