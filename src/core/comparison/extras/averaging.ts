// Model averaging over the fitted candidates by the ranking criterion's weights
// (Burnham & Anderson 2002). Only models whose coefficients share one scale and
// meaning can be averaged: models fitted elsewhere have no coefficients here,
// and a model of a transformed response has coefficients on another scale, so
// both are left out, by name, and the weights renormalised over the rest.
import { averageModels, type ModelAverage } from '../../averaging/index.ts';
import type { CriterionName } from '../../criteria.ts';
import type { BandedEntry } from '../rankings.ts';
import type { ModelResult } from '../fitted-model.ts';

export interface AveragedResult extends Omit<ModelAverage, 'issues'> {
  criterion: CriterionName;
  over: 'all' | 'confidenceSet';
  excluded: { name: string; reason: string }[];
  notes: string[];
}

export function averagedModels(
  models: readonly ModelResult[],
  ranking: readonly BandedEntry[],
  criterion: CriterionName,
  over: 'all' | 'confidenceSet',
  predictions: ReadonlyMap<string, { estimate: number | null; standardError: number | null }[]>,
): AveragedResult | null {
  const byName = new Map(ranking.map((e) => [e.name, e]));
  const excluded: { name: string; reason: string }[] = [];
  const chosen: ModelResult[] = [];
  for (const m of models) {
    const entry = byName.get(m.name);
    if (m.source !== 'fit') excluded.push({ name: m.name, reason: 'fitted elsewhere: no coefficients to average' });
    else if (m.responseTransform) excluded.push({ name: m.name, reason: 'describes a transformed response: its coefficients are on another scale' });
    else if (!entry || entry.weight === null) excluded.push({ name: m.name, reason: `no ${criterion} weight` });
    else if (over === 'confidenceSet' && !entry.inConfidenceSet) excluded.push({ name: m.name, reason: 'outside the confidence set' });
    else chosen.push(m);
  }
  if (chosen.length === 0) return null;
  const average = averageModels(chosen.map((m) => ({
    name: m.name,
    weight: byName.get(m.name)!.weight!,
    coefficients: m.coefficients,
    predictions: predictions.get(m.name),
  })));
  const { issues, ...rest } = average;
  return { ...rest, criterion, over, excluded, notes: issues.map((i) => i.message) };
}
