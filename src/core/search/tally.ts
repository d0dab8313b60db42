// Scoring one subset and adding it to a range's results: the top models,
// the weight sums and the counts the response reports.

import { subsetScorer, type SubsetScorer } from './scorer.ts';
import { TopModels } from './top-models.ts';
import type { SearchPartial, SearchSettings, SubsetProblem } from './types.ts';
import { WeightSums } from './weight-sums.ts';

/** How many exact-fit subsets a result names (the count is always complete). */
export const EXACT_FITS_LISTED = 10;

/** Fewer terms first, then the term indices: the order exact-fit subsets are listed in. */
export function compareTermLists(a: readonly number[], b: readonly number[]): number {
  if (a.length !== b.length) return a.length - b.length;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return a[i] - b[i];
  return 0;
}

export class SubsetTally {
  readonly top: TopModels;
  readonly sums: WeightSums;
  readonly score: SubsetScorer;
  evaluated = 0;
  notHierarchical = 0;
  unscorable = 0;
  rankDeficient = 0;
  sameColumnSpace = 0;
  exactFits = 0;
  readonly exactFitSubsets: number[][] = [];
  pruned = 0;
  nodes = 0;
  stopped = false;

  constructor(
    private readonly problem: SubsetProblem,
    private readonly settings: SearchSettings,
    private readonly rssFloor: number,
  ) {
    this.top = new TopModels(settings.top);
    this.sums = new WeightSums(problem.poolBlocks.length);
    this.score = subsetScorer(settings.criterion, problem.observations, problem.logWeightSum, problem.logJacobian);
  }

  /**
   * Scores the subset `members` with residual sum of squares `rss` and design
   * rank `rank`. `repeatsSpan` (asked only of full-rank subsets when
   * rank-deficient ones are skipped) says whether another subset stands for
   * its column space.
   */
  add(members: Uint8Array, rank: number, rss: number, deficient: boolean, hierarchical: boolean, repeatsSpan?: () => boolean): void {
    if (!hierarchical) {
      this.notHierarchical++;
      return;
    }
    const skipRepeats = this.settings.rankDeficient === 'skip';
    if (deficient && skipRepeats) {
      this.rankDeficient++;
      return;
    }
    if (!deficient && skipRepeats && repeatsSpan?.()) {
      this.sameColumnSpace++;
      return;
    }
    const k = rank + 1;
    if (rank >= this.problem.observations) {
      this.unscorable++;
      return;
    }
    if (rss <= this.rssFloor) {
      // Residuals at rounding level: the likelihood is unbounded and any value given it would be invented.
      this.exactFits++;
      this.listExactFit(members);
      return;
    }
    const value = this.score(rss, k);
    if (Number.isNaN(value)) {
      this.unscorable++;
      return;
    }
    if (deficient) this.rankDeficient++;
    this.evaluated++;
    this.sums.add(value, members);
    if (value <= this.top.threshold) {
      const terms: number[] = [];
      for (let t = 0; t < members.length; t++) if (members[t]) terms.push(t);
      this.top.offer({ terms, rss, rank, parameters: k, value, rankDeficient: deficient });
    }
  }

  private listExactFit(members: Uint8Array): void {
    const list = this.exactFitSubsets;
    const terms: number[] = [];
    for (let t = 0; t < members.length; t++) if (members[t]) terms.push(t);
    if (list.length >= EXACT_FITS_LISTED && compareTermLists(terms, list[list.length - 1]) >= 0) return;
    list.push(terms);
    list.sort(compareTermLists);
    if (list.length > EXACT_FITS_LISTED) list.pop();
  }

  partial(): SearchPartial {
    return {
      evaluated: this.evaluated,
      notHierarchical: this.notHierarchical,
      unscorable: this.unscorable,
      rankDeficient: this.rankDeficient,
      sameColumnSpace: this.sameColumnSpace,
      exactFits: this.exactFits,
      exactFitSubsets: this.exactFitSubsets,
      pruned: this.pruned,
      nodes: this.nodes,
      stopped: this.stopped,
      top: this.top.sorted(),
      sums: this.sums.toData(),
    };
  }
}
