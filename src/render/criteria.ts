// How each ranking criterion is named for a person, and which way is better.
import { criterionNames, type CriterionName } from './types.ts';

const displayNames: Record<CriterionName, string> = {
  aicc: 'AICc',
  aic: 'AIC',
  bic: 'BIC',
  hqc: 'HQC',
  adjustedR2: 'adjusted R²',
  qaic: 'QAIC',
  qaicc: 'QAICc',
  loo: 'leave-one-out',
};

export function criterionDisplayName(criterion: CriterionName): string {
  return displayNames[criterion];
}

export function isCriterionName(value: unknown): value is CriterionName {
  return typeof value === 'string' && (criterionNames as readonly string[]).includes(value);
}
