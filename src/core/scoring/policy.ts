// A team policy: the defaults a team agrees on once (POLICY_FILE), so that two
// dashboards ranking the same data use the same rules and can prove it (every
// response names the policy and its hash).
import { rankingCriterionInfo, type QuasiCriterionName, type RankingCriterion } from './criteria.ts';

export interface DeltaBand {
  /** Upper end of the band; null for the last, open-ended band. */
  maxDelta: number | null;
  /** Whether a Δ equal to maxDelta falls in this band (true) or the next (false). */
  includeMax: boolean;
  wording: string;
}

export interface Policy {
  name: string;
  /** QAIC or QAICc apply where the comparison has a ĉ; elsewhere AIC or AICc stand in (chooseRankBy). */
  rankBy: RankingCriterion;
  confidenceLevel: number;
  /**
   * Rank by AICc instead of AIC (QAICc instead of QAIC) when n/k of the largest candidate is below this
   * ratio (Burnham & Anderson 2002's rule of thumb: 40); null turns it off.
   */
  preferAiccBelowRatio: number | null;
  /** Wording for Δ on AIC, AICc, HQC, QAIC and QAICc. */
  akaikeBands: DeltaBand[];
  /** Wording for Δ on BIC (2 ln of an approximate Bayes factor). */
  bicBands: DeltaBand[];
}

export const DEFAULT_POLICY: Policy = {
  name: 'parsimetry-default',
  rankBy: 'aicc',
  confidenceLevel: 0.95,
  preferAiccBelowRatio: 40,
  // Burnham & Anderson (2002), Model Selection and Multimodel Inference, the
  // usual rule of thumb: Δ ≤ 2 substantial support, 4–7 considerably less,
  // > 10 essentially none. The gaps between those published bands are worded
  // as gaps, not filled with invented claims.
  akaikeBands: [
    { maxDelta: 2, includeMax: true, wording: 'substantial support' },
    { maxDelta: 4, includeMax: false, wording: 'between substantial and considerably less support' },
    { maxDelta: 7, includeMax: true, wording: 'considerably less support' },
    { maxDelta: 10, includeMax: true, wording: 'between considerably less and essentially no support' },
    { maxDelta: null, includeMax: false, wording: 'essentially no support' },
  ],
  // Kass & Raftery (1995), "Bayes factors", JASA 90: evidence against the model
  // relative to the best, on the 2 ln B scale that ΔBIC approximates.
  bicBands: [
    { maxDelta: 2, includeMax: true, wording: 'evidence against it barely worth a mention' },
    { maxDelta: 6, includeMax: true, wording: 'positive evidence against it' },
    { maxDelta: 10, includeMax: true, wording: 'strong evidence against it' },
    { maxDelta: null, includeMax: false, wording: 'very strong evidence against it' },
  ],
};

export function deltaBand(delta: number | null, criterion: RankingCriterion, policy: Policy): string | null {
  if (delta === null) return null;
  const bands = criterion === 'bic' ? policy.bicBands : criterion === 'adjustedR2' ? null : policy.akaikeBands;
  if (!bands) return null;
  for (const band of bands) {
    if (band.maxDelta === null) return band.wording;
    if (delta < band.maxDelta || (band.includeMax && delta === band.maxDelta)) return band.wording;
  }
  return null;
}

export interface RankByChoice {
  rankBy: RankingCriterion;
  /** How it was chosen, for conventions.rankBy and the reader. */
  reason: string;
}

/** The likelihood criterion a quasi criterion reduces to without a ĉ (ĉ = 1). */
const UNSCALED: Record<QuasiCriterionName, 'aic' | 'aicc'> = { qaic: 'aic', qaicc: 'aicc' };
/** The small-sample form of a criterion with one. */
const SMALL_SAMPLE: Partial<Record<RankingCriterion, RankingCriterion>> = { aic: 'aicc', qaic: 'qaicc' };

/**
 * The request's criterion wins; otherwise the policy's default. A policy that
 * ranks by QAIC or QAICc ranks a comparison without a ĉ (no
 * options.overdispersion) by AIC or AICc, what they become at ĉ = 1. Then
 * AIC is switched to AICc (QAIC to QAICc) when the sample is small for the
 * largest model (n/k below the policy's ratio), where the lighter penalty is
 * known to be too light.
 */
export function chooseRankBy(
  requested: RankingCriterion | undefined, policy: Policy, smallestRatio: number | null, hasCHat = false,
): RankByChoice {
  if (requested) return { rankBy: requested, reason: 'named by the request' };
  const named = JSON.stringify(policy.name);
  let rankBy = policy.rankBy;
  let fallback: string | null = null;
  if ((rankBy === 'qaic' || rankBy === 'qaicc') && !hasCHat) {
    const label = rankingCriterionInfo(rankBy).label;
    rankBy = UNSCALED[rankBy];
    fallback = `policy ${named} ranks by ${label}, which needs ĉ (options.overdispersion); without one the ranking uses ${rankingCriterionInfo(rankBy).label}, what ${label} is at ĉ = 1`;
  }
  const ratio = policy.preferAiccBelowRatio;
  const smaller = SMALL_SAMPLE[rankBy];
  if (smaller && ratio !== null && smallestRatio !== null && smallestRatio < ratio) {
    const from = rankingCriterionInfo(rankBy).label;
    const to = rankingCriterionInfo(smaller).label;
    const switched = `switched to ${to} because n/k = ${smallestRatio.toFixed(1)} is below ${ratio}`;
    return {
      rankBy: smaller,
      reason: fallback === null ? `policy ${named} ranks by ${from}, ${switched}` : `${fallback}, ${switched}`,
    };
  }
  return { rankBy, reason: fallback ?? `the default of policy ${named}` };
}
