// Joining the partial results of a search (one per range or subtree) into
// the answer: the best models with delta and Akaike weight over every
// evaluated subset, and each term's importance (summed weight of the
// evaluated subsets that hold it).

import { compareTermLists, EXACT_FITS_LISTED } from './tally.ts';
import { mergeTopModels } from './top-models.ts';
import type { ScoredSubset, SearchPartial, SearchSettings, SubsetCounts, WeightSumsData } from './types.ts';
import { mergeWeightSums } from './weight-sums.ts';

export type SearchMethod = 'exhaustive' | 'branchAndBound';

export interface RankedSubset extends ScoredSubset {
  delta: number;
  weight: number;
}

export interface SearchOutcome extends SubsetCounts {
  method: SearchMethod;
  criterion: SearchSettings['criterion'];
  /** How rank-deficient subsets were treated (settings.rankDeficient). */
  rankDeficientRule: SearchSettings['rankDeficient'];
  /** All 2^m subsets of the pool; weights and importance are over the `evaluated` ones. */
  subsets: number;
  /** True when weights and importance cover every admissible subset (no pruning). */
  weightsCoverAllSubsets: boolean;
  /**
   * True when every subset was scored or proven unable to enter the best
   * `top`, so the models are the best; false when a node budget stopped
   * branch and bound first, and the models are the best found so far.
   */
  proven: boolean;
  models: RankedSubset[];
  /** Per pool term (index order). */
  importance: { term: number; weight: number }[];
  /** The weight sums behind weight and importance, for a caller that must take a subset back out. */
  sums: WeightSumsData;
}

export function finishSearch(method: SearchMethod, settings: SearchSettings, poolSize: number, partials: readonly SearchPartial[]): SearchOutcome {
  const sum = (f: (p: SearchPartial) => number) => partials.reduce((s, p) => s + f(p), 0);
  const sums = mergeWeightSums(
    partials.map((p) => p.sums),
    poolSize,
  );
  const top = mergeTopModels(
    partials.map((p) => p.top),
    settings.top,
  );
  const models = top.map((s) => {
    const delta = s.value - sums.min;
    return { ...s, delta, weight: Math.exp(-delta / 2) / sums.total };
  });
  const pruned = sum((p) => p.pruned);
  const stopped = partials.some((p) => p.stopped);
  return {
    method,
    criterion: settings.criterion,
    rankDeficientRule: settings.rankDeficient,
    evaluated: sum((p) => p.evaluated),
    subsets: 2 ** poolSize,
    weightsCoverAllSubsets: pruned === 0 && !stopped,
    proven: !stopped,
    notHierarchical: sum((p) => p.notHierarchical),
    unscorable: sum((p) => p.unscorable),
    rankDeficient: sum((p) => p.rankDeficient),
    sameColumnSpace: sum((p) => p.sameColumnSpace),
    exactFits: sum((p) => p.exactFits),
    exactFitSubsets: partials.flatMap((p) => p.exactFitSubsets).sort(compareTermLists).slice(0, EXACT_FITS_LISTED),
    pruned,
    nodes: sum((p) => p.nodes),
    stopped,
    models,
    importance: sums.perTerm.map((w, term) => ({ term, weight: sums.total > 0 ? w / sums.total : 0 })),
    sums,
  };
}
