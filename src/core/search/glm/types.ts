// The shapes of a subset search over generalised linear models: what the
// request asks for (family, link, offset, trials), the rows every subset is
// fitted on, and what the search found. Plain data, so a search crosses to a
// worker and back by structured clone.
import type { GlmFamilyName, GlmLinkName } from '../../models/glm/index.ts';
import type { Columns, DesignMatrix } from '../../types.ts';
import type { SearchCriterion, WeightSumsData } from '../types.ts';

export interface GlmSearchSpec {
  family: GlmFamilyName;
  /** Default: the family's canonical link. */
  link?: GlmLinkName;
  /** A numeric column added to every subset's linear predictor as it is. */
  offset?: string;
  /** The request's trials column (binomial only: the response is then successes out of trials). */
  trials?: string;
}

/** Everything a subset fit reads, on the rows every subset shares. */
export interface GlmSearchData {
  family: GlmFamilyName;
  link: GlmLinkName;
  /** The design over every pool term, then every always term (termOfColumn indexes that list). */
  design: DesignMatrix;
  poolSize: number;
  y: Float64Array;
  trials: Float64Array | null;
  offset: Float64Array | null;
  weights: Float64Array | null;
  rows: readonly number[];
  columns: Columns;
}

/**
 * exhaustive: every subset fitted, so the best are proven. stepwiseSwaps:
 * from the always terms alone, the best single addition, removal or swap
 * (one term in, one out) is taken while it lowers the criterion; a local
 * optimum, never proven the best.
 */
export type GlmSearchMethod = 'exhaustive' | 'stepwiseSwaps';

/** A subset that was fitted and scored. */
export interface GlmScoredSubset {
  /** Pool term indices, ascending. */
  terms: number[];
  value: number;
  logLikelihood: number;
  parameters: number;
}

/** Subsets whose fit has no maximum-likelihood answer: skipped, counted, the search goes on. */
export interface GlmFitFailures {
  /** Separation (a binomial or count model's coefficients running to infinity). */
  separation: number;
  /** IRLS (or θ) did not settle within its caps, found no valid start, or stepped outside the family's domain. */
  notConverged: number;
  /** Too few rows for the subset's columns, or a dispersion that collapses to 0. */
  other: number;
  /** The first few such subsets (pool term indices), to name in a caution. */
  examples: { terms: number[]; code: string }[];
}

export interface GlmSearchOutcome {
  method: GlmSearchMethod;
  criterion: SearchCriterion;
  /** True only when every admissible subset was fitted (exhaustive). */
  proven: boolean;
  /** All 2^m subsets of the pool. */
  subsets: number;
  /** Subsets fitted and scored: weights and importance are over exactly these. */
  evaluated: number;
  /** Subsets the search asked for a fit (scored, failed, rank-deficient or unscorable). */
  visited: number;
  notHierarchical: number;
  /** No criterion value (AICc with n - k - 1 <= 0, an unbounded likelihood, no design column at all). */
  unscorable: number;
  /** Subsets with an aliased column: each repeats a smaller subset's model, so it is passed over. */
  rankDeficient: number;
  failures: GlmFitFailures;
  /** True when the visit budget stopped the heuristic before it reached its local optimum. */
  stopped: boolean;
  /** Weighted solves over every fit, and how many fits began from a parent's coefficients. */
  solves: number;
  warmStarts: number;
  /** The best `top`, best first. */
  models: GlmScoredSubset[];
  sums: WeightSumsData;
}
