// After the ranking: nested-model tests, leave-one-out error and its ranking,
// assumption checks, predictions and model averaging — the numbers a
// practitioner needs once the criteria have spoken.
import type { NestedTest } from '../../inference/nested.ts';
import { testNestingOffers } from '../../inference/nesting-offers.ts';
import { rankByLeaveOneOut } from '../../loo.ts';
import { issue, type Issue } from '../../issues.ts';
import type { CriterionName, RankingCriterion } from '../../scoring/criteria.ts';
import type { RankingEntry } from '../../scoring/ranking.ts';
import type { Columns } from '../../types.ts';
import type { ModelResult } from '../../models/model-result.ts';
import type { BandedEntry } from '../../scoring/rankings.ts';
import { checkPredictionRows, type PredictionColumns } from './prediction-rows.ts';
import type { ScoredModel } from '../../models/scored-model.ts';
import { averagedModels, type AveragedResult } from './averaging.ts';
import { statedNestingTests } from './stated-nesting.ts';
import type { ScaledPrediction } from '../../inference/prediction-intervals.ts';
import { lifetimeLikelihoodRatioTests, routeRequestedTests } from '../lifetime-nested.ts';

export interface ExtrasOptions {
  tests?: { smaller: string; larger: string }[];
  average?: 'all' | 'confidenceSet';
  predict?: { columns: PredictionColumns };
}

export interface Extras {
  nestedTests: NestedTest[];
  averaged: AveragedResult | null;
  loo: RankingEntry[];
}

export interface ExtrasInput {
  columns: Columns | null;
  rows: readonly number[] | null;
  weights: Float64Array | undefined;
  /** The weights column's name, which prediction rows may carry for new observations. */
  weightsColumn: string | null;
  intervalLevel: number;
  /** Identity of the response, its weights and rows, shared by every candidate. */
  sample: string;
  /** Identity of the censored response life models were fitted to (response and censoring columns). */
  lifetimeSample: string;
  termColumns: readonly string[];
  /** Every model in candidate order; `models` are their reports. */
  scored: readonly ScoredModel[];
  models: ModelResult[];
  /** With QAIC and QAICc when the comparison has a ĉ. */
  rankings: Record<CriterionName, BandedEntry[]> & Partial<Record<RankingCriterion, BandedEntry[]>>;
  rankBy: RankingCriterion;
  options: ExtrasOptions;
}

/** Adds press, looRmse, diagnostics and predictions to the models in place; returns the comparison-wide extras. */
export function comparisonExtras(input: ExtrasInput): Extras | { issues: Issue[] } {
  const { scored, models, options } = input;
  const predictions = new Map<string, ScaledPrediction[]>();
  let predictCount: number | null = null;
  let newWeights: readonly number[] = [];
  if (options.predict) {
    if (!input.columns || !input.rows) return { issues: [issue('data_required', ['options', 'predict'], { form: 'predictions' })] };
    const checked = checkPredictionRows(input.columns, input.rows, input.termColumns, options.predict.columns, input.weightsColumn);
    if ('issues' in checked) return checked;
    predictCount = checked.count;
    newWeights = checked.newWeights;
  }
  const issues: Issue[] = [];
  for (const model of scored) {
    const { checks: checkRows, predict, lifePredict } = model.capabilities;
    const result = model.report;
    if (checkRows) {
      const checks = checkRows(input.rows!);
      result.press = checks.press;
      result.looRmse = checks.looRmse;
      result.diagnostics = checks.diagnostics;
      result.cautions.push(...checks.cautions);
      if (checks.looNote) result.cautions.push({ code: 'press_undefined', message: checks.looNote });
    }
    const at = predictCount === null ? null : {
      columns: input.columns!, rows: input.rows!, predict: options.predict!.columns, count: predictCount, newWeights, intervalLevel: input.intervalLevel,
    };
    if (at && predict) {
      const p = predict(at);
      if ('issues' in p) {
        issues.push(...p.issues);
        continue;
      }
      result.predictions = p.results;
      result.predictionScale = p.scale;
      predictions.set(result.name, p.scaled);
      result.cautions.push(...p.cautions);
    }
    if (at && lifePredict) {
      const p = lifePredict(at);
      if ('issues' in p) {
        issues.push(...p.issues);
        continue;
      }
      result.lifePredictions = p.rows;
      result.cautions.push(...p.cautions);
    }
  }
  if (issues.length > 0) return { issues };

  // Pairs naming a life model go to the likelihood-ratio test between life models; pairs with an
  // expression are tested on the caller's word; the rest by each kind's nesting rules.
  const routed = routeRequestedTests(scored, options.tests ?? []);
  const stated = statedNestingTests(scored, input.sample, routed.leastSquares);
  const nested = testNestingOffers(
    scored.flatMap((m) => (m.capabilities.nested ? [m.capabilities.nested(input.sample)] : [])),
    stated.rest,
  );
  const lifetime = lifetimeLikelihoodRatioTests(scored, input.lifetimeSample, routed.lifetime);
  const problems = [...nested.issues, ...stated.issues, ...lifetime.issues];
  if (problems.length > 0) {
    return {
      issues: problems.map((n) => {
        const i = (options.tests ?? []).findIndex((t) => t.smaller === n.facts.smaller && t.larger === n.facts.larger);
        return issue('nested_test_invalid', ['options', 'tests', Math.max(0, i)], { reason: n.message });
      }),
    };
  }
  const loo = rankByLeaveOneOut(models.map((m) => ({ name: m.name, looRmse: m.looRmse ?? null })));
  const ranking = input.rankings[input.rankBy] ?? [];
  const averaged = ranking.some((e) => e.weight !== null)
    ? averagedModels({
      models, ranking, criterion: input.rankBy, over: options.average ?? 'all', predictions, keys: columnKeys(scored), intervalLevel: input.intervalLevel,
    })
    : null;
  return { nestedTests: [...nested.tests, ...stated.tests, ...lifetime.tests], averaged, loo };
}

/** Each model's coefficient column keys, by model name. */
function columnKeys(scored: readonly ScoredModel[]): Map<string, readonly string[]> {
  const out = new Map<string, readonly string[]>();
  for (const m of scored) if (m.capabilities.columnKeys) out.set(m.name, m.capabilities.columnKeys);
  return out;
}
