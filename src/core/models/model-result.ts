// What a model reports about itself, whatever kind it is and wherever it was
// fitted: the one shape the answer, the audit record and the report read.
import type { ModelDiagnostics } from '../diagnostics/index.ts';
import type { Caution } from '../scoring/cautions.ts';
import type { CoefficientTest } from '../inference/coefficient-tests.ts';
import type { PredictionWithIntervals } from '../inference/prediction-intervals.ts';
import type { ResponseTransformSpec } from './response-transform.ts';
import type { GlmReportFields } from './glm/types.ts';
import type { LifetimeReportFields } from './lifetime/candidate.ts';
import type { NonlinearConvergence } from './nonlinear/result.ts';

/** How a model's predictions relate to the response as sent. */
export interface PredictionScale {
  /** inverseLink: a generalised linear model's mean, its link-scale interval mapped by the inverse link. */
  backTransform: 'none' | 'median' | 'inverseLink';
  description: string;
}

/** A coefficient with its t test and confidence interval (null where they do not exist). */
export type CoefficientResult = { term: string; estimate: number | null; standardError: number | null } & CoefficientTest;

/** A distribution's own parameter (θ, shape, dispersion, scale…), as any kind reports it. */
export interface DistributionParameterResult {
  name: string;
  estimate: number;
  standardError: number | null;
}

/** How an iterative fit ended, as any kind reports it; the members only one kind has are optional. */
export interface ConvergenceResult {
  converged: boolean;
  iterations: number;
  rule: string;
  /** Generalised linear models: IRLS steps halved. */
  stepHalvings?: number;
  /** Life distributions: the Newton decrement at the estimates. */
  decrement?: number;
}

type SharedKindFields = 'convergence' | 'distributionParameters';

/** Fields only some kinds report (a generalised linear model's family and deviance, a life model's distribution and percentiles): absent on the others. */
export interface ModelResult extends Partial<Omit<GlmReportFields, SharedKindFields>>, Partial<Omit<LifetimeReportFields, SharedKindFields>> {
  name: string;
  distributionParameters?: DistributionParameterResult[];
  convergence?: ConvergenceResult | NonlinearConvergence | null;
  source: 'fit' | 'residuals' | 'rss' | 'logLikelihood' | 'fitted' | 'lifetime';
  estimation: 'ml' | 'reml';
  /** Null for a model fitted elsewhere: the service cannot know. */
  intercept: boolean | null;
  parameters: number;
  observations: number;
  logLikelihood: number | null;
  aic: number | null;
  aicc: number | null;
  bic: number | null;
  hqc: number | null;
  rss: number | null;
  r2: number | null;
  adjustedR2: number | null;
  r2Basis: 'centred' | 'uncentred' | null;
  sigma: number | null;
  responseTransform: (ResponseTransformSpec & { jacobian: number }) | null;
  coefficients: CoefficientResult[];
  aliased: string[];
  conditionNumber: number | null;
  /** Exact leave-one-out: Σ w (e/(1−h))² from the hat matrix, and sqrt(press/Σw); null fitted elsewhere. */
  press: number | null;
  looRmse: number | null;
  /** Assumption checks; null for a model fitted elsewhere (no rows to check). */
  diagnostics: ModelDiagnostics | null;
  /** Predictions at the options.predict rows on the response's original scale, with intervals; null when none were asked for. */
  predictions: PredictionWithIntervals[] | null;
  /** How the predictions relate to the response as sent (back-transformed for a transformed response); null without predictions. */
  predictionScale: PredictionScale | null;
  cautions: Caution[];
  /** QAIC and QAICc under the request's ĉ (options.overdispersion); absent when it asks for none. */
  qaic?: number | null;
  qaicc?: number | null;
  /** A nonlinear candidate: its expression as sent. */
  expression?: string;
}
