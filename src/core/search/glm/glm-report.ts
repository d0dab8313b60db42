// The answer to a generalised-linear search: the best subsets refitted from
// the family's starting means by fitGlm on their own designs — exactly as a
// comparison fits the same candidate, so their numbers equal a comparison's
// — with delta and weight over every subset the search scored, term
// importance, conventions and cautions.
import { buildDesign } from '../../design/index.ts';
import { DEFAULT_INTERVAL_LEVEL } from '../../inference/coefficient-tests.ts';
import { fitGlm, GLM_CONVENTIONS, CONVERGENCE_RULE } from '../../models/glm/index.ts';
import { glmModelResult } from '../../models/glm/report.ts';
import type { ModelResult } from '../../models/model-result.ts';
import { conventions, ROWS_RANK_RULE } from '../../comparison/conventions.ts';
import type { Caution } from '../../scoring/cautions.ts';
import type { Policy, RankByChoice } from '../../scoring/policy.ts';
import type { Term } from '../../types.ts';
import type { SearchReport } from '../report.ts';
import { subsetName } from '../request-problem.ts';
import type { SearchCriterion } from '../types.ts';
import { glmSearchCautions } from './glm-cautions.ts';
import { SEARCH_GLM_PATHS, type PreparedGlmSearch } from './prepare-glm.ts';
import type { GlmSearchOutcome } from './types.ts';

/** How the subsets were searched, in words for the answer and the README. */
export const GLM_SEARCH_RULES = {
  exhaustive: 'every admissible subset fitted by IRLS: the best models are proven the best',
  stepwiseSwaps:
    'stepwise selection with swaps: from the always terms alone, and again from the whole pool, the best single addition, removal or swap of one pool term for another is taken while it lowers the criterion; a local optimum, so the best models are the best found, not proven the best (branch and bound is not used: its bounds are built from residual sums of squares, which a deviance does not have)',
} as const;

export const WARM_START_RULE = `each subset starts IRLS from the coefficients of the subset it was reached from (its new columns at 0), falling back to the family's starting means when those give no valid mean; the start changes the number of steps, not the answer, which meets the same rule (${CONVERGENCE_RULE}). The listed models are fitted again from the family's starting means, exactly as a comparison fits them`;

export interface GlmSearchReport extends Omit<SearchReport, 'exactFits'> {
  glm: {
    family: string;
    link: string;
    offset: string | null;
    trials: string | null;
    searchRule: string;
    warmStart: string;
    fitFailures: { separation: number; notConverged: number; other: number };
    solves: number;
    warmStarts: number;
  };
}

export function glmSearchReport(
  ready: PreparedGlmSearch,
  outcome: GlmSearchOutcome,
  choice: RankByChoice & { rankBy: SearchCriterion },
  policy: { policy: Policy; hash: string },
): GlmSearchReport {
  const { prepared, data, spec } = ready;
  const { input } = prepared;
  const criterion = choice.rankBy;
  const { sums } = outcome;
  const refitted: { result: ModelResult; terms: Term[]; value: number; kernelValue: number; size: number }[] = [];
  let refitFailed = 0;
  for (const s of outcome.models) {
    const terms = [...s.terms.map((t) => input.pool[t]), ...input.always];
    const name = subsetName(terms, input.intercept);
    const built = buildDesign(data.columns, terms, input.intercept, data.rows);
    if ('issues' in built) throw new Error(`refit of ${name}: ${built.issues[0].message}`);
    const fit = fitGlm({
      family: spec.family, link: spec.link, design: built.design, response: data.y, trials: data.trials, offset: data.offset,
      weights: data.weights, rows: data.rows, paths: SEARCH_GLM_PATHS,
    });
    const result = 'issues' in fit ? null : glmModelResult(name, fit, built.design.intercept, DEFAULT_INTERVAL_LEVEL);
    const value = result ? result[criterion] : null;
    if (!result || value === null) {
      // Converged from the parent's coefficients but not from the starting means: not listed (a caution says so).
      refitFailed++;
      continue;
    }
    refitted.push({ result, terms, value, kernelValue: s.value, size: s.terms.length });
  }
  refitted.sort((a, b) => a.value - b.value || a.size - b.size);
  // As for least squares (report.ts): the refitted values set delta, the search's sums the denominator.
  const best = refitted[0] ?? null;
  const offset = best ? best.kernelValue - sums.min : 0;
  const total = sums.total;
  const models = refitted.map((r) => {
    const delta = r.value - best!.value;
    return { ...r.result, terms: r.terms, delta, weight: Math.exp(-(delta + offset) / 2) / total };
  });
  const source = prepared.source;
  const rank = `every subset is fitted by IRLS, each weighted step solved by pivoted QR, where ${ROWS_RANK_RULE}; a subset with an aliased column is passed over (it repeats a smaller model)`;
  const cautions: Caution[] = glmSearchCautions(ready, outcome, refitFailed);
  return {
    conventions: { ...conventions(choice, policy.policy.confidenceLevel, DEFAULT_INTERVAL_LEVEL, rank), glm: GLM_CONVENTIONS } as SearchReport['conventions'],
    policy: { name: policy.policy.name, hash: policy.hash },
    dataset: {
      fingerprint: prepared.fingerprint,
      observations: data.rows.length,
      rowsDropped: source.kind === 'rows' ? source.dropped : 0,
      response: input.response,
      weights: input.weights,
    },
    responseTransform: null,
    models,
    importance: sums.perTerm.map((w, term) => ({
      term: input.pool[term],
      label: subsetName([input.pool[term]], true),
      weight: total > 0 && Number.isFinite(total) ? Math.min(1, Math.max(0, w / total)) : 0,
    })),
    cautions,
    glm: {
      family: data.family,
      link: data.link,
      offset: spec.offset ?? null,
      trials: data.trials ? spec.trials ?? null : null,
      searchRule: GLM_SEARCH_RULES[outcome.method],
      warmStart: WARM_START_RULE,
      fitFailures: { separation: outcome.failures.separation, notConverged: outcome.failures.notConverged, other: outcome.failures.other },
      solves: outcome.solves,
      warmStarts: outcome.warmStarts,
    },
  };
}
