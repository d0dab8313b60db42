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
import { isQuasiCriterion, rankingCriterionInfo, type RankingCriterion } from '../scoring/criteria.ts';
import type { Caution } from '../scoring/cautions.ts';

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

/**
 * rankBy names QAIC or QAICc but the comparison has no ĉ: refused, since
 * choosing by a criterion that was never computed would choose nothing.
 */
export function quasiRankByIssue(input: { rankBy?: RankingCriterion; rankByPath?: string[]; overdispersion?: OverdispersionRequest }): Issue | null {
  if (input.rankBy === undefined || !isQuasiCriterion(input.rankBy) || input.overdispersion !== undefined) return null;
  return issue('rank_by_needs_overdispersion', input.rankByPath ?? ['options', 'rankBy'], { rankBy: input.rankBy });
}

/**
 * Where the comparison has a ĉ: said when ĉ > 1 but the choice is made by a
 * criterion that ignores it, and when ĉ was estimated from a candidate (whose
 * own lack of fit then counts as overdispersion). Burnham & Anderson 2002, §2.5.
 */
export function unscaledRankingCaution(quasi: Omit<OverdispersionResult, 'values' | 'rankings'> | null, rankBy: RankingCriterion): Caution[] {
  if (!quasi) return [];
  const out: Caution[] = [];
  const c = quasi.cHat.toPrecision(4);
  if (quasi.cHat > 1 && !isQuasiCriterion(rankBy)) {
    const label = rankingCriterionInfo(rankBy).label;
    out.push({
      code: 'overdispersion_not_ranked_by',
      message: `ĉ = ${c} is above 1: the counts vary more than the family allows, so criteria on the plain log-likelihood (${label} among them) favour models with too many parameters. This comparison chooses by ${label}; QAIC or QAICc (rankBy "qaic" or "qaicc") allow for ĉ.`,
    });
  }
  if (quasi.source !== 'given') {
    out.push({
      code: 'overdispersion_estimated',
      message: `ĉ = ${c} is estimated from candidate ${JSON.stringify(quasi.source)} (Pearson χ² over its residual degrees of freedom), which counts all of that model's lack of fit as overdispersion. If it misses a term or has the wrong link, ĉ is too large and QAIC favours models that are too small; check that model before trusting the QAIC ranking.`,
    });
  }
  return out;
}
