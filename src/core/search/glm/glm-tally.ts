// What a generalised-linear search has seen: every subset it asked for a fit,
// counted by what became of it, the scored ones kept in the weight sums (and
// the best `top` of them), the failures counted and a few named.
import type { HierarchyRules } from '../hierarchy.ts';
import { compareSubsets } from '../top-models.ts';
import type { SearchCriterion } from '../types.ts';
import { WeightSums } from '../weight-sums.ts';
import type { SubsetFit } from './subset-fit.ts';
import type { GlmFitFailures, GlmScoredSubset, GlmSearchMethod, GlmSearchOutcome } from './types.ts';

/** Failed subsets named in the answer's caution, at most. */
export const FAILED_SUBSETS_NAMED = 5;

export class GlmTally {
  private readonly scored: GlmScoredSubset[] = [];
  private readonly sums: WeightSums;
  private readonly members: Uint8Array;
  visited = 0;
  notHierarchical = 0;
  unscorable = 0;
  rankDeficient = 0;
  solves = 0;
  warmStarts = 0;
  readonly failures: GlmFitFailures = { separation: 0, notConverged: 0, other: 0, examples: [] };

  constructor(private readonly poolSize: number, private readonly rules: HierarchyRules) {
    this.sums = new WeightSums(poolSize);
    this.members = new Uint8Array(poolSize);
  }

  /** True when the subset obeys the hierarchy rule (every need present, no term that can never enter). */
  admissible(subset: readonly number[]): boolean {
    return subset.every((j) => this.admissibleWithin(j, subset));
  }

  /** True when term j may enter a subset holding `held` (no missing need, not a term that can never enter). */
  admissibleWithin(j: number, held: readonly number[]): boolean {
    return !this.rules.unreachable.some((u) => u.term === j) && this.rules.requires[j].every((r) => held.includes(r));
  }

  /** Records one fit; returns its criterion value (Infinity when it has none). */
  record(subset: readonly number[], fit: SubsetFit, warm: boolean): number {
    this.visited++;
    if (warm) this.warmStarts++;
    if (!fit.ok) {
      if (fit.failure === 'empty') {
        this.unscorable++;
        return Infinity;
      }
      this.failures[fit.failure]++;
      if (this.failures.examples.length < FAILED_SUBSETS_NAMED) this.failures.examples.push({ terms: [...subset], code: fit.code });
      return Infinity;
    }
    this.solves += fit.solves;
    if (fit.rankDeficient) {
      this.rankDeficient++;
      return Infinity;
    }
    if (fit.value === null || fit.logLikelihood === null) {
      this.unscorable++;
      return Infinity;
    }
    this.members.fill(0);
    for (const j of subset) this.members[j] = 1;
    this.sums.add(fit.value, this.members);
    this.scored.push({ terms: [...subset], value: fit.value, logLikelihood: fit.logLikelihood, parameters: fit.parameters });
    return fit.value;
  }

  outcome(method: GlmSearchMethod, criterion: SearchCriterion, top: number, stopped: boolean): GlmSearchOutcome {
    const order = (a: GlmScoredSubset, b: GlmScoredSubset) =>
      compareSubsets({ ...a, rss: 0, rank: 0, rankDeficient: false }, { ...b, rss: 0, rank: 0, rankDeficient: false });
    return {
      method,
      criterion,
      proven: method === 'exhaustive',
      subsets: 2 ** this.poolSize,
      evaluated: this.scored.length,
      visited: this.visited,
      notHierarchical: this.notHierarchical,
      unscorable: this.unscorable,
      rankDeficient: this.rankDeficient,
      failures: this.failures,
      stopped,
      solves: this.solves,
      warmStarts: this.warmStarts,
      models: [...this.scored].sort(order).slice(0, top),
      sums: this.sums.toData(),
    };
  }
}
