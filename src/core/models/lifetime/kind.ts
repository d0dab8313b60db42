// The lifetime kind's entry in the registry of candidate kinds: each
// candidate's location design on the comparison's rows (built as for least
// squares, always with an intercept), its maximum-likelihood fit on the
// censored response, and its price.
import { buildDesign } from '../../design/index.ts';
import { issue, type Issue } from '../../issues.ts';
import type { Columns, DesignMatrix } from '../../types.ts';
import { designWidth } from '../../pricing/design-width.ts';
import { ANSWER_BYTES, FIXED_WORK, NO_COST } from '../../pricing/least-squares-cost.ts';
import type { CandidateContext, CandidateCost } from '../../pricing/candidate-cost.ts';
import { scoredModel, type ScoredModel } from '../scored-model.ts';
import type { CensoredResponse } from './censoring.ts';
import { fitLifetime } from './fit-lifetime.ts';
import { nestingCandidateOf } from './nested.ts';
import { priceLifePredictions, priceLifetime } from './pricing.ts';
import { lifetimeReport } from './report.ts';
import { lifePredictions } from './life-predictions.ts';
import { lifeCurve } from './life-picture.ts';
import type { Caution } from '../../scoring/cautions.ts';
import type { LifetimeCandidateInput } from './candidate.ts';

export interface LifetimeSample {
  columns: Columns | null;
  rows: readonly number[] | null;
  /** The response and its censoring on the comparison's rows (every row exact without `censoring`). */
  censored: CensoredResponse | null;
  percentiles?: readonly number[];
  /** options.survivalAt: times at which to give survival probabilities. */
  survivalAt?: readonly number[];
  /** Whether the request sends options.predict rows (where a model with terms gives its percentiles). */
  predicting?: boolean;
  intervalLevel: number | undefined;
}

/**
 * With terms, a percentile or a survival probability depends on the row:
 * the model-level lists stay null and this caution says why and where the
 * values are (never a silent null).
 */
function valuesByRowCaution(sample: LifetimeSample, design: DesignMatrix): Caution[] {
  const asked = (sample.percentiles?.length ?? 0) + (sample.survivalAt?.length ?? 0) > 0;
  if (!asked || design.labels.length <= 1) return [];
  const where = sample.predicting
    ? 'they are given for each options.predict row in lifePredictions'
    : 'send the rows at which to compute them in options.predict';
  return [{
    code: 'life_values_depend_on_row',
    message: `This model has terms, so its percentiles and survival probabilities depend on the row: percentiles and survival here are null; ${where}.`,
  }];
}

/** Every candidate's design first, so one answer names every bad term; then the fits. */
export function scoreLifetimeCandidates(
  candidates: ReadonlyMap<number, LifetimeCandidateInput>,
  sample: LifetimeSample,
  issues: Issue[],
): Map<number, ScoredModel> {
  const scored = new Map<number, ScoredModel>();
  const { columns, rows, censored } = sample;
  if (!columns || !rows || !censored) return scored;
  const designs = new Map<number, DesignMatrix>();
  candidates.forEach((c, i) => {
    const built = buildDesign(columns, c.terms, true, rows, ['candidates', i]);
    if ('issues' in built) {
      issues.push(...built.issues);
      return;
    }
    const p = built.design.labels.length;
    if (p >= rows.length) issues.push(issue('too_few_rows', ['candidates', i], { rows: rows.length, parameters: p + 1 }));
    designs.set(i, built.design);
  });
  if (issues.length > 0) return scored;
  const options = { percentiles: sample.percentiles, survivalAt: sample.survivalAt, intervalLevel: sample.intervalLevel };
  for (const [i, design] of designs) {
    const c = candidates.get(i)!;
    const fit = fitLifetime({ name: c.name, distribution: c.distribution, design }, censored, options, ['candidates', i]);
    if ('issues' in fit) issues.push(...fit.issues);
    // Every lifetime likelihood is a density of a continuous time (or the probability of a censored range of it).
    else {
      const report = lifetimeReport(fit);
      report.cautions.push(...valuesByRowCaution(sample, design));
      scored.set(i, scoredModel(report, fit.measure, {
        lifetimeNesting: (id) => nestingCandidateOf(fit, design, id),
        lifeCurve: (times) => lifeCurve(fit, design.labels.length > 1, times),
        lifePredict: (at) => lifePredictions(fit, design, c.terms, i, {
          ...at, percentiles: sample.percentiles, survivalAt: sample.survivalAt,
        }),
      }));
    }
  }
  return scored;
}

/**
 * priceLifetime counts floating-point operations; the cost model counts
 * multiply-adds, about two operations each (DEVELOPERS.md), hence the half.
 * The censoring of the rows is not known from the shape, so the dearer
 * bound (every row censored) is paid for the gamma.
 */
const OPERATIONS_PER_MULTIPLY_ADD = 2;

export function priceLifetimeCandidate(c: LifetimeCandidateInput, ctx: CandidateContext): CandidateCost {
  const width = designWidth(ctx.shape, c.terms, true, ctx.maxDesignColumns);
  const p = width.columns;
  const n = ctx.shape.rows;
  const widest = Math.max(0, ...width.perTerm);
  const common = { designColumns: p, widestTerm: widest > 1 ? width.perTerm.indexOf(widest) : null, atLeast: width.atLeast };
  if (ctx.fromSummary) return { fit: { ...NO_COST, work: FIXED_WORK.modelFittedHere }, prediction: NO_COST, ...common };
  const m = p + 1;
  return {
    fit: {
      work: FIXED_WORK.modelFittedHere + priceLifetime({ rows: n, designColumns: p, distribution: c.distribution }) / OPERATIONS_PER_MULTIPLY_ADD,
      // The design (high and low parts), the response's bounds and status, the
      // standardised columns and per-row contributions (value, two derivatives).
      heldBytes: 16 * n * p + 17 * n + 8 * m * m,
      passingBytes: 8 * n * p + 24 * n,
      resultBytes: ANSWER_BYTES.model + m * ANSWER_BYTES.coefficient,
    },
    // Values at new rows (life-predictions.ts); the rows' own price is the comparison's.
    prediction: ctx.predictionRows === 0 ? NO_COST : {
      work: priceLifePredictions({ rows: n, designColumns: p, predictionRows: ctx.predictionRows, valuesPerRow: ctx.lifeValuesPerRow ?? 1, distribution: c.distribution }) / OPERATIONS_PER_MULTIPLY_ADD,
      heldBytes: 16 * (n + ctx.predictionRows) * p,
      passingBytes: 0,
      resultBytes: ctx.predictionRows * (ANSWER_BYTES.prediction + (ctx.lifeValuesPerRow ?? 1) * ANSWER_BYTES.coefficient),
    },
    ...common,
  };
}
