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

export interface ModelDiagnostics {
  available: boolean;
  reason: string | null;
  residualNormality: NormalityCheck;
  heteroscedasticity: HeteroscedasticityCheck;
  autocorrelation: AutocorrelationCheck;
  multicollinearity: MulticollinearityCheck;
  influence: InfluenceCheck;
}

/** The checks and what failed, in plain words (a model's result carries the words among its cautions, once). */
export type DiagnosedFit = ModelDiagnostics & { cautions: string[] };
