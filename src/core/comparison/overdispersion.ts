// Criteria for overdispersed counts when the request asks for them
// (options.overdispersion): one ĉ for the whole comparison, given or
// estimated as Pearson χ²/(n − rank) of the fitted GLM candidate with the
// most parameters (Burnham & Anderson 2002, §2.5: the most general model's
// lack of fit read as overdispersion), then QAIC and QAICc per model, ranked
// like AIC (Akaike weights, the Akaike bands of the policy).
import { issue, type Issue } from '../issues.ts';
import { quasiCriteria } from '../models/glm/quasi-likelihood.ts';
import type { ModelResult } from '../models/model-result.ts';
import { rankModels } from '../scoring/ranking.ts';
import { deltaBand, type Policy } from '../scoring/policy.ts';
import type { BandedEntry } from '../scoring/rankings.ts';

export interface OverdispersionRequest {
  cHat: number | 'estimate';
}

export interface OverdispersionResult {
  cHat: number;
  /** 'given', or the candidate whose Pearson χ²/(n − rank) it is. */
  source: string;
  /** Residual degrees of freedom of an estimate; null when given. */
  df: number | null;
  /** An estimate below 1: Burnham & Anderson advise ĉ = 1 then (no underdispersion to correct); the caller decides. */
  belowOne: boolean;
  /** Per model, in the order of `models`. */
  values: { name: string; qaic: number | null; qaicc: number | null }[];
  rankings: { qaic: BandedEntry[]; qaicc: BandedEntry[] };
}

/** The estimable coefficients of a model fitted here: its rank. */
const rankOf = (m: ModelResult) => m.coefficients.filter((c) => c.estimate !== null).length;

function chooseCHat(models: readonly ModelResult[], request: OverdispersionRequest): Omit<OverdispersionResult, 'values' | 'rankings'> | Issue {
  if (request.cHat !== 'estimate') return { cHat: request.cHat, source: 'given', df: null, belowOne: false };
  const glms = models.filter((m) => m.source === 'fit' && m.pearsonChiSquare !== undefined && m.pearsonChiSquare !== null);
  if (glms.length === 0) return issue('overdispersion_no_model', ['options', 'overdispersion', 'cHat'], {});
  const general = glms.reduce((a, b) => (b.parameters > a.parameters ? b : a));
  const df = general.observations - rankOf(general);
  const cHat = df > 0 ? general.pearsonChiSquare! / df : Number.NaN;
  if (!(cHat > 0) || !Number.isFinite(cHat)) return issue('overdispersion_no_model', ['options', 'overdispersion', 'cHat'], {});
  return { cHat, source: general.name, df, belowOne: cHat < 1 };
}

export function overdispersionCriteria(
  models: readonly ModelResult[], request: OverdispersionRequest, confidenceLevel: number, policy: Policy,
): OverdispersionResult | Issue {
  const chosen = chooseCHat(models, request);
  if ('code' in chosen) return chosen;
  const values = models.map((m) => ({ name: m.name, ...quasiCriteria(m, chosen.cHat) }));
  const rank = (key: 'qaic' | 'qaicc') =>
    rankModels(values.map((v) => ({ name: v.name, value: v[key] })), { direction: 'smaller', weighted: true, confidenceLevel })
      // Δ QAIC reads as Δ AIC does, so the policy's Akaike bands word it.
      .map((e) => ({ ...e, band: deltaBand(e.delta, 'aic', policy) }));
  return {
    ...chosen,
    values: values.map(({ name, qaic, qaicc }) => ({ name, qaic, qaicc })),
    rankings: { qaic: rank('qaic'), qaicc: rank('qaicc') },
  };
}
