// Every subset of a small pool, fitted in depth-first order so that each
// subset's parent (the subset without its last pool term) was fitted just
// before its children: a child starts IRLS from the parent's coefficients
// (its new columns from 0). The start changes how many steps a fit takes,
// not where it ends: IRLS stops by the same convergence rule whatever its
// start, so a warm and a cold fit agree to within that rule's tolerance.
import type { GlmTally } from './glm-tally.ts';
import { fitSubset, type Coefficients } from './subset-fit.ts';
import type { GlmSearchData } from './types.ts';
import type { SearchCriterion } from '../types.ts';

export function walkEverySubset(data: GlmSearchData, criterion: SearchCriterion, tally: GlmTally): void {
  const m = data.poolSize;
  const visit = (subset: number[], parent: Coefficients | undefined): void => {
    let own = parent;
    if (tally.admissible(subset)) {
      const fit = fitSubset(data, subset, criterion, parent);
      tally.record(subset, fit, parent !== undefined);
      if (fit.ok) own = fit.coefficients;
    } else {
      tally.notHierarchical++;
    }
    const last = subset.length > 0 ? subset[subset.length - 1] : -1;
    for (let j = last + 1; j < m; j++) visit([...subset, j], own);
  };
  visit([], undefined);
}
