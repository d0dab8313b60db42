// Scoring one subset and adding it to a range's results: the top models,
// the weight sums and the counts the response reports.

import { subsetScorer, type SubsetScorer } from './scorer.ts';
import { TopModels } from './top-models.ts';
import type { SearchPartial, SearchSettings, SubsetProblem } from './types.ts';
import { WeightSums } from './weight-sums.ts';

export class SubsetTally {
  readonly top: TopModels;
  readonly sums: WeightSums;
  readonly score: SubsetScorer;
  evaluated = 0;
  notHierarchical = 0;
  unscorable = 0;
  rankDeficient = 0;
  exactFits = 0;
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
    this.score = subsetScorer(settings.criterion, problem.observations, problem.logWeightSum);
  }

  /** Scores the subset `members` with residual sum of squares `rss` and design rank `rank`. */
  add(members: Uint8Array, rank: number, rssRaw: number, deficient: boolean, hierarchical: boolean): void {
    if (!hierarchical) {
      this.notHierarchical++;
      return;
    }
    if (deficient && this.settings.rankDeficient === 'skip') {
      this.rankDeficient++;
      return;
    }
    const k = rank + 1;
    let rss = rssRaw;
    if (rss <= this.rssFloor) rss = this.rssFloor;
    const value = rank >= this.problem.observations ? NaN : this.score(rss, k);
    if (Number.isNaN(value)) {
      this.unscorable++;
      return;
    }
    if (rss === this.rssFloor) this.exactFits++;
    if (deficient) this.rankDeficient++;
    this.evaluated++;
    this.sums.add(value, members);
    if (value <= this.top.threshold) {
      const terms: number[] = [];
      for (let t = 0; t < members.length; t++) if (members[t]) terms.push(t);
      this.top.offer({ terms, rss, rank, parameters: k, value, rankDeficient: deficient });
    }
  }

  partial(): SearchPartial {
    return {
      evaluated: this.evaluated,
      notHierarchical: this.notHierarchical,
      unscorable: this.unscorable,
      rankDeficient: this.rankDeficient,
      exactFits: this.exactFits,
      pruned: this.pruned,
      nodes: this.nodes,
      stopped: this.stopped,
      top: this.top.sorted(),
      sums: this.sums.toData(),
    };
  }
}
