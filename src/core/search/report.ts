// The answer to a search request: the best subsets refitted exactly as a
// comparison fits a candidate (QR on the rows through fitCandidate, or the
// summary fit), so their numbers equal a comparison's to the last digit,
// with delta and weight over every evaluated subset, term importance,
// conventions and cautions.
import { buildDesign } from '../design/index.ts';
import type { CriterionName } from '../scoring/criteria.ts';
import { chooseRankBy, type Policy, type RankByChoice } from '../scoring/policy.ts';
import type { Term } from '../types.ts';
import { fitCandidate } from '../models/linear/fitted-model.ts';
import type { ModelResult } from '../models/model-result.ts';
import { conventions, ROWS_RANK_RULE, SWEEP_RANK_RULE, type Conventions } from '../comparison/conventions.ts';
import type { Caution } from '../scoring/cautions.ts';
import type { ResponseTransformSpec } from '../models/response-transform.ts';
import { fitFromSummary, summaryModelResult } from '../summary/index.ts';
import { subsetName, type PreparedSearch } from './request-problem.ts';
import type { SearchOutcome } from './result.ts';
import type { SearchCriterion } from './types.ts';
import { searchCautions } from './search-cautions.ts';
import { DEFAULT_INTERVAL_LEVEL } from '../inference/coefficient-tests.ts';

export type SearchModel = ModelResult & { terms: Term[]; delta: number; weight: number };

export interface SearchReport {
  conventions: Conventions;
  policy: { name: string; hash: string };
  dataset: { fingerprint: string; observations: number; rowsDropped: number; response: string; weights: string | null };
  /** The transform every subset describes, with its Jacobian Σ ln g'(y); null for the response itself. */
  responseTransform: (ResponseTransformSpec & { jacobian: number }) | null;
  models: SearchModel[];
  importance: { term: Term; label: string; weight: number }[];
  cautions: Caution[];
  /** Subsets found to fit exactly, by the kernel's floor or by the refit of a top model; none carries a weight. */
  exactFits: number;
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
    const candidate = { name, terms, intercept: input.intercept, ...(input.responseTransform ? { response: input.responseTransform } : {}) };
    return fitCandidate(candidate, built.design, { values: source.y, jacobian: source.jacobian }, source.weights).result;
  }
  const predictors = [...poolIndices.map((t) => source.pool[t]), ...source.always];
  const fit = fitFromSummary(source.summary, input.response, predictors, input.intercept);
  if (!fit.ok) throw new Error(`refit of ${name}: ${fit.issues[0].message}`);
  return summaryModelResult(name, fit.fit, source.summary, input.response, input.intercept);
}

/** The rank rule a search applied: the sweep screens every subset; the listed models are refitted by QR on rows, or by the same sweep from a summary. */
function searchRankRule(prepared: PreparedSearch): string {
  const screen = `subsets are scored by sweeping cross products, where ${SWEEP_RANK_RULE}; a subset with an aliased column is passed over (it repeats a smaller model)`;
  return prepared.source.kind === 'rows' ? `${screen}. The listed models are refitted by QR on the rows, where ${ROWS_RANK_RULE}` : `${screen}. The listed models are solved from the summary by the same sweep`;
}

export function searchReport(
  prepared: PreparedSearch,
  outcome: SearchOutcome,
  choice: RankByChoice & { rankBy: SearchCriterion },
  policy: { policy: Policy; hash: string },
): SearchReport {
  const { input, problem } = prepared;
  const criterion: CriterionName = choice.rankBy;
  const { sums } = outcome;
  const contribution = (kernelValue: number) => Math.exp(-(kernelValue - sums.min) / 2);
  let total = sums.total;
  const perTerm = [...sums.perTerm];
  const exactFitNames = outcome.exactFitSubsets.map((t) => subsetName([...t.map((j) => input.pool[j]), ...input.always], input.intercept));
  let exactFits = outcome.exactFits;
  const refitted: { result: ModelResult; terms: Term[]; value: number; kernelValue: number; size: number }[] = [];
  for (const s of outcome.models) {
    const terms = [...s.terms.map((t) => input.pool[t]), ...input.always];
    const result = refit(prepared, terms, s.terms);
    const value = result[criterion];
    if (value === null) {
      // The refit (QR on the rows) finds residuals at rounding level where the sweep did not: an exact fit.
      // Its score was the sweep's rounding, so it is taken back out of the sums rather than kept with an invented value.
      exactFits++;
      exactFitNames.push(result.name);
      total -= contribution(s.value);
      for (const t of s.terms) perTerm[t] -= contribution(s.value);
      continue;
    }
    refitted.push({ result, terms, value, kernelValue: s.value, size: s.terms.length });
  }
  refitted.sort((a, b) => a.value - b.value || a.size - b.size);
  // weight = exp(-(value - min)/2) / sum over the counted subsets of exp(-(value_j - min)/2). The sums are the
  // kernel's; the best listed model's offset from their minimum is its kernel value's, so the refitted values
  // set delta and the kernel's sums the denominator. Taking a subset back out cannot leave less than the listed models hold.
  const listed = refitted.reduce((acc, r) => acc + contribution(r.kernelValue), 0);
  total = Math.max(total, listed);
  const best = refitted.length > 0 ? refitted[0] : null;
  const offset = best ? best.kernelValue - sums.min : 0;
  const models = refitted.map((r) => {
    const delta = r.value - (best as (typeof refitted)[number]).value;
    return { ...r.result, terms: r.terms, delta, weight: Math.exp(-(delta + offset) / 2) / total };
  });
  const observations = problem.observations;
  const source = prepared.source;
  return {
    conventions: conventions(choice, policy.policy.confidenceLevel, DEFAULT_INTERVAL_LEVEL, searchRankRule(prepared)),
    policy: { name: policy.policy.name, hash: policy.hash },
    dataset: {
      fingerprint: prepared.fingerprint,
      observations,
      rowsDropped: source.kind === 'rows' ? source.dropped : 0,
      response: input.response,
      weights: source.kind === 'rows' ? input.weights : source.summary.weights ? '(summary)' : null,
    },
    responseTransform: input.responseTransform && source.kind === 'rows' ? { ...input.responseTransform, jacobian: source.jacobian } : null,
    models,
    importance: perTerm.map((w, term) => ({
      term: input.pool[term],
      label: subsetName([input.pool[term]], true),
      weight: total > 0 && Number.isFinite(total) ? Math.min(1, Math.max(0, w / total)) : 0,
    })),
    cautions: searchCautions(prepared, outcome, { exactFits, exactFitNames }),
    exactFits,
  };
}
