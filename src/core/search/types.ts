// The shapes the subset-search kernel trades in. Everything here is plain
// data (typed arrays, numbers, arrays) so it crosses a worker boundary by
// structured clone unchanged.

export type SearchCriterion = 'aic' | 'aicc' | 'bic' | 'hqc';

/**
 * One search, reduced to what scoring needs. `crossProducts` is the d-by-d
 * row-major matrix over the design columns of the pool and always terms
 * followed by the response (last row and column): centred sums of products
 * for a model with intercept, raw (uncentred) sums without one.
 */
export interface SubsetProblem {
  observations: number;
  /** sum(ln w) for weighted least squares, 0 without weights. */
  logWeightSum: number;
  /**
   * Σ ln g'(y) when the subsets describe a transformed response g(y) (0 or
   * absent otherwise): added to every subset's log-likelihood so the scores
   * are on the scale of y, as a comparison's are (comparison/response-transform.ts).
   */
  logJacobian?: number;
  intercept: boolean;
  dimension: number;
  crossProducts: Float64Array;
  /** Design columns (indices below dimension - 1) of each pool term; a factor is a block of several. */
  poolBlocks: number[][];
  /** Design columns of the always terms. */
  alwaysColumns: number[];
  /** Per pool term, the pool terms it needs under the hierarchy rule. */
  requires: number[][];
  /** Pool terms that can never enter (a need is met by neither pool nor always). */
  blocked: number[];
}

export interface SearchSettings {
  criterion: SearchCriterion;
  /** How many best models to keep. */
  top: number;
  /**
   * Subsets whose design is rank-deficient: scored with k = rank + 1 (as a
   * comparison would), or skipped as repeats of a smaller model — and then a
   * full-rank subset whose column space another counted subset already spans
   * is skipped too, so every distinct model counts once in the weights.
   */
  rankDeficient: 'score' | 'skip';
}

/** A kept subset: pool term indices (ascending), its residual sum of squares, rank and criterion value. */
export interface ScoredSubset {
  terms: number[];
  rss: number;
  /** Numerical rank of the design, intercept included. */
  rank: number;
  /** k = rank + 1 (error variance). */
  parameters: number;
  value: number;
  rankDeficient: boolean;
}

/** Running sums of exp(-(value - min)/2), over all scored subsets and per term. */
export interface WeightSumsData {
  min: number;
  total: number;
  perTerm: number[];
}

/** How many subsets a search scored or passed over, and why: per range, and for the whole search. */
export interface SubsetCounts {
  /** Subsets scored (hierarchical, scorable). */
  evaluated: number;
  /** Subsets not hierarchical under the rule, passed over. */
  notHierarchical: number;
  /** Subsets with no residual degrees of freedom, or undefined criterion (AICc with n - k - 1 <= 0). */
  unscorable: number;
  rankDeficient: number;
  /** Full-rank subsets passed over because another admitted subset spans the same column space (rankDeficient 'skip' only). */
  sameColumnSpace: number;
  /**
   * Subsets whose residual sum of squares is at the rounding floor: their
   * log-likelihood is unbounded, so they have no criterion value and take no
   * part in weights, importance or the top list.
   */
  exactFits: number;
  /** The first EXACT_FITS_LISTED of them (fewest terms first, then term indices), to name in a caution. */
  exactFitSubsets: number[][];
  /** Subsets never looked at because branch and bound proved they cannot enter the top. */
  pruned: number;
  /** Branch and bound only: nodes visited. */
  nodes: number;
  /** True when a node budget stopped the work before it finished. */
  stopped: boolean;
}

/** What one range of the search (a worker's share) reports back. */
export interface SearchPartial extends SubsetCounts {
  top: ScoredSubset[];
  sums: WeightSumsData;
}
