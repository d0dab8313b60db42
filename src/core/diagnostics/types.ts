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
  conditionNumber: number | null;
  conditionNumberThreshold: number;
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
  cautions: string[];
}
