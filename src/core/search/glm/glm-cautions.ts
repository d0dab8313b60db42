// What a reader of a generalised-linear search must be told: the cautions
// every search carries (the standing one, selection optimism, rows left out,
// terms that can never enter, aliased and unscorable subsets), then the
// search's own: a heuristic's best is not proven the best, and subsets whose
// fit has no maximum-likelihood answer were skipped.
import type { Caution } from '../../scoring/cautions.ts';
import { subsetName } from '../request-problem.ts';
import type { SearchOutcome } from '../result.ts';
import { searchCautions } from '../search-cautions.ts';
import type { PreparedGlmSearch } from './prepare-glm.ts';
import type { GlmSearchOutcome } from './types.ts';

/** The least-squares search's outcome fields the shared cautions read, from a GLM search's. */
function asSharedOutcome(o: GlmSearchOutcome): SearchOutcome {
  return {
    method: 'exhaustive', criterion: o.criterion, rankDeficientRule: 'skip', subsets: o.subsets, weightsCoverAllSubsets: true,
    // The heuristic's own caution below says what an unproven answer means here.
    proven: true,
    evaluated: o.evaluated, notHierarchical: o.notHierarchical, unscorable: o.unscorable, rankDeficient: o.rankDeficient,
    sameColumnSpace: 0, exactFits: 0, exactFitSubsets: [], pruned: 0, nodes: 0, stopped: false, models: [], importance: [], sums: o.sums,
  };
}

export function glmSearchCautions(ready: PreparedGlmSearch, o: GlmSearchOutcome, refitFailed: number): Caution[] {
  const { input } = ready.prepared;
  const out = searchCautions(ready.prepared, asSharedOutcome(o));
  const name = (terms: number[]) => JSON.stringify(subsetName([...terms.map((j) => input.pool[j]), ...input.always], input.intercept));
  if (o.method === 'stepwiseSwaps') {
    out.push({
      code: 'search_heuristic',
      message: `Fitting every one of the ${o.subsets} subsets was beyond the budget, so the search used stepwise selection with swaps and fitted ${o.visited} subsets${o.stopped ? ', stopping when its budget of fits ran out' : ''}: the models listed are the best it found, not proven the best, and weight and importance are over the ${o.evaluated} subsets it scored only (they overstate the true weights). Narrow the pool or add always terms the domain already requires to have every subset fitted.`,
    });
  }
  const f = o.failures;
  const failed = f.separation + f.notConverged + f.other;
  if (failed > 0) {
    const parts = [
      f.separation > 0 ? `${f.separation} separated (coefficients running to infinity)` : '',
      f.notConverged > 0 ? `${f.notConverged} did not converge` : '',
      f.other > 0 ? `${f.other} could not be fitted otherwise (too few rows, or a dispersion of 0)` : '',
    ].filter((p) => p !== '');
    const examples = f.examples.map((e) => `${name(e.terms)} (${e.code})`).join(', ');
    out.push({
      code: 'glm_subsets_skipped',
      message: `${failed} subsets have no maximum-likelihood fit: ${parts.join(', ')}. They were skipped and take no part in weights or importance; the search went on without them${examples ? `. Among them: ${examples}` : ''}. Send one as a comparison candidate to see why.`,
    });
  }
  if (refitFailed > 0) {
    out.push({
      code: 'glm_refit_failed',
      message: `${refitFailed} of the best subsets converged from the coefficients of the subset they were reached from but not from the family's starting means, as a comparison fits them, so they are not listed; their weight stays in the sums.`,
    });
  }
  return out;
}
