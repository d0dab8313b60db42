// How much support a criterion difference leaves a model, in plain words.
//
// Thresholds: the rule of thumb for AIC-type differences in Burnham, K. P. &
// Anderson, D. R. (2002), Model Selection and Multimodel Inference, 2nd ed.,
// Springer, section 2.6 (from memory: Δ ≤ 2 substantial support, 4–7
// considerably less, > 10 essentially none). The gaps 2–4 and 7–10 are not
// covered by that rule, so they are named neutrally rather than guessed at.
// The wording below is our own. The same reading is applied to BIC and HQC
// differences, which share the -2 log-likelihood scale; it is a reading aid,
// not a test.
import type { CriterionName } from './types.ts';

export type SupportBand = 'close' | 'gap-low' | 'weaker' | 'gap-high' | 'negligible';

export interface BandDefinition {
  band: SupportBand;
  /** Edges of the band on the Δ axis (which edge is included: see supportBandOf). */
  from: number;
  to: number;
  wording: string;
}

export const supportBands: readonly BandDefinition[] = [
  { band: 'close', from: 0, to: 2, wording: 'about as good as the best' },
  { band: 'gap-low', from: 2, to: 4, wording: 'between bands' },
  { band: 'weaker', from: 4, to: 7, wording: 'clearly weaker' },
  { band: 'gap-high', from: 7, to: 10, wording: 'between bands' },
  { band: 'negligible', from: 10, to: Infinity, wording: 'hardly any support' },
];

/** The reference lines the chart draws, each with the wording of the band it opens. */
export const bandThresholds: readonly { at: number; wording: string }[] = [
  { at: 2, wording: 'up to 2: about as good as the best' },
  { at: 4, wording: '4 to 7: clearly weaker' },
  { at: 7, wording: '' },
  { at: 10, wording: 'over 10: hardly any support' },
];

/** Criteria on the -2 log-likelihood scale, where the Δ bands apply. */
export function bandsApply(criterion: CriterionName): boolean {
  return criterion === 'aicc' || criterion === 'aic' || criterion === 'bic' || criterion === 'hqc';
}

/**
 * The band of a difference. The published bands are closed ("≤ 2", "4–7")
 * and the last is open ("> 10"), so 2, 4 and 7 belong to their bands, 10
 * to the gap below it, and only the gaps take the values strictly between.
 */
export function supportBandOf(delta: number | null): BandDefinition | null {
  if (delta === null || !Number.isFinite(delta) || delta < 0) return null;
  const [close, gapLow, weaker, gapHigh, negligible] = supportBands;
  if (delta <= 2) return close;
  if (delta < 4) return gapLow;
  if (delta <= 7) return weaker;
  if (delta <= 10) return gapHigh;
  return negligible;
}
