// The registry's price of a nonlinear candidate: priceNonlinear's worst case
// in multiply-adds (half its operation count, DEVELOPERS.md) with the tape's
// length read from the expression, growing with rows and starts; nothing to
// fit from a summary; and an answer-size estimate that bounds the measured
// JSON of a real comparison from above, within a factor of four.
import t from 'tap';
import type { CandidateInput } from '../../../../src/core/compare.ts';
import { CANDIDATE_PRICES } from '../../../../src/core/pricing/index.ts';
import { shapeOfColumns } from '../../../../src/core/pricing/data-shape.ts';
import { DEFAULT_POLICY } from '../../../../src/core/scoring/policy.ts';
import { FIXED_WORK } from '../../../../src/core/pricing/least-squares-cost.ts';
import { answerSizeBounds } from '../../pricing/answer-size.ts';
import { ITERATION_OVERHEAD } from '../../../../src/core/models/nonlinear/price-candidate.ts';
import { DEFAULT_MAX_ITERATIONS } from '../../../../src/core/models/nonlinear/solve.ts';

// Kiln drying of our own making: moisture = 6 + 36 e^(−0.045 h) plus a deterministic wobble.
const hours = Array.from({ length: 60 }, (_, i) => (96 * i) / 59);
const moisture = hours.map((h, i) => 6 + 36 * Math.exp(-0.045 * h) + 0.4 * Math.sin(3.7 * i));
const columns = { hours, moisture };
const equilibrium = { form: 'expression' as const, name: 'equilibrium', expression: 'eq + (m0 - eq)*exp(-k*hours)', start: { eq: 5, m0: 40, k: 0.03 } };
const ctx = (rows: number, predictionRows = 0, fromSummary = false) => ({
  shape: shapeOfColumns({ hours: hours.slice(0, 1), moisture: moisture.slice(0, 1), pad: new Array(rows).fill(0) }),
  fromSummary, predictionRows, maxDesignColumns: 2000,
});

t.test('work grows with rows and starts; a summary prices no fit', async (t) => {
  const price = CANDIDATE_PRICES.expression;
  // The bookkeeping of every iteration a start may take, whatever the rows (price-candidate.ts, measured).
  const overhead = DEFAULT_MAX_ITERATIONS * ITERATION_OVERHEAD;
  const one = price(equilibrium, ctx(1000)).fit.work - FIXED_WORK.modelFittedHere;
  const twice = price(equilibrium, ctx(2000)).fit.work - FIXED_WORK.modelFittedHere;
  t.ok(twice - overhead > 1.9 * (one - overhead) && twice - overhead <= 2 * (one - overhead), 'about linear in rows past the per-iteration overhead (the covariance is per fit)');
  t.ok(price(equilibrium, ctx(10)).fit.work - FIXED_WORK.modelFittedHere > overhead, 'a few rows still pay for every iteration\'s bookkeeping');
  const starts = price({ ...equilibrium, start: undefined, starts: [equilibrium.start, equilibrium.start] }, ctx(1000)).fit.work - FIXED_WORK.modelFittedHere;
  t.ok(starts > 1.9 * one && starts <= 2 * one, 'about linear in starts');
  const longer = price({ ...equilibrium, expression: 'eq + (m0 - eq)*exp(-k*hours) + 0*sin(k*hours)*cos(k*hours)' }, ctx(1000)).fit.work;
  t.ok(longer > one + FIXED_WORK.modelFittedHere, 'a longer tape costs more');
  t.equal(price(equilibrium, ctx(1000, 0, true)).fit.work, FIXED_WORK.modelFittedHere, 'from a summary it is refused, not fitted');
  t.equal(price(equilibrium, ctx(1000)).designColumns, null, 'no design, so the design-column cap does not apply');
  t.ok(price(equilibrium, ctx(1000, 10)).prediction.work > 0);
});

t.test('the answer-size estimate bounds the measured JSON from above, within 4×', async (t) => {
  const shapes: [string, CandidateInput[], number][] = [
    ['one nonlinear model', [equilibrium], 0],
    ['nonlinear with two starts beside a quadratic, 200 predictions', [
      { ...equilibrium, start: undefined, starts: [equilibrium.start, { eq: 0, m0: 50, k: 0.1 }] },
      { form: 'fit', name: 'quadratic', terms: ['hours', { kind: 'power', of: 'hours', degree: 2 }], intercept: true },
    ], 200],
  ];
  for (const [name, candidates, m] of shapes) {
    answerSizeBounds(t, name, {
      columns, response: 'moisture', weights: null, candidates, policy: DEFAULT_POLICY, policyHash: 'h',
      extras: m ? { predict: { columns: { hours: Array.from({ length: m }, (_, i) => i / 2) } } } : undefined,
    });
  }
});
