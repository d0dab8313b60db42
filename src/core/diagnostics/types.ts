// The shape of a fitted model's assumption checks. Every check reports its
// statistic, its threshold and `passed`: true or false, or null when the
// check could not be made (then `note` says why).

export interface NormalityCheck {
  test: 'Jarque–Bera';
  statistic: number | null;
  df: 2;
  pValue: number | null;
  skewness: number | null;
  kurtosis: number | null;
  alpha: number;
  passed: boolean | null;
  note: string;
}

export interface HeteroscedasticityCheck {
  test: 'Breusch–Pagan (studentised, Koenker)';
  statistic: number | null;
  df: number | null;
  pValue: number | null;
  alpha: number;
  passed: boolean | null;
  note: string | null;
}

export interface AutocorrelationCheck {
  test: 'Durbin–Watson';
  statistic: number | null;
  acceptableRange: [number, number];
  passed: boolean | null;
  note: string;
}

export interface MulticollinearityCheck {
  varianceInflationFactors: { term: string; vif: number | null }[];
  maxVarianceInflation: number | null;
  varianceInflationThreshold: number;
  /** Condition number of the centred regressors scaled to unit length (what the check uses). */
  conditionNumber: number | null;
  conditionNumberThreshold: number;
  /** Belsley–Kuh–Welsch scaled condition number of the uncentred design, intercept included: information only. */
  uncentredConditionNumber: number | null;
  passed: boolean | null;
  note: string | null;
}

export interface InfluenceCheck {
  maxCooksDistance: number | null;
  /** 0-based index into the rows the fit used. */
  maxCooksDistanceRow: number | null;
  cooksDistanceThreshold: number;
  /** 2p/n. */
  leverageThreshold: number;
  highLeverageRows: number;
  highLeverageRowIndices: number[];
  passed: boolean | null;
}

/** Pearson χ² / residual df against what the family's variance allows (GLM families whose dispersion is fixed). */
export interface OverdispersionCheck {
  pearsonChiSquare: number;
  residualDf: number;
  /** Pearson χ² / residual df; about 1 when the family's variance holds. Null with no residual df. */
  ratio: number | null;
  /** The upper alpha point of χ²(df) / df: a ratio above it is unlikely under the family's variance. Null when not checked. */
  threshold: number | null;
  /** Upper tail of χ²(residual df) at the Pearson χ² (Pearson's goodness-of-fit test, large-sample). */
  pValue: number | null;
  passed: boolean | null;
  note: string;
}

/** Deviance residuals standardised by √(φ (1 − h)): roughly standard normal where the model holds and counts are not small. */
export interface DevianceResidualCheck {
  maxAbsolute: number | null;
  /** Data row (0-based, as sent) of the largest. */
  maxAbsoluteRow: number | null;
  threshold: number;
  largeRows: number;
  /** Data rows (0-based, as sent) beyond the threshold. */
  largeRowIndices: number[];
  passed: boolean | null;
  note: string;
}

/** The checks that belong to a generalised linear model's family. */
export interface GlmChecks {
  overdispersion: OverdispersionCheck;
  devianceResiduals: DevianceResidualCheck;
}

export interface ModelDiagnostics {
  available: boolean;
  reason: string | null;
  residualNormality: NormalityCheck;
  heteroscedasticity: HeteroscedasticityCheck;
  autocorrelation: AutocorrelationCheck;
  multicollinearity: MulticollinearityCheck;
  influence: InfluenceCheck;
  /** Generalised linear models only (absent for the other kinds). */
  glm?: GlmChecks;
}

/** The checks and what failed, in plain words (a model's result carries the words among its cautions, once). */
export type DiagnosedFit = ModelDiagnostics & { cautions: string[] };
