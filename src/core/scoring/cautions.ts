// Cautions that concern the whole comparison rather than one model.
import { rankingCriterionInfo, type RankingCriterion } from './criteria.ts';
import type { Policy } from './policy.ts';

export interface Caution {
  code: string;
  message: string;
}

/** Carried by every comparison: a ranking is not a validation. */
export const STANDING_CAUTION: Caution = {
  code: 'ranking_is_not_validation',
  message:
    'Criteria rank the candidate models against each other; they do not validate any of them. Before a model is used for a safety-relevant decision, defer to domain review and to local rules.',
};

interface ScaleFacts {
  name: string;
  responseTransform: { fn: string; lambda?: number } | null;
  adjustedR2: number | null;
}

export interface ComparisonCautionFacts {
  dropped: number;
  n: number;
  hasData: boolean;
  models: readonly ScaleFacts[];
  requestedRankBy: RankingCriterion | undefined;
  /** n / k of the largest candidate. */
  ratio: number | null;
  policy: Policy;
  /** The weights column, and how many rows it left out: null weights (part of dropped) and zero weights. */
  weights?: string | null;
  missingWeights?: number;
  zeroWeights?: number;
}

export function comparisonCautions(f: ComparisonCautionFacts): Caution[] {
  const out: Caution[] = [STANDING_CAUTION];
  const zero = f.zeroWeights ?? 0;
  const missing = f.dropped - zero;
  if (missing > 0) {
    const ofWeights = (f.missingWeights ?? 0) > 0 && f.weights
      ? ` (${f.missingWeights} of them without a weight: null in the weights column ${JSON.stringify(f.weights)})`
      : '';
    out.push({
      code: 'rows_dropped',
      message: `${missing} of ${f.n + f.dropped} rows have a missing value in a column some candidate uses${ofWeights} and were left out of every candidate, so all models are compared on the same ${f.n} rows.`,
    });
  }
  if (zero > 0 && f.weights) {
    out.push({
      code: 'zero_weights',
      message: `${zero} row${zero === 1 ? ' has' : 's have'} weight 0 in the weights column ${JSON.stringify(f.weights)} and ${zero === 1 ? 'was' : 'were'} left out of every candidate, as a zero weight says (counted in dataset.rowsDropped); they take no part in the fits, the likelihood or the observation count n.`,
    });
  }
  if (f.models.length === 1) {
    out.push({
      code: 'single_candidate',
      message: 'Only one candidate was sent. Criteria rank models against each other, so a ranking needs two or more: here Δ is 0 and the weight 1 by construction, and neither says anything about how good the model is. Send the alternatives being chosen between (at least a simpler model) to compare.',
    });
  }
  if (!f.hasData) {
    out.push({
      code: 'no_data',
      message: 'No data were sent, so the service cannot check that the candidates were fitted on the same rows of the same response; it relies on their stated observation counts, and there is no dataset fingerprint.',
    });
  }
  const scales = new Set(f.models.filter((m) => m.adjustedR2 !== null).map((m) => JSON.stringify(m.responseTransform)));
  if (scales.size > 1) {
    out.push({
      code: 'adjusted_r2_mixed_scales',
      message: 'Some models describe a transformed response: their R² and adjusted R² are on another scale, so the adjusted R² ranking mixes scales and should not be read across them. The likelihood criteria include the Jacobian and do compare.',
    });
  }
  const threshold = f.policy.preferAiccBelowRatio;
  const requested = f.requestedRankBy;
  if ((requested === 'aic' || requested === 'qaic') && threshold !== null && f.ratio !== null && f.ratio < threshold) {
    const label = rankingCriterionInfo(requested).label;
    out.push({
      code: 'small_sample_aic',
      message: `n/k = ${f.ratio.toFixed(1)} for the largest candidate is below ${threshold}; ${label}'s penalty is then too light and ${label}c is the usual choice (Burnham & Anderson 2002). The request asked for ${label}, so it ranks by ${label}.`,
    });
  }
  return out;
}

/**
 * Said once per comparison when any model's assumption checks found
 * something: a passed or failed check no more validates a model than a
 * criterion does.
 */
export const CHECKS_ARE_NOT_VALIDATION: Caution = {
  code: 'checks_are_not_validation',
  message:
    'The assumption checks, like the criteria, screen and rank models; they do not validate them. A model whose checks pass can still be wrong for its purpose: defer to domain review and local rules before acting on it.',
};

export function checksCaution(models: readonly { cautions: readonly Caution[] }[]): Caution[] {
  return models.some((m) => m.cautions.some((c) => c.code === 'assumption_check')) ? [CHECKS_ARE_NOT_VALIDATION] : [];
}
