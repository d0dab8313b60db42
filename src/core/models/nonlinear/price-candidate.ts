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
 * priceNonlinear counts for it. Measured by scripts/bench-pricing.ts on a busy
 * shared machine: a warm fit of NIST Bennett5 (747 of its 1,000 allowed
 * iterations, a real power per row) ran at 1.5 to 5 times the median
 * nanoseconds per estimated multiply-add unweighted; twice the weight brings
 * it to about the other kinds' rate. A fit that stops early runs far below
 * its price: the price is the iteration cap's, the worst case.
 */
const TAPE_ENTRY_WEIGHT = 2;

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
      work: FIXED_WORK.modelFittedHere + priceNonlinear({ rows: n, parameters: p, tapeEntries: TAPE_ENTRY_WEIGHT * t, starts }) / FLOPS_PER_MULTIPLY_ADD,
      // The Jacobian (n×p), residuals, fitted values, weights and the tape's values per row stay until the answer.
      heldBytes: 8 * n * p + 24 * n + 8 * p * p,
      // Per row and tape entry: values and adjoints in double and double-double while evaluating; the QR's copy of J.
      passingBytes: 32 * n * t + 8 * n * p,
      resultBytes: ANSWER_BYTES.model + WORDS_BYTES + p * ANSWER_BYTES.coefficient + starts * 96,
    },
    prediction: m === 0 ? NO_COST : {
      work: m * (FIXED_WORK.predictionRow + 3 * TAPE_ENTRY_WEIGHT * t + p * p),
      heldBytes: m * ANSWER_BYTES.prediction,
      passingBytes: 8 * m * (t + p),
      resultBytes: m * ANSWER_BYTES.prediction,
    },
    ...common,
  };
}
