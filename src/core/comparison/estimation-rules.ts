// REML log-likelihoods leave out a term that depends on the fixed effects, so
// they compare only models with the same fixed effects, and never with ML
// likelihoods (common practice in mixed models; e.g. Pinheiro & Bates 2000).
import { compareCodePoints } from '../design/code-point-order.ts';
import { issue, type Issue } from '../issues.ts';

export interface EstimationFacts {
  name: string;
  index: number;
  estimation: 'ml' | 'reml';
  fixedEffects?: string[];
}

export function estimationIssues(candidates: readonly EstimationFacts[]): Issue[] {
  const reml = candidates.filter((c) => c.estimation === 'reml');
  if (reml.length === 0) return [];
  const ml = candidates.filter((c) => c.estimation === 'ml');
  if (ml.length > 0) {
    return [issue('estimation_mixed', ['candidates'], { reml: reml.map((c) => c.name), ml: ml.map((c) => c.name) })];
  }
  const issues: Issue[] = [];
  const missing = reml.filter((c) => !c.fixedEffects);
  for (const c of missing) issues.push(issue('reml_fixed_effects_missing', ['candidates', c.index], { name: c.name }));
  if (issues.length > 0) return issues;
  const key = (terms: string[]) => [...new Set(terms)].sort(compareCodePoints);
  const first = reml[0];
  const firstKey = key(first.fixedEffects!);
  for (const c of reml.slice(1)) {
    const k = key(c.fixedEffects!);
    if (k.length !== firstKey.length || k.some((t, i) => t !== firstKey[i])) {
      issues.push(issue('reml_fixed_effects_differ', ['candidates', c.index, 'fixedEffects'], {
        name: c.name, fixedEffects: k, first: first.name, firstFixedEffects: firstKey,
      }));
    }
  }
  return issues;
}
