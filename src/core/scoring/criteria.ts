// Information criteria and R² from a fit summary, under the conventions of
// api.md ("Conventions", fixed):
//   aic  = -2 logL + 2k
//   aicc = aic + 2k(k+1)/(n-k-1)          (undefined when n-k-1 <= 0)
//   bic  = -2 logL + k ln n
//   hqc  = -2 logL + 2k ln(ln n)
//   r2   = 1 - RSS/TSS
//   adjustedR2 = 1 - (1-r2)(n-1)/(n-p)   with an intercept (TSS centred)
//              = 1 - (1-r2) n/(n-p)      without one (TSS uncentred about 0)
// k counts the non-aliased coefficients plus one for the error variance; p
// counts the coefficients including the intercept. A quantity that does not
// exist is null with a caution saying why; nothing here is ever NaN or ±∞.
//
// Adding a criterion is one entry in CRITERIA below: its name (the key in
// `rankings`), a label for people, whether smaller or larger is better,
// whether Akaike-type weights exp(-Δ/2) mean anything over it, and how to
// compute it.

export interface FitSummary {
  /** Null when the likelihood has no finite value (an exact fit). */
  logLikelihood: number | null;
  /** k: non-aliased coefficients plus one for the error variance. */
  parameters: number;
  /** n: rows used. */
  observations: number;
  /** Σ w e² (null for a candidate sent by its log-likelihood only). */
  rss: number | null;
  /** Weighted total sum of squares, centred with an intercept, about 0 without (null if unknown). */
  tss: number | null;
  /** p for adjusted R²: coefficients including the intercept (pass the rank: aliased ones are not estimated). */
  coefficientsIncludingIntercept: number | null;
  intercept: boolean;
}

export type CriterionCautionCode =
  | 'likelihood_undefined_exact_fit'
  | 'likelihood_undefined'
  | 'aicc_undefined'
  | 'bic_undefined'
  | 'hqc_undefined'
  | 'r2_unavailable'
  | 'r2_undefined'
  | 'adjusted_r2_undefined'
  | 'value_not_finite';

type Computed = { value: number } | { undefinedBecause: CriterionCautionCode };

export interface CriterionDefinition {
  name: string;
  /** How people read the name, e.g. "AICc", "adjusted R²". */
  label: string;
  direction: 'smaller' | 'larger';
  /** Whether weights exp(-Δ/2) / Σ exp(-Δ/2) are meaningful over this criterion. */
  weighted: boolean;
  formula: string;
  compute(s: FitSummary, r2: Computed): Computed;
}

function withLikelihood(s: FitSummary, f: (logL: number) => Computed): Computed {
  if (s.logLikelihood === null || !Number.isFinite(s.logLikelihood)) {
    return { undefinedBecause: s.rss === 0 ? 'likelihood_undefined_exact_fit' : 'likelihood_undefined' };
  }
  return f(s.logLikelihood);
}

export const CRITERIA = [
  {
    name: 'aic',
    label: 'AIC',
    direction: 'smaller',
    weighted: true,
    formula: '-2 logL + 2k',
    compute: (s) => withLikelihood(s, (logL) => ({ value: -2 * logL + 2 * s.parameters })),
  },
  {
    name: 'aicc',
    label: 'AICc',
    direction: 'smaller',
    weighted: true,
    formula: 'aic + 2k(k+1)/(n-k-1), null when n-k-1 <= 0',
    compute: (s) => withLikelihood(s, (logL) => {
      const k = s.parameters;
      const room = s.observations - k - 1;
      if (!(room > 0)) return { undefinedBecause: 'aicc_undefined' };
      return { value: -2 * logL + 2 * k + (2 * k * (k + 1)) / room };
    }),
  },
  {
    name: 'bic',
    label: 'BIC',
    direction: 'smaller',
    weighted: true,
    formula: '-2 logL + k ln n',
    compute: (s) => withLikelihood(s, (logL) => {
      if (!(s.observations > 0)) return { undefinedBecause: 'bic_undefined' };
      return { value: -2 * logL + s.parameters * Math.log(s.observations) };
    }),
  },
  {
    name: 'hqc',
    label: 'HQC',
    direction: 'smaller',
    weighted: true,
    formula: '-2 logL + 2k ln(ln n)',
    compute: (s) => withLikelihood(s, (logL) => {
      if (!(s.observations > 1)) return { undefinedBecause: 'hqc_undefined' };
      return { value: -2 * logL + 2 * s.parameters * Math.log(Math.log(s.observations)) };
    }),
  },
  {
    name: 'adjustedR2',
    label: 'adjusted R²',
    direction: 'larger',
    weighted: false,
    formula: '1 - (1-r2)(n-1)/(n-p) with an intercept; 1 - (1-r2) n/(n-p) without',
    compute: (s, r2) => {
      if (!('value' in r2)) return r2;
      const n = s.observations;
      const p = s.coefficientsIncludingIntercept;
      if (p === null || !(n - p > 0)) return { undefinedBecause: 'adjusted_r2_undefined' };
      const top = s.intercept ? n - 1 : n;
      return { value: 1 - ((1 - r2.value) * top) / (n - p) };
    },
  },
] as const satisfies readonly CriterionDefinition[];

export type CriterionName = (typeof CRITERIA)[number]['name'];

export const CRITERION_NAMES: readonly CriterionName[] = CRITERIA.map((c) => c.name);

export function criterionDefinition(name: CriterionName): CriterionDefinition {
  return CRITERIA.find((c) => c.name === name)!;
}

/** What ranking and the verdict need to know of a criterion: everything but how to compute it. */
export type RankingCriterionInfo = Omit<CriterionDefinition, 'compute'>;

/**
 * Criteria on the quasi-likelihood of overdispersed counts (Burnham & Anderson
 * 2002, §2.5): ℓ divided by one overdispersion factor ĉ for the whole
 * comparison, k counting ĉ. They exist only when a comparison has a ĉ
 * (options.overdispersion), so they are not computed per model with the
 * criteria above; whoever holds ĉ computes them and ranks them like AIC.
 */
export const QUASI_CRITERIA = [
  { name: 'qaic', label: 'QAIC', direction: 'smaller', weighted: true, formula: '-2 logL/ĉ + 2k, k counting ĉ' },
  { name: 'qaicc', label: 'QAICc', direction: 'smaller', weighted: true, formula: 'qaic + 2k(k+1)/(n-k-1), null when n-k-1 <= 0' },
] as const satisfies readonly RankingCriterionInfo[];

export type QuasiCriterionName = (typeof QUASI_CRITERIA)[number]['name'];

/** Every criterion a comparison may rank and choose by. */
export type RankingCriterion = CriterionName | QuasiCriterionName;

export const RANKING_CRITERIA: readonly (RankingCriterionInfo & { name: RankingCriterion })[] = [...CRITERIA, ...QUASI_CRITERIA];

export function isQuasiCriterion(name: RankingCriterion): name is QuasiCriterionName {
  return QUASI_CRITERIA.some((c) => c.name === name);
}

export function rankingCriterionInfo(name: RankingCriterion): RankingCriterionInfo {
  return RANKING_CRITERIA.find((c) => c.name === name)!;
}

/** R² = 1 - RSS/TSS, on the TSS the fit supplies (centred or uncentred). */
export function coefficientOfDetermination(s: FitSummary): Computed {
  if (s.rss === null || s.tss === null) return { undefinedBecause: 'r2_unavailable' };
  if (!(s.tss > 0)) return { undefinedBecause: 'r2_undefined' };
  return { value: 1 - s.rss / s.tss };
}

export interface CriterionCaution {
  code: CriterionCautionCode;
  /** The quantities this caution leaves null. */
  quantities: (CriterionName | 'r2')[];
  message: string;
}

export type CriteriaValues = Record<CriterionName, number | null> & {
  r2: number | null;
  /** Which total sum of squares R² and adjusted R² are taken about. */
  r2Basis: 'centred' | 'uncentred';
  cautions: CriterionCaution[];
};

function labelOf(q: CriterionName | 'r2'): string {
  return q === 'r2' ? 'R²' : criterionDefinition(q).label;
}

function listInWords(items: string[]): string {
  return items.length <= 1 ? items.join('') : `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

function cautionMessage(code: CriterionCautionCode, s: FitSummary, quantities: (CriterionName | 'r2')[]): string {
  const which = listInWords(quantities.map(labelOf));
  const n = s.observations;
  const k = s.parameters;
  switch (code) {
    case 'likelihood_undefined_exact_fit':
      return `The fit is exact (residual sum of squares 0), so the Gaussian log-likelihood has no finite value; ${which} are reported as null.`;
    case 'likelihood_undefined':
      return `No finite log-likelihood is available, so ${which} are reported as null.`;
    case 'aicc_undefined':
      return `AICc is undefined here: its correction divides by n - k - 1 = ${n - k - 1} (n = ${n}, k = ${k}), which must be positive.`;
    case 'bic_undefined':
      return `BIC is undefined for n = ${n} observations.`;
    case 'hqc_undefined':
      return `HQC is undefined for n = ${n}: its penalty uses ln(ln n), which needs n > 1.`;
    case 'r2_unavailable':
      return `${which} need the residual and total sums of squares, which this candidate does not provide.`;
    case 'r2_undefined':
      return `${which} are undefined: the total sum of squares of the response is 0.`;
    case 'adjusted_r2_undefined':
      return `Adjusted R² is undefined here: it divides by n - p = ${s.coefficientsIncludingIntercept === null ? 'unknown' : n - s.coefficientsIncludingIntercept}, which must be positive.`;
    case 'value_not_finite':
      return `${which} came out too large or too small for a double and ${quantities.length > 1 ? 'are' : 'is'} reported as null.`;
  }
}

/** Every criterion in CRITERIA, plus R², for one model. */
export function computeCriteria(s: FitSummary): CriteriaValues {
  const reasons = new Map<CriterionCautionCode, (CriterionName | 'r2')[]>();
  const note = (code: CriterionCautionCode, q: CriterionName | 'r2') => {
    const list = reasons.get(code) ?? [];
    list.push(q);
    reasons.set(code, list);
  };
  const settle = (q: CriterionName | 'r2', c: Computed): number | null => {
    if ('undefinedBecause' in c) {
      note(c.undefinedBecause, q);
      return null;
    }
    if (!Number.isFinite(c.value)) {
      note('value_not_finite', q);
      return null;
    }
    return c.value;
  };
  const r2Computed = coefficientOfDetermination(s);
  const r2 = settle('r2', r2Computed);
  const values = {} as Record<CriterionName, number | null>;
  for (const def of CRITERIA) {
    // A non-finite R² must not flow into adjusted R² as a number.
    const input: Computed = r2 === null && 'value' in r2Computed ? { undefinedBecause: 'value_not_finite' } : r2Computed;
    values[def.name] = settle(def.name, (def as CriterionDefinition).compute(s, input));
  }
  const cautions = [...reasons].map(([code, quantities]) => ({ code, quantities, message: cautionMessage(code, s, quantities) }));
  return { ...values, r2, r2Basis: s.intercept ? 'centred' : 'uncentred', cautions };
}
