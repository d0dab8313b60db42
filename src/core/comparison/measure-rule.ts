// A probability mass (counts, pass/fail outcomes) and a density (continuous
// measurements, lifetimes) are not on one scale: a log-probability is at most
// 0 while a log-density changes with the units of the response, so their
// criteria cannot share a ranking. Reads only ScoredModel.measure, whatever
// the kinds.
import { issue, type Issue } from '../issues.ts';
import type { ScoredModel } from '../models/scored-model.ts';

/** One issue naming a candidate of each measure (the first of each, and every name), or none. */
export function mixedMeasureIssues(models: readonly ScoredModel[], indexOf: (name: string) => number): Issue[] {
  const mass = models.filter((m) => m.measure === 'mass');
  const density = models.filter((m) => m.measure === 'density');
  if (mass.length === 0 || density.length === 0) return [];
  return [issue('likelihood_measures_mixed', ['candidates', indexOf(mass[0].name)], {
    mass: mass.map((m) => m.name),
    density: density.map((m) => m.name),
    against: density[0].name,
  })];
}
