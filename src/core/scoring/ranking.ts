// Ranking models on one criterion: order, differences from the best (Δ),
// weights, evidence ratios and the confidence set.
//
// Decisions, documented for callers:
// - Order: best first; equal values are ordered by name in code-point order,
//   then by input order, so the same request always gives the same list.
// - Ranks are competition ranks ("1, 1, 3"): a model's rank is one more than
//   the number of models strictly better. Equal means exactly equal values.
// - Models whose value is null (or not finite) come last, in name order, with
//   rank, value, delta, weight, evidenceRatio, cumulativeWeight and
//   inConfidenceSet all null; they take no part in the weights.
// - For a criterion without weights (adjusted R²) weight, evidenceRatio,
//   cumulativeWeight and inConfidenceSet are null: Akaike-type weights have
//   no meaning over R², and a confidence set is built from weights.
// - The confidence set is the best models, in order, until their cumulative
//   weight reaches the level; the model that crosses the level is included,
//   and so is any model tied in value with the last one included (the order
//   among tied models is arbitrary, so the set does not split them). The
//   best model is always in the set.

import { compareCodePoints } from '../design/code-point-order.ts';

export interface RankingEntry {
  rank: number | null;
  name: string;
  value: number | null;
  delta: number | null;
  weight: number | null;
  evidenceRatio: number | null;
  cumulativeWeight: number | null;
  inConfidenceSet: boolean | null;
}

export interface RankingOptions {
  direction: 'smaller' | 'larger';
  weighted: boolean;
  /** Default 0.95. */
  confidenceLevel?: number;
}

export const DEFAULT_CONFIDENCE_LEVEL = 0.95;

/**
 * Akaike weights exp(-Δ_i/2) / Σ_j exp(-Δ_j/2) of smaller-is-better values,
 * with Δ_i = value_i - min. Subtracting the minimum first keeps every exponent
 * ≤ 0 and the best term exactly 1, so the sum is in [1, m] and nothing
 * overflows; models far behind underflow harmlessly to weight 0. Over BIC
 * values the same form gives approximate posterior model probabilities under
 * equal prior odds.
 */
export function akaikeWeights(values: readonly number[]): number[] {
  if (values.length === 0) return [];
  const best = Math.min(...values);
  const terms = values.map((v) => Math.exp(-(v - best) / 2));
  const total = terms.reduce((a, b) => a + b, 0);
  return terms.map((t) => t / total);
}

export function rankModels(
  entries: readonly { name: string; value: number | null }[],
  { direction, weighted, confidenceLevel = DEFAULT_CONFIDENCE_LEVEL }: RankingOptions,
): RankingEntry[] {
  const indexed = entries.map((e, index) => ({ ...e, index }));
  const byName = (a: { name: string; index: number }, b: { name: string; index: number }) =>
    compareCodePoints(a.name, b.name) || a.index - b.index;
  const ranked = indexed
    .filter((e): e is typeof e & { value: number } => typeof e.value === 'number' && Number.isFinite(e.value))
    .sort((a, b) => (a.value === b.value ? byName(a, b) : direction === 'smaller' ? a.value - b.value : b.value - a.value));
  const unranked = indexed.filter((e) => !(typeof e.value === 'number' && Number.isFinite(e.value))).sort(byName);

  const best = ranked.length > 0 ? ranked[0].value : 0;
  const deltas = ranked.map((e) => (direction === 'smaller' ? e.value - best : best - e.value));
  const weights = weighted ? akaikeWeights(deltas) : null;

  const out: RankingEntry[] = [];
  let cumulative = 0;
  let better = 0; // models strictly better than the current one
  let setClosed = false;
  for (let i = 0; i < ranked.length; i++) {
    if (i > 0 && ranked[i].value !== ranked[i - 1].value) better = i;
    const entry: RankingEntry = {
      rank: better + 1,
      name: ranked[i].name,
      value: ranked[i].value,
      delta: deltas[i],
      weight: null,
      evidenceRatio: null,
      cumulativeWeight: null,
      inConfidenceSet: null,
    };
    if (weights) {
      const tiedWithPrevious = i > 0 && ranked[i].value === ranked[i - 1].value;
      if (setClosed && !(tiedWithPrevious && out[i - 1].inConfidenceSet)) entry.inConfidenceSet = false;
      else entry.inConfidenceSet = true;
      cumulative += weights[i];
      if (cumulative >= confidenceLevel) setClosed = true;
      entry.weight = weights[i];
      // exp(Δ/2) = weight_best / weight_i, taken directly so that it stays
      // accurate when weight_i underflows; null if it exceeds the double range (Δ > ~1419).
      const ratio = Math.exp(deltas[i] / 2);
      entry.evidenceRatio = Number.isFinite(ratio) ? ratio : null;
      entry.cumulativeWeight = Math.min(cumulative, 1);
    }
    out.push(entry);
  }
  for (const e of unranked) {
    out.push({
      rank: null, name: e.name, value: null, delta: null, weight: null,
      evidenceRatio: null, cumulativeWeight: null, inConfidenceSet: null,
    });
  }
  return out;
}
