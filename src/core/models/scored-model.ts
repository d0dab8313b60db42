// The seam between the kinds of model and everything after them: what scoring
// needs of a model (its likelihood with every constant, k, n, whether the
// likelihood is a density or a probability mass) and what it reports, plus
// what it can offer after the ranking. Ranking, averaging and the checks ask a
// model for a capability; they never look inside how it was fitted.
import type { ModelDiagnostics } from '../diagnostics/index.ts';
import type { NestingOffer } from '../inference/nesting-offers.ts';
import type { LifetimeNestingCandidate } from './lifetime/nested.ts';
import type { LeastSquaresFacts } from './nonlinear/extra-sum-of-squares.ts';
import type { LifePredictions } from './lifetime/life-predictions.ts';
import type { LifeCurve } from './lifetime/life-picture.ts';
import type { PredictionWithIntervals, ScaledPrediction } from '../inference/prediction-intervals.ts';
import type { Issue } from '../issues.ts';
import type { Columns } from '../types.ts';
import type { Caution } from '../scoring/cautions.ts';
import type { CoefficientResult, ModelResult, PredictionScale } from './model-result.ts';

/** A likelihood of continuous data is a density; of counts or pass/fail outcomes, a probability mass. The two never share a ranking. */
export type LikelihoodMeasure = 'density' | 'mass';

/** Exact leave-one-out error and the assumption checks, row numbers in the caller's data. */
export interface ModelChecks {
  press: number | null;
  looRmse: number | null;
  looNote: string | null;
  diagnostics: ModelDiagnostics;
  cautions: Caution[];
}

/** Where to predict: the request's new rows, checked against the data. */
export interface PredictionRequest {
  columns: Columns;
  rows: readonly number[];
  predict: Columns;
  count: number;
  /** Weights of the new observations (1 where none was sent). */
  newWeights: readonly number[];
  intervalLevel: number;
}

export interface ModelPredictions {
  results: PredictionWithIntervals[];
  scaled: ScaledPrediction[];
  scale: PredictionScale;
  cautions: Caution[];
}

/** What a model can do after the ranking; a kind offers what it has. */
export interface ModelCapabilities {
  /** Leave-one-out error and residual checks on the rows it was fitted on (`rows` maps used rows to data rows). */
  checks?: (rows: readonly number[]) => ModelChecks;
  /** Mean response at new rows with standard errors and intervals. */
  predict?: (at: PredictionRequest) => ModelPredictions | { issues: Issue[] };
  /**
   * The model offered to nested-model tests under its kind's rules (least squares, GLM); `sample` names the
   * response, weights and rows it was fitted to. Only models under the same rules are paired.
   */
  nested?: (sample: string) => NestingOffer;
  /** A least-squares model's sums for an extra-sum-of-squares test of a pair the caller names as nested (linear or nonlinear). */
  leastSquaresFacts?: (sample: string) => LeastSquaresFacts;
  /** What a likelihood-ratio test between life models needs (their own nesting rules: lifetime/nested.ts). */
  lifetimeNesting?: (sample: string) => LifetimeNestingCandidate;
  /** A life model's location, median life, percentiles and survival at new rows (lifetime/life-predictions.ts). */
  lifePredict?: (at: PredictionRequest) => LifePredictions | { issues: Issue[] };
  /** A life model's fraction failed at the picture's times (lifetime/life-picture.ts). */
  lifeCurve?: (times: readonly number[]) => LifeCurve;
  /** Identities of its coefficients' columns, for averaging coefficients across models. */
  columnKeys?: readonly string[];
}

export interface ScoredModel {
  name: string;
  /** Full log-likelihood (every constant), null where it does not exist. */
  logLikelihood: number | null;
  parameters: number;
  observations: number;
  measure: LikelihoodMeasure;
  coefficients: readonly CoefficientResult[];
  /** Everything the model reports about itself, criteria included. */
  report: ModelResult;
  capabilities: ModelCapabilities;
}

/** The seam's view of a report: the scored fields are the report's own. */
export function scoredModel(report: ModelResult, measure: LikelihoodMeasure, capabilities: ModelCapabilities = {}): ScoredModel {
  return {
    name: report.name,
    logLikelihood: report.logLikelihood,
    parameters: report.parameters,
    observations: report.observations,
    measure,
    coefficients: report.coefficients,
    report,
    capabilities,
  };
}
