// Criteria for overdispersed counts (Burnham & Anderson 2002, §2.5):
//   QAIC  = -2 ℓ / ĉ + 2k
//   QAICc = QAIC + 2k(k + 1) / (n - k - 1)
// with k counting ĉ (one more than the model's own parameters), and ĉ either
// given or estimated as Pearson χ² / (n - rank) of one model — in practice the
// most general candidate, whose lack of fit is then read as overdispersion.
// Burnham & Anderson advise ĉ = 1 when the estimate falls below 1 (there is
// no underdispersion to correct); the estimate says when that is the case
// and leaves the choice to the caller.
import { overdispersion } from './after-ranking.ts';
import type { GlmFit } from './types.ts';

export interface QuasiCriteria {
  qaic: number | null;
  /** Null when n - k - 1 <= 0. */
  qaicc: number | null;
  /** k counting ĉ. */
  parameters: number;
}

export function quasiCriteria(
  model: { logLikelihood: number | null; parameters: number; observations: number },
  cHat: number,
): QuasiCriteria {
  const k = model.parameters + 1;
  if (model.logLikelihood === null || !(cHat > 0) || !Number.isFinite(cHat)) return { qaic: null, qaicc: null, parameters: k };
  const qaic = (-2 * model.logLikelihood) / cHat + 2 * k;
  const rest = model.observations - k - 1;
  return { qaic, qaicc: rest > 0 ? qaic + (2 * k * (k + 1)) / rest : null, parameters: k };
}

export interface CHatEstimate {
  cHat: number;
  /** Residual degrees of freedom it rests on. */
  df: number;
  /** True when the estimate is below 1, where ĉ = 1 is the usual choice. */
  belowOne: boolean;
}

/** Pearson χ² / (n - rank) of the given model; null without residual degrees of freedom. */
export function estimateCHat(fit: Pick<GlmFit, 'pearsonChiSquare' | 'residualDf'>): CHatEstimate | null {
  const { ratio, residualDf } = overdispersion(fit);
  if (ratio === null || !Number.isFinite(ratio)) return null;
  return { cHat: ratio, df: residualDf, belowOne: ratio < 1 };
}
