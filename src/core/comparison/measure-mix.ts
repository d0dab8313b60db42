// A criterion compares likelihoods of the same observations under the same
// measure: a probability mass (counts, pass/fail outcomes) and a density
// (continuous measurements) are on different scales — a density can exceed 1,
// a mass cannot — so their AICs differ by an arbitrary amount that depends on
// the units. A comparison mixing them is refused, naming both sides; it reads
// only each model's stated measure, whatever its kind.
import { issue, type Issue } from '../issues.ts';
import type { LikelihoodMeasure } from '../models/scored-model.ts';

export function measureMixIssue(models: readonly { name: string; measure: LikelihoodMeasure }[]): Issue | null {
  const mass = models.filter((m) => m.measure === 'mass').map((m) => m.name);
  const density = models.filter((m) => m.measure === 'density').map((m) => m.name);
  return mass.length > 0 && density.length > 0 ? issue('measures_mixed', ['candidates'], { mass, density }) : null;
}
