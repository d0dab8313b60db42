// Every criterion's ranking over the models, each entry with its Δ band.
import { CRITERIA, type CriterionName } from './criteria.ts';
import { rankModels, type RankingEntry } from './ranking.ts';
import { deltaBand, type Policy } from './policy.ts';

export type BandedEntry = RankingEntry & { band: string | null };

/** What ranking reads of a model: its name and its value under each criterion (any kind's report has them). */
export type CriteriaOfModel = { name: string } & Record<CriterionName, number | null>;

export function rankAll(models: readonly CriteriaOfModel[], confidenceLevel: number, policy: Policy): Record<CriterionName, BandedEntry[]> {
  const rankings = {} as Record<CriterionName, BandedEntry[]>;
  for (const def of CRITERIA) {
    rankings[def.name] = rankModels(
      models.map((m) => ({ name: m.name, value: m[def.name] })),
      { direction: def.direction, weighted: def.weighted, confidenceLevel },
    ).map((e) => ({ ...e, band: deltaBand(e.delta, def.name, policy) }));
  }
  return rankings;
}
