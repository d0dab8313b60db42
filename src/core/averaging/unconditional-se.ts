// Unconditional standard errors of a model-averaged quantity
// (Burnham & Anderson 2002, "Model Selection and Multimodel Inference",
// 2nd ed.). Each model i contributes its estimate b_i, its conditional
// variance var_i and its weight w_i (summing to 1); bbar = sum w_i b_i.
//
// - 'eq6.12' (the default): sqrt( sum w_i (var_i + (b_i - bbar)^2) ), the
//   revised form the authors later prefer; it is the square root of the
//   mixture variance, so it never falls below 'eq4.9' (Jensen).
// - 'eq4.9': sum w_i sqrt( var_i + (b_i - bbar)^2 ), their first estimator.
// Equation numbers are those of the 2nd edition, quoted from memory.

export type UnconditionalSeEstimator = 'eq6.12' | 'eq4.9';

export const ESTIMATOR_DESCRIPTION: Record<UnconditionalSeEstimator, string> = {
  'eq6.12': 'Burnham & Anderson (2002) eq. 6.12: sqrt(sum w_i (var_i + (b_i - bbar)^2))',
  'eq4.9': 'Burnham & Anderson (2002) eq. 4.9: sum w_i sqrt(var_i + (b_i - bbar)^2)',
};

export interface WeightedEstimate {
  weight: number;
  estimate: number;
  /** Conditional standard error; null when the model could not estimate it. */
  standardError: number | null;
}

/**
 * The weighted average of the estimates, and its unconditional standard error
 * (null when any contributing model with positive weight lacks a standard
 * error). Weights are normalised here, so callers may pass any positive
 * weights over the models that take part.
 */
export function averageWithUnconditionalSe(
  parts: readonly WeightedEstimate[],
  estimator: UnconditionalSeEstimator,
): { estimate: number; unconditionalStandardError: number | null } | null {
  let total = 0;
  for (const p of parts) total += p.weight;
  if (!(total > 0)) return null;
  let estimate = 0;
  for (const p of parts) estimate += (p.weight / total) * p.estimate;
  let accumulated = 0;
  for (const p of parts) {
    const w = p.weight / total;
    if (w === 0) continue;
    if (p.standardError === null) return { estimate, unconditionalStandardError: null };
    const spread = p.estimate - estimate;
    const component = p.standardError * p.standardError + spread * spread;
    accumulated += estimator === 'eq6.12' ? w * component : w * Math.sqrt(component);
  }
  return { estimate, unconditionalStandardError: estimator === 'eq6.12' ? Math.sqrt(accumulated) : accumulated };
}
