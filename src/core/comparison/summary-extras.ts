// What a comparison from a data summary can add after the ranking without the
// rows: predictions with their intervals (the summary's inverse cross
// products suffice) and model averaging of coefficients and predictions.
// Leave-one-out, nested tests and residual checks need the rows.
import { columnKey, INTERCEPT_IDENTITY } from '../design/column-identity.ts';
import { issue, type Issue } from '../issues.ts';
import { predictionWithIntervals, type ScaledPrediction } from '../inference/prediction-intervals.ts';
import { twoSidedCritical } from '../inference/coefficient-tests.ts';
import { responseScale } from '../inference/back-transform.ts';
import type { RankingCriterion } from '../scoring/criteria.ts';
import type { SummaryFit } from '../summary/index.ts';
import { predictFromSummary } from '../summary/summary-predict.ts';
import type { ModelResult } from '../models/model-result.ts';
import type { BandedEntry } from '../scoring/rankings.ts';
import type { PredictionColumns } from './extras/prediction-rows.ts';
import { averagedModels, type AveragedResult } from './extras/averaging.ts';

export interface SummaryFitted {
  result: ModelResult;
  fit: SummaryFit;
  predictors: string[];
  intercept: boolean;
}

const at = (column: string, row?: number) => ['options', 'predict', 'columns', column, ...(row === undefined ? [] : [row])];

/** The prediction rows: every predictor a fitted candidate uses, numbers, no gaps, one length. */
function checkSummaryPredictionRows(predictors: readonly string[], predict: PredictionColumns): { count: number } | { issues: Issue[] } {
  const issues: Issue[] = [];
  let count: number | null = null;
  const sent = Object.keys(predict);
  for (const name of predictors) {
    if (!Object.prototype.hasOwnProperty.call(predict, name)) {
      issues.push(issue('prediction_column_missing', ['options', 'predict', 'columns'], { column: name, sent: sent.slice(0, 20) }));
      continue;
    }
    const values = predict[name];
    if (count === null) count = values.length;
    else if (values.length !== count) issues.push(issue('column_length_mismatch', at(name), { column: name, length: values.length, expected: count }));
    values.forEach((v, r) => {
      if (v === null) issues.push(issue('value_missing', at(name, r), { column: name, row: r, predictionRow: true }));
      else if (typeof v !== 'number') issues.push(issue('column_mixed_types', at(name, r), { column: name, row: r }));
    });
  }
  return issues.length > 0 ? { issues: issues.slice(0, 50) } : { count: count ?? 0 };
}

export function summaryExtras(input: {
  fitted: readonly SummaryFitted[];
  models: ModelResult[];
  ranking: readonly BandedEntry[];
  criterion: RankingCriterion;
  over: 'all' | 'confidenceSet';
  predict: PredictionColumns | undefined;
  intervalLevel: number;
}): { averaged: AveragedResult | null } | { issues: Issue[] } {
  const predictions = new Map<string, ScaledPrediction[]>();
  if (input.predict) {
    const used = [...new Set(input.fitted.flatMap((f) => f.predictors))];
    const checked = checkSummaryPredictionRows(used, input.predict);
    if ('issues' in checked) return checked;
    for (const f of input.fitted) {
      const scaled = predictFromSummary(f.fit, f.predictors, f.intercept, input.predict, checked.count);
      const critical = twoSidedCritical(input.intervalLevel, f.fit.observations - f.fit.rank);
      f.result.predictions = scaled.map((p) => predictionWithIntervals(p, critical));
      f.result.predictionScale = { backTransform: 'none', description: responseScale(null).description };
      if (scaled.some((p) => p.location === null)) {
        f.result.cautions.push({
          code: 'prediction-not-estimable',
          message: `Some predictors of this model are aliased (${f.fit.aliased.map((a) => JSON.stringify(a)).join(', ')}), so it cannot say what the response would be at new rows: its predictions are null.`,
        });
      }
      predictions.set(f.result.name, scaled);
    }
  }
  // A summary's columns are plain columns, so their identities are their names.
  const keys = new Map(input.fitted.map((f) => [
    f.result.name,
    [...(f.intercept ? [columnKey(INTERCEPT_IDENTITY)] : []), ...f.predictors.map((p) => columnKey(['column', p]))],
  ]));
  const averaged = input.ranking.some((e) => e.weight !== null)
    ? averagedModels({ models: input.models, ranking: input.ranking, criterion: input.criterion, over: input.over, predictions, keys, intervalLevel: input.intervalLevel })
    : null;
  return { averaged };
}
