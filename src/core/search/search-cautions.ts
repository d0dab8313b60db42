// What a reader of a search result needs to be told: the standing caution,
// the optimism of choosing the best of many subsets, and everything the
// search passed over, pruned or could not score.
import { STANDING_CAUTION, type Caution } from '../scoring/cautions.ts';
import { SUMMARY_INPUT_CAUTION } from '../comparison/from-summary.ts';
import { subsetName, type PreparedSearch } from './request-problem.ts';
import type { SearchOutcome } from './result.ts';

/** Exact fits as the report counts them: the kernel's, plus top models whose refit on the rows found them exact. */
export interface ExactFitTally {
  exactFits: number;
  exactFitNames: string[];
}

export function searchCautions(prepared: PreparedSearch, outcome: SearchOutcome, exact: ExactFitTally = { exactFits: outcome.exactFits, exactFitNames: [] }): Caution[] {
  const out: Caution[] = [
    STANDING_CAUTION,
    {
      code: 'selection_optimism',
      message: `The best of ${outcome.evaluated} subsets was chosen on these same data, so its criterion and R² are optimistic about how it will predict new data (selection bias); confirm the chosen model on data the search did not see.`,
    },
  ];
  const { source, rules, input } = prepared;
  if (source.kind === 'rows' && source.dropped > source.zeroWeights) {
    const n = prepared.problem.observations;
    out.push({
      code: 'rows_dropped',
      message: `${source.dropped - source.zeroWeights} of ${n + source.dropped} rows have a missing value in the response, the weights or a column some pool or always term uses, and were left out of every subset, so all subsets are scored on the same ${n} rows.`,
    });
  }
  if (source.kind === 'rows' && source.zeroWeights > 0) {
    out.push({
      code: 'zero_weights',
      message: `${source.zeroWeights} row${source.zeroWeights === 1 ? ' has' : 's have'} weight 0 in the weights column ${JSON.stringify(input.weights)} and ${source.zeroWeights === 1 ? 'was' : 'were'} left out of every subset, as a zero weight says (counted in dataset.rowsDropped).`,
    });
  }
  if (source.kind === 'summary') out.push(SUMMARY_INPUT_CAUTION);
  if (rules.unreachable.length > 0) {
    const list = rules.unreachable.map((u) => `${subsetName([input.pool[u.term]], true)} (missing ${u.missing.map((m) => m.join('×')).join(', ')})`);
    out.push({
      code: 'hierarchy_unreachable',
      message: `Under the hierarchy rule these pool terms can never enter, because a term they are built from is in neither the pool nor always: ${list.join('; ')}.`,
    });
  }
  if (!outcome.proven) {
    // Under the 'score' rule rank-deficient subsets are among the evaluated ones; under 'skip' they were passed over.
    const deficient = outcome.rankDeficientRule === 'skip' ? outcome.rankDeficient : 0;
    const accounted = outcome.evaluated + outcome.notHierarchical + outcome.unscorable + deficient + outcome.sameColumnSpace + outcome.exactFits + outcome.pruned;
    out.push({
      code: 'search_not_proven',
      message: `The node budget of branch and bound (budget.maxNodes) ran out after ${outcome.nodes} tree nodes, before the best ${input.top} subsets were proven: the models listed are the best found so far (at least as good as stepwise selection with swaps finds), but a better subset may be among the ${outcome.subsets - accounted} subsets neither scored nor ruled out. Do not read them as the best subsets; narrow the pool, add always terms the domain already requires, or ask for fewer models (top).`,
    });
  }
  if (!outcome.weightsCoverAllSubsets) {
    out.push({
      code: 'weights_over_evaluated_subsets',
      message: `Branch and bound proved ${outcome.pruned} subsets unable to enter the best ${input.top} and did not score them, so delta is exact but weight and importance are over the ${outcome.evaluated} evaluated subsets only (they overstate the true weights).`,
    });
  }
  if (outcome.rankDeficient > 0) {
    out.push({
      code: 'rank_deficient_subsets',
      message:
        outcome.rankDeficientRule === 'skip'
          ? `${outcome.rankDeficient} subsets have aliased design columns (see conventions.rank); each spans the column space of a smaller subset, so it was passed over and takes no part in weights or importance — counting it would count that model twice.`
          : `${outcome.rankDeficient} subsets have aliased design columns; each is scored with k = its numerical rank + 1, as a comparison would, so it repeats the score of a smaller subset with one more term.`,
    });
  }
  if (outcome.sameColumnSpace > 0) {
    out.push({
      code: 'same_column_space_subsets',
      message: `${outcome.sameColumnSpace} subsets span exactly the column space of another subset (some pool columns are exact linear combinations of others), so they are the same model — same fitted values, RSS and k. Each such model is counted once, as the subset whose terms come first in pool order; the others were passed over and take no part in weights or importance.`,
    });
  }
  if (exact.exactFits > 0) {
    const shown = exact.exactFitNames.length;
    const names = exact.exactFitNames.map((n) => JSON.stringify(n)).join(', ');
    out.push({
      code: 'exact_fit_subsets',
      message: `${exact.exactFits} subsets reproduce the response exactly (residuals at rounding level)${shown > 0 ? `${shown < exact.exactFits ? ', among them' : ':'} ${names}` : ''}. Their Gaussian log-likelihood is unbounded, so they have no criterion value; they are left out of delta, weights, importance and the list of best models, which rank the remaining subsets only. An exact fit usually means the response is computed from these terms rather than measured: check the data before reading the ranking.`,
    });
  }
  if (outcome.unscorable > 0) {
    out.push({
      code: 'unscorable_subsets',
      message: `${outcome.unscorable} subsets have no value of the ranking criterion (too few rows for their parameters; AICc needs n - k - 1 > 0) and take no part in weights or importance.`,
    });
  }
  return out;
}
