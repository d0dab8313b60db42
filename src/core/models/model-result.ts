// What a model reports about itself, whatever kind it is and wherever it was
// fitted: the one shape the answer, the audit record and the report read.
import type { ModelDiagnostics } from '../diagnostics/index.ts';
import type { Caution } from '../scoring/cautions.ts';
import type { CoefficientTest } from '../inference/coefficient-tests.ts';
import type { PredictionWithIntervals } from '../inference/prediction-intervals.ts';
import type { ResponseTransformSpec } from './response-transform.ts';
import type { NonlinearConvergence } from './nonlinear/result.ts';

/** How a model's predictions relate to the response as sent. */
export interface PredictionScale {
  backTransform: 'none' | 'median';
  description: string;
}

/** A coefficient with its t test and confidence interval (null where they do not exist). */
export type CoefficientResult = { term: string; estimate: number | null; standardError: number | null } & CoefficientTest;

export interface ModelResult {
  name: string;
  source: 'fit' | 'residuals' | 'rss' | 'logLikelihood';
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
  /** A nonlinear candidate: its expression as sent, and how its fit converged. */
  expression?: string;
  convergence?: NonlinearConvergence;
}
