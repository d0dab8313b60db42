// The answer to a search request: the best subsets refitted exactly as a
// comparison fits a candidate (QR on the rows through fitCandidate, or the
// summary fit), so their numbers equal a comparison's to the last digit,
// with delta and weight over every evaluated subset, term importance,
// conventions and cautions.
import { buildDesign } from '../design/index.ts';
import type { CriterionName } from '../criteria.ts';
import { chooseRankBy, type Policy, type RankByChoice } from '../policy.ts';
import type { Term } from '../types.ts';
import { fitCandidate, type ModelResult } from '../comparison/fitted-model.ts';
import { conventions, type Conventions } from '../comparison/conventions.ts';
import type { Caution } from '../comparison/cautions.ts';
import { fitFromSummary, summaryModelResult } from '../summary/index.ts';
import { subsetName, type PreparedSearch } from './request-problem.ts';
import type { SearchOutcome } from './result.ts';
import type { SearchCriterion } from './types.ts';
import { searchCautions } from './search-cautions.ts';

export type SearchModel = ModelResult & { terms: Term[]; delta: number; weight: number };

export interface SearchReport {
  conventions: Conventions;
  policy: { name: string; hash: string };
  dataset: { fingerprint: string; observations: number; rowsDropped: number; response: string; weights: string | null };
  models: SearchModel[];
  importance: { term: Term; label: string; weight: number }[];
  cautions: Caution[];
}

/** The criterion a search ranks by: the request's, else the policy's, unless that is adjusted R² (no weights over subsets). */
export function searchRankBy(requested: SearchCriterion | undefined, policy: Policy, ratio: number | null): RankByChoice & { rankBy: SearchCriterion } {
  const choice = chooseRankBy(requested, policy, ratio);
  if (choice.rankBy === 'adjustedR2') {
    return { rankBy: 'aicc', reason: `policy ${JSON.stringify(policy.name)} ranks by adjusted R², which gives no weights over subsets; a search ranks by AICc instead` };
  }
  return choice as RankByChoice & { rankBy: SearchCriterion };
}

function refit(prepared: PreparedSearch, terms: Term[], poolIndices: number[]): ModelResult {
  const { input, source } = prepared;
  const name = subsetName(terms, input.intercept);
  if (source.kind === 'rows') {
    const built = buildDesign(source.columns, terms, input.intercept, source.rows);
    // The same design the search summarised, so it cannot fail here.
    if ('issues' in built) throw new Error(`refit of ${name}: ${built.issues[0].message}`);
    return fitCandidate({ name, terms, intercept: input.intercept }, built.design, { values: source.y, jacobian: 0 }, source.weights).result;
  }
  const predictors = [...poolIndices.map((t) => source.pool[t]), ...source.always];
  const fit = fitFromSummary(source.summary, input.response, predictors, input.intercept);
  if (!fit.ok) throw new Error(`refit of ${name}: ${fit.issues[0].message}`);
  return summaryModelResult(name, fit.fit, source.summary, input.response, input.intercept);
}

export function searchReport(
  prepared: PreparedSearch,
  outcome: SearchOutcome,
  choice: RankByChoice & { rankBy: SearchCriterion },
  policy: { policy: Policy; hash: string },
): SearchReport {
  const { input, problem } = prepared;
  const criterion: CriterionName = choice.rankBy;
  const refitted = outcome.models.map((s) => {
    const terms = [...s.terms.map((t) => input.pool[t]), ...input.always];
    const result = refit(prepared, terms, s.terms);
    return { result, terms, value: result[criterion] ?? s.value, size: s.terms.length };
  });
  refitted.sort((a, b) => a.value - b.value || a.size - b.size);
  // weight = exp(-delta/2) / sum over every evaluated subset of exp(-(value - min)/2); the kernel's
  // best has delta 0, so its weight is 1 / that sum. The refitted best is the kernel's best refitted.
  const best = refitted.length > 0 ? refitted[0].value : 0;
  const total = outcome.models.length > 0 ? 1 / outcome.models[0].weight : 1;
  const models = refitted.map((r) => {
    const delta = r.value - best;
    return { ...r.result, terms: r.terms, delta, weight: Math.exp(-delta / 2) / total };
  });
  const observations = problem.observations;
  const source = prepared.source;
  return {
    conventions: conventions(choice, policy.policy.confidenceLevel),
    policy: { name: policy.policy.name, hash: policy.hash },
    dataset: {
      fingerprint: prepared.fingerprint,
      observations,
      rowsDropped: source.kind === 'rows' ? source.dropped : 0,
      response: input.response,
      weights: source.kind === 'rows' ? input.weights : source.summary.weights ? '(summary)' : null,
    },
    models,
    importance: outcome.importance.map(({ term, weight }) => ({ term: input.pool[term], label: subsetName([input.pool[term]], true), weight })),
    cautions: searchCautions(prepared, outcome),
  };
}
