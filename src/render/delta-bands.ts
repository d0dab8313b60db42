// How much support a criterion difference leaves a model, in plain words, and
// where the chart draws its reference lines.
//
// Two families, as in the team policy (src/core/scoring/policy.ts):
// - AIC, AICc and HQC: the rule of thumb for AIC-type differences in Burnham,
//   K. P. & Anderson, D. R. (2002), Model Selection and Multimodel Inference,
//   2nd ed., Springer, section 2.6 (from memory: Δ ≤ 2 substantial support,
//   4–7 considerably less, > 10 essentially none). Lines at 2, 4, 7 and 10.
// - BIC: Kass, R. E. & Raftery, A. E. (1995), "Bayes factors", JASA 90, on the
//   2 ln B scale that ΔBIC approximates (from memory: 0–2 barely worth a
//   mention, 2–6 positive, 6–10 strong, > 10 very strong). Lines at 2, 6, 10.
//
// A stored result names each Δ's band in the team policy's words (entry.band);
// the pictures repeat those words, so they say what the JSON says. The words
// below are our own and are used only for records written before results
// carried bands. The line positions are ours too; test/render/delta-bands.test.ts
// checks they are the default policy's band edges.
import type { CriterionName, RankingEntry } from './types.ts';

export type BandFamily = 'akaike' | 'bic';

/** One band, in the same shape as the policy's DeltaBand. */
export interface BandRule {
  /** Key for markup (data-band). */
  band: string;
  /** Upper end of the band; null for the last, open-ended band. */
  maxDelta: number | null;
  /** Whether a Δ equal to maxDelta falls in this band (true) or the next (false). */
  includeMax: boolean;
  wording: string;
  /** How darkly the chart shades the band's zone (none for the bands of good support and the gaps). */
  shade: 'none' | 'weaker' | 'negligible';
}

export const ownBands: Readonly<Record<BandFamily, readonly BandRule[]>> = {
  akaike: [
    { band: 'close', maxDelta: 2, includeMax: true, wording: 'about as good as the best', shade: 'none' },
    { band: 'gap-low', maxDelta: 4, includeMax: false, wording: 'between bands', shade: 'none' },
    { band: 'weaker', maxDelta: 7, includeMax: true, wording: 'clearly weaker', shade: 'weaker' },
    { band: 'gap-high', maxDelta: 10, includeMax: true, wording: 'between bands', shade: 'none' },
    { band: 'negligible', maxDelta: null, includeMax: false, wording: 'hardly any support', shade: 'negligible' },
  ],
  bic: [
    { band: 'close', maxDelta: 2, includeMax: true, wording: 'about as good as the best', shade: 'none' },
    { band: 'positive', maxDelta: 6, includeMax: true, wording: 'some evidence against it', shade: 'none' },
    { band: 'strong', maxDelta: 10, includeMax: true, wording: 'strong evidence against it', shade: 'weaker' },
    { band: 'very-strong', maxDelta: null, includeMax: false, wording: 'very strong evidence against it', shade: 'negligible' },
  ],
};

/** Where the chart draws its dashed lines: the edges of the family's bands. */
export const referenceLines: Readonly<Record<BandFamily, readonly number[]>> = {
  akaike: [2, 4, 7, 10],
  bic: [2, 6, 10],
};

/** Criteria on the -2 log-likelihood scale have bands (QAIC's Δ reads as AIC's); adjusted R² and leave-one-out do not. */
export function bandFamily(criterion: CriterionName): BandFamily | null {
  if (criterion === 'aicc' || criterion === 'aic' || criterion === 'hqc' || criterion === 'qaic' || criterion === 'qaicc') return 'akaike';
  if (criterion === 'bic') return 'bic';
  return null;
}

export function bandsApply(criterion: CriterionName): boolean {
  return bandFamily(criterion) !== null;
}

/** The band of a difference, by the same edge rule as the policy's deltaBand. */
export function bandOf(delta: number | null, rules: readonly BandRule[]): BandRule | null {
  if (delta === null || !Number.isFinite(delta) || delta < 0) return null;
  for (const rule of rules) {
    if (rule.maxDelta === null) return rule;
    if (delta < rule.maxDelta || (rule.includeMax && delta === rule.maxDelta)) return rule;
  }
  return null;
}

/** Our own band of an AIC-type difference (kept for callers that know no criterion). */
export function supportBandOf(delta: number | null): BandRule | null {
  return bandOf(delta, ownBands.akaike);
}

/**
 * The words for one ranking entry: the record's own (the team policy's) when
 * the entry carries a band, nothing when it says there is none (null), and
 * our own reading only for entries written before results carried bands.
 */
export function entryBandWording(entry: Pick<RankingEntry, 'band' | 'delta'>, criterion: CriterionName): string | null {
  if (typeof entry.band === 'string') return entry.band === '' ? null : entry.band;
  if (entry.band === null) return null;
  const family = bandFamily(criterion);
  if (family === null) return null;
  const delta = typeof entry.delta === 'number' ? entry.delta : null;
  return bandOf(delta, ownBands[family])?.wording ?? null;
}

/**
 * The words a person reads beside a Δ: the best model (Δ = 0) is "best" (or
 * "tied for best"), never a band, because a band measures the evidence against
 * a model relative to the best, and "evidence against it barely worth a
 * mention" said of the best model itself misleads; every other entry gets its
 * band's words (entryBandWording).
 */
export function supportWording(entry: Pick<RankingEntry, 'band' | 'delta'>, criterion: CriterionName, atBest: number): string | null {
  if (entry.delta === 0) return atBest > 1 ? 'tied for best' : 'best';
  return entryBandWording(entry, criterion);
}

/** How many entries share the best value (Δ = 0). */
export function countAtBest(entries: readonly Pick<RankingEntry, 'delta'>[]): number {
  return entries.filter((e) => e.delta === 0).length;
}
