// What the renderers read from a stored comparison record. Structural and
// deliberately loose: the renderers must draw any record the store hands
// back, including ones written before later fields (nested tests, averaging,
// leave-one-out, policy) existed, so everything beyond the fixed core of the
// public contract is optional, and numbers may be null where a quantity
// does not exist.

/** The criteria a ranking can be made by (fixed names of the public contract); qaic and qaicc only with a ĉ. */
export const criterionNames = ['aicc', 'aic', 'bic', 'hqc', 'adjustedR2', 'qaic', 'qaicc', 'loo'] as const;
export type CriterionName = (typeof criterionNames)[number];

export interface RankingEntry {
  rank: number | null;
  name: string;
  value: number | null;
  delta: number | null;
  weight: number | null;
  evidenceRatio: number | null;
  cumulativeWeight: number | null;
  inConfidenceSet?: boolean | null;
  band?: string | null;
}

export interface CoefficientView {
  term: string;
  estimate: number | null;
  standardError: number | null;
  [extra: string]: unknown;
}

/** A caution is a sentence, or a code with its facts; the renderer accepts both. */
export type CautionView = string | { code?: string; message?: string; [fact: string]: unknown };

export interface ModelView {
  name: string;
  source?: string;
  parameters: number | null;
  observations: number | null;
  logLikelihood: number | null;
  aic: number | null;
  aicc: number | null;
  bic: number | null;
  hqc?: number | null;
  rss: number | null;
  r2: number | null;
  adjustedR2: number | null;
  sigma?: number | null;
  coefficients?: CoefficientView[];
  aliased?: string[];
  cautions?: CautionView[];
  press?: number | null;
  looRmse?: number | null;
  diagnostics?: unknown;
  /** Estimates at the rows of options.predict (and, in later records, their intervals). */
  predictions?: unknown[];
  /** The kinds beyond least squares (report-kinds.ts reads these; absent on least-squares records). */
  family?: string | null;
  link?: string | null;
  deviance?: number | null;
  nullDeviance?: number | null;
  devianceExplained?: number | null;
  pearsonChiSquare?: number | null;
  qaic?: number | null;
  qaicc?: number | null;
  expression?: string;
  distribution?: string;
  distributionParameters?: { name: string; estimate: number | null; standardError: number | null }[];
  convergence?: ConvergenceView | null;
  percentiles?: { probability: number; estimate: number | null; lower: number | null; upper: number | null }[] | null;
  censoring?: { exact?: number; right?: number; left?: number; interval?: number };
  logLikelihoodLogTime?: number | null;
}

/** How an iterative fit ended: IRLS and Newton fits say iterations and rule; nonlinear fits add their starts. */
export interface ConvergenceView {
  converged?: boolean;
  iterations?: number;
  stepHalvings?: number;
  start?: number;
  starts?: unknown[];
  [extra: string]: unknown;
}

export interface NestedTestView {
  smaller: string;
  larger: string;
  df: number | null | [number, number] | Record<string, unknown>;
  fStatistic?: number | null;
  fPValue?: number | null;
  lrStatistic?: number | null;
  lrPValue?: number | null;
  [extra: string]: unknown;
}

export interface AveragedTermView {
  term: string;
  estimate: number | null;
  unconditionalStandardError: number | null;
  importance: number | null;
  [extra: string]: unknown;
}

export interface ComparisonResultView {
  id: string;
  createdAt?: string;
  conventions?: Record<string, unknown>;
  dataset?: {
    fingerprint?: string | null;
    observations?: number | null;
    rowsDropped?: number | null;
    response?: string | null;
    [extra: string]: unknown;
  };
  models: ModelView[];
  rankings: Partial<Record<CriterionName, RankingEntry[]>>;
  /** The ĉ behind rankings.qaic and rankings.qaicc (options.overdispersion). */
  overdispersion?: { cHat?: number | null; source?: string | null; df?: number | null; belowOne?: boolean | null };
  verdict?: {
    agree?: boolean | null;
    best?: Partial<Record<string, string | null>>;
    rankBy?: string | null;
    summary?: string | null;
  };
  cautions?: CautionView[];
  nestedTests?: NestedTestView[];
  averaged?: {
    terms?: AveragedTermView[];
    predictions?: unknown[];
    /** Later records: the models whose coefficients were averaged, and their summed weight. */
    models?: unknown[];
    weightCovered?: number | null;
    [extra: string]: unknown;
  };
  policy?: { name?: string | null; hash?: string | null };
}

/** The integrity check made when the record was read back (src/audit/integrity.ts). */
export interface IntegrityView {
  ok: boolean;
  reason: string | null;
  detail: string;
}

/** A stored record: the comparison result plus its place in the audit chain. */
export interface StoredComparisonView {
  id: string;
  createdAt: string;
  label?: string | null;
  seq: number;
  hash: string;
  prevHash: string | null;
  result: ComparisonResultView;
  /** null or absent: not checked (a record rendered outside the service's read path). */
  integrity?: IntegrityView | null;
}
