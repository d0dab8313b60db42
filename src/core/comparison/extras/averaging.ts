// Model averaging over the fitted candidates by the ranking criterion's weights
// (Burnham & Anderson 2002). Only models whose coefficients share one scale and
// meaning can be averaged: models fitted elsewhere have no coefficients here,
// and a model of a transformed response has coefficients on another scale, so
// both are left out, by name, and the weights renormalised over the rest.
// Coefficients are matched by design column key, not label (see
// design/column-identity.ts), so differently coded dummies are never pooled.
import { averageModels, type ModelAverage } from '../../averaging/index.ts';
import { columnQualifier, keyReferences } from '../../design/index.ts';
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
  /** Design column keys per model name, in coefficient order. */
  keys: ReadonlyMap<string, readonly string[]>,
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
    else if (keys.get(m.name)?.length !== m.coefficients.length) excluded.push({ name: m.name, reason: 'its design columns carry no identity to match coefficients by' });
    else chosen.push(m);
  }
  if (chosen.length === 0) return null;
  const average = averageModels(chosen.map((m) => {
    const k = keys.get(m.name)!;
    return {
      name: m.name,
      weight: byName.get(m.name)!.weight!,
      coefficients: m.coefficients.map((c, j) => ({ ...c, key: k[j], qualifier: columnQualifier(k[j]) })),
      predictions: predictions.get(m.name),
    };
  }));
  const { issues, ...rest } = average;
  const notes = issues.map((i) => i.message);
  const mixed = mixedReferences(chosen.map((m) => ({ name: m.name, keys: keys.get(m.name)! })));
  if (mixed) notes.push(mixed);
  return { ...rest, criterion, over, excluded, notes };
}

/**
 * A factor coded against different reference levels in different averaged
 * models changes the meaning of more than its dummies: the intercept (and the
 * slope of any term that interacts with the factor) is measured at the
 * reference level, so those averages mix quantities too. Said in a note.
 */
function mixedReferences(models: readonly { name: string; keys: readonly string[] }[]): string | null {
  const byColumn = new Map<string, Map<string, Set<string>>>();
  for (const m of models) {
    for (const key of m.keys) {
      for (const { column, reference } of keyReferences(key)) {
        if (!byColumn.has(column)) byColumn.set(column, new Map());
        const refs = byColumn.get(column)!;
        if (!refs.has(reference)) refs.set(reference, new Set());
        refs.get(reference)!.add(m.name);
      }
    }
  }
  const parts: string[] = [];
  for (const [column, refs] of byColumn) {
    if (refs.size < 2) continue;
    const codings = [...refs].map(([ref, names]) => `against ${JSON.stringify(ref)} in ${[...names].map((n) => JSON.stringify(n)).join(', ')}`);
    parts.push(`${JSON.stringify(column)} is coded ${codings.join('; ')}`);
  }
  if (parts.length === 0) return null;
  return `${parts.join('. ')}. The intercept, and the slope of any term that interacts with such a factor, is measured at the reference level, so its averaged value mixes different quantities; give every candidate the same reference to average them.`;
}
