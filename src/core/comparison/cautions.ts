// Cautions that concern the whole comparison rather than one model.
import type { CriterionName } from '../criteria.ts';
import type { Policy } from '../policy.ts';

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
  requestedRankBy: CriterionName | undefined;
  /** n / k of the largest candidate. */
  ratio: number | null;
  policy: Policy;
}

export function comparisonCautions(f: ComparisonCautionFacts): Caution[] {
  const out: Caution[] = [STANDING_CAUTION];
  if (f.dropped > 0) {
    out.push({
      code: 'rows_dropped',
      message: `${f.dropped} of ${f.n + f.dropped} rows have a missing value in a column some candidate uses and were left out of every candidate, so all models are compared on the same ${f.n} rows.`,
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
  if (f.requestedRankBy === 'aic' && threshold !== null && f.ratio !== null && f.ratio < threshold) {
    out.push({
      code: 'small_sample_aic',
      message: `n/k = ${f.ratio.toFixed(1)} for the largest candidate is below ${threshold}; AIC's penalty is then too light and AICc is the usual choice (Burnham & Anderson 2002). The request asked for AIC, so it ranks by AIC.`,
    });
  }
  return out;
}
