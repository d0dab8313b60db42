// The price of a comparison: the data pass, each candidate by its kind's own
// price (candidate-prices.ts), the predictions of every model at the new
// rows, and what the whole comparison adds (rankings under every criterion,
// nested tests between fitted pairs, model averaging).
import { averagedBoundsCost } from '../comparison/extras/prediction-cost.ts';
import type { ComparisonInput } from '../comparison/compare.ts';
import type { DataSummary } from '../summary/types.ts';
import { NO_DATA, shapeOfColumns, shapeOfSummary, type DataShape } from './data-shape.ts';
import { candidatePath, priceCandidate } from './candidate-prices.ts';
import { ANSWER_BYTES, FIXED_WORK } from './least-squares-cost.ts';
import { totalPrice, type PricePart, type RequestPrice } from './types.ts';
import { LIFE_PICTURE_BUDGET, lifePictureWork } from '../comparison/life-picture-budget.ts';

/** Rankings: the five criteria and leave-one-out, one entry per model each. */
const RANKINGS = 6;
/** A nested test: the key comparison and two upper-tail p-values (incomplete beta and gamma), measured like FIXED_WORK. */
const NESTED_TEST_WORK = 20_000;

const CANDIDATE_REMEDY =
  'Send fewer candidates or terms, merge factor levels or drop products of factors, or send a data summary (data.summary) instead of rows';

function predictionRows(input: ComparisonInput): number {
  const columns = input.extras?.predict?.columns;
  if (!columns) return 0;
  let rows = 0;
  for (const values of Object.values(columns)) rows = Math.max(rows, values.length);
  return rows;
}

function dataPart(shape: DataShape, input: ComparisonInput, summary: DataSummary | null): PricePart {
  const base = { what: 'reading the data', path: ['data'], resultBytes: ANSWER_BYTES.base, designColumns: null, remedy: 'Send fewer rows' };
  if (summary) {
    // Symmetry and semidefiniteness of a c×c summary: an elimination, c³/3.
    const c = summary.columns.length;
    return { ...base, work: (c * c * c) / 3 + c * c, heldBytes: 8 * c * c, passingBytes: 8 * c * c };
  }
  // Common rows, response, weights and fingerprint: a few passes over the used columns.
  const used = input.columns ? Object.keys(input.columns).length : 0;
  return { ...base, work: 4 * shape.rows * (used + 2), heldBytes: 24 * shape.rows, passingBytes: 0 };
}

/**
 * The life-data picture a comparison with life models stores: Turnbull's
 * estimate is paid for only when the status column holds a left or interval
 * row (read, not copied: a pass over a column the request already holds).
 * Above its budget (comparison/life-picture-budget.ts) it is not drawn, so not priced.
 */
function lifePicturePart(input: ComparisonInput, shape: DataShape, summary: DataSummary | null): PricePart | null {
  if (summary) return null;
  const life = input.candidates.filter((c) => c.form === 'lifetime');
  const work = lifePictureWork(input, shape.rows);
  // Over its budget the picture is left out (with a caution), never the reason for a refusal.
  if (work === null || work > LIFE_PICTURE_BUDGET) return null;
  return {
    what: `the life-data picture (the nonparametric estimate and ${life.length} fitted curves)`,
    path: ['candidates'],
    work,
    heldBytes: 40 * shape.rows,
    passingBytes: 0,
    // Bounded by the thinning: at most 1/PICTURE_RISE steps, 200 marks, 81 points per curve.
    resultBytes: 60_000 + life.length * 2_000,
    designColumns: null,
    remedy: 'Send fewer rows or fewer life candidates',
  };
}

export function priceComparison(input: ComparisonInput, summary: DataSummary | null, maxDesignColumns: number): RequestPrice {
  const shape = summary ? shapeOfSummary(summary) : input.columns ? shapeOfColumns(input.columns) : NO_DATA;
  const m = summary ? 0 : predictionRows(input);
  const ctx = {
    shape, fromSummary: summary !== null, predictionRows: m, maxDesignColumns,
    lifeValuesPerRow: 1 + (input.percentiles?.length ?? 0) + (input.survivalAt?.length ?? 0),
  };
  const parts: PricePart[] = [dataPart(shape, input, summary)];
  const prediction = { work: 0, heldBytes: 0, passingBytes: 0, resultBytes: 0 };
  let fitted = 0;
  let coefficients = 0;
  input.candidates.forEach((candidate, i) => {
    const cost = priceCandidate(candidate, ctx);
    const path = candidatePath(i);
    parts.push({
      what: `candidate ${i} (${JSON.stringify(candidate.name)}${cost.designColumns === null ? '' : `, ${cost.atLeast ? 'more than ' : ''}${cost.designColumns} design columns on ${shape.rows} rows`})`,
      path: cost.widestTerm === null ? path : [...path, 'terms', cost.widestTerm],
      ...cost.fit,
      designColumns: cost.designColumns,
      remedy: CANDIDATE_REMEDY,
    });
    if (cost.designColumns !== null) {
      fitted++;
      coefficients += cost.designColumns;
    }
    prediction.work += cost.prediction.work;
    prediction.heldBytes += cost.prediction.heldBytes;
    prediction.passingBytes = Math.max(prediction.passingBytes, cost.prediction.passingBytes);
    prediction.resultBytes += cost.prediction.resultBytes;
  });
  if (m > 0) {
    parts.push({
      what: `predictions at ${m} new rows from ${fitted} fitted models and their average`,
      path: ['options', 'predict', 'columns'],
      ...prediction,
      // The average's predictions: one more row object per new row, over every model, and its
      // tail-area bounds (Newton on the mixture's distribution function: the dominant cost).
      work: prediction.work + m * (FIXED_WORK.predictionRow + fitted) + averagedBoundsCost(m, fitted),
      resultBytes: prediction.resultBytes + m * ANSWER_BYTES.prediction,
      designColumns: null,
      remedy: 'Predict at fewer new rows (options.predict.columns), or from fewer candidates',
    });
  }
  const picture = lifePicturePart(input, shape, summary);
  if (picture) parts.push(picture);
  const models = input.candidates.length;
  const pairs = (fitted * (fitted - 1)) / 2 + (input.extras?.tests?.length ?? 0);
  parts.push({
    what: `rankings, nested tests and averaging over ${models} models`,
    path: ['candidates'],
    work: models * RANKINGS * Math.log2(models + 1) + pairs * NESTED_TEST_WORK + coefficients * models,
    heldBytes: 0,
    passingBytes: 0,
    resultBytes: models * RANKINGS * ANSWER_BYTES.rankingEntry + pairs * ANSWER_BYTES.nestedTest + coefficients * ANSWER_BYTES.averagedTerm,
    designColumns: null,
    remedy: 'Send fewer candidates',
  });
  const price = totalPrice(parts);
  // The answer is checked number by number against its schema and measured before it is recorded.
  parts[0].work += FIXED_WORK.answerByte * price.resultBytes;
  return totalPrice(parts);
}
