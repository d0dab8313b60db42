// A comparison computed from a data summary (data.summary) instead of rows:
// candidates fitted here are solved from the centred cross products; rss and
// logLikelihood candidates join as usual, since they need no rows. Residuals
// candidates and response transforms need the rows and are refused with the
// reason. Rankings, verdict, conventions and cautions are the comparison's own.
import type { CriterionName, RankingCriterion } from '../scoring/criteria.ts';
import { quasiRankByIssue } from './overdispersion.ts';
import { issue, type Issue } from '../issues.ts';
import { chooseRankBy, type Policy } from '../scoring/policy.ts';
import { verdict } from '../scoring/verdict.ts';
import {
  fitFromSummary,
  summaryFingerprint,
  summaryIssues,
  summaryModelResult,
  summaryPredictors,
  summaryResponseIssues,
  validateSummary,
  type DataSummary,
} from '../summary/index.ts';
import type { CandidateInput, ComparisonOutcome } from './compare.ts';
import { comparisonCautions, type Caution } from '../scoring/cautions.ts';
import { conventions, SWEEP_RANK_RULE } from './conventions.ts';
import { estimationIssues } from './estimation-rules.ts';
import { scoreExternalCandidate } from '../models/external/external-model.ts';
import type { ScoringContext } from '../models/scoring-context.ts';
import type { ModelResult } from '../models/model-result.ts';
import { rankAll, type BandedEntry } from '../scoring/rankings.ts';
import { rankByLeaveOneOut } from '../loo.ts';
import { summaryExtras, type SummaryFitted } from './summary-extras.ts';
import { averagingCautions } from './extras/averaging.ts';
import type { ExtrasOptions } from './extras/index.ts';
import { DEFAULT_INTERVAL_LEVEL } from '../inference/coefficient-tests.ts';

export interface SummaryComparisonInput {
  summary: DataSummary;
  response: string;
  candidates: CandidateInput[];
  /** Refused: censoring belongs to rows. */
  censoring?: unknown;
  rankBy?: RankingCriterion;
  rankByPath?: string[];
  confidenceLevel?: number;
  intervalLevel?: number;
  /** Refused from a summary (see below). */
  overdispersion?: unknown;
  expectedFingerprint?: string;
  extras?: ExtrasOptions;
  policy: Policy;
  policyHash: string;
}

export const SUMMARY_INPUT_CAUTION: Caution = {
  code: 'summary_input',
  message:
    'The data came as a summary (rows, means, centred cross products), so no rows were dropped or checked here; numbers that need the rows (residual diagnostics, leave-one-out and nested tests, which this service computes from the fitted rows) are unavailable, and the dataset fingerprint is that of the summary.',
};

function fittedFromSummary(input: SummaryComparisonInput, c: CandidateInput & { form: 'fit' }, i: number): SummaryFitted | { issues: Issue[] } {
  if (c.response) {
    return { issues: [issue('summary_rows_needed', ['candidates', i, 'response'], { form: 'a response transform', reason: 'its Jacobian sums ln g\'(y) over the rows' })] };
  }
  const terms = summaryPredictors(input.summary, c.terms, ['candidates', i, 'terms'], c.intercept);
  if ('issues' in terms) return terms;
  if (terms.predictors.length + (c.intercept ? 1 : 0) > input.summary.rows) {
    return { issues: [issue('too_few_rows', ['candidates', i], { rows: input.summary.rows, parameters: terms.predictors.length + (c.intercept ? 1 : 0) })] };
  }
  const fit = fitFromSummary(input.summary, input.response, terms.predictors, c.intercept);
  if (!fit.ok) return { issues: summaryIssues(fit.issues) };
  return {
    result: summaryModelResult(c.name, fit.fit, input.summary, input.response, c.intercept, input.intervalLevel ?? DEFAULT_INTERVAL_LEVEL),
    fit: fit.fit, predictors: terms.predictors, intercept: c.intercept,
  };
}

export function compareFromSummary(input: SummaryComparisonInput): { result: ComparisonOutcome } | { issues: Issue[] } {
  const { summary } = input;
  const invalid = validateSummary(summary);
  if (invalid.length > 0) return { issues: summaryIssues(invalid) };
  if (input.censoring) {
    return { issues: [issue('summary_rows_needed', ['censoring'], { form: 'censored observations', reason: 'each unit\'s status belongs to its row' })] };
  }
  const issues: Issue[] = [...summaryResponseIssues(summary, input.response)];
  issues.push(...estimationIssues(input.candidates.map((c, index) => ({
    name: c.name, index, estimation: c.form === 'logLikelihood' ? c.estimation : 'ml', fixedEffects: c.form === 'logLikelihood' ? c.fixedEffects : undefined,
  }))));
  if (issues.length > 0) return { issues };
  const ctx: ScoringContext = {
    n: summary.rows,
    rows: null,
    dataRows: null,
    y: null,
    weights: summary.weights ? { values: new Float64Array(0), sumLogWeights: summary.weights.sumLog } : null,
    nSource: 'the summary states rows',
  };
  const models: ModelResult[] = [];
  const fitted: SummaryFitted[] = [];
  input.candidates.forEach((c, i) => {
    if (c.form === 'fit') {
      const made = fittedFromSummary(input, c, i);
      if ('issues' in made) issues.push(...made.issues);
      else {
        models.push(made.result);
        fitted.push(made);
      }
      return;
    }
    if (c.form === 'lifetime') {
      issues.push(issue('summary_rows_needed', ['candidates', i, 'distribution'], { form: 'a lifetime candidate', reason: 'its likelihood sums over each unit\'s time and censoring' }));
      return;
    }
    if (c.form === 'expression') {
      issues.push(issue('summary_rows_needed', ['candidates', i, 'expression'], { form: 'a nonlinear candidate', reason: 'its fit evaluates the expression on every row' }));
      return;
    }
    const scored = c.form === 'residuals'
        ? { issues: [issue('summary_rows_needed', ['candidates', i, 'residuals'], { form: 'a residuals candidate', reason: 'residuals line up with rows, which a summary does not have; send its rss instead' })] }
        : c.form === 'glm' || c.form === 'fitted'
          ? { issues: [issue('summary_rows_needed', ['candidates', i], { form: 'a generalised linear model', reason: 'its likelihood sums over the rows, which a summary does not have' })] }
          : scoreExternalCandidate(c, ['candidates', i], ctx);
    if ('issues' in scored) issues.push(...scored.issues);
    else models.push(scored.result);
  });
  if (issues.length > 0) return { issues };
  const fingerprint = summaryFingerprint(summary);
  if (input.expectedFingerprint && input.expectedFingerprint !== fingerprint) {
    return { issues: [issue('fingerprint_mismatch', ['datasetFingerprint'], { expected: input.expectedFingerprint, actual: fingerprint })] };
  }
  const largestK = Math.max(...models.map((m) => m.parameters));
  const ratio = largestK > 0 ? summary.rows / largestK : null;
  const choice = chooseRankBy(input.rankBy, input.policy, ratio);
  const confidenceLevel = input.confidenceLevel ?? input.policy.confidenceLevel;
  // No model from a summary has a Pearson χ², and QAIC is for the counts a summary cannot carry.
  if (input.overdispersion) return { issues: [issue('summary_rows_needed', ['options', 'overdispersion'], { form: 'options.overdispersion', reason: 'QAIC concerns models of counts, whose likelihoods sum over the rows' })] };
  const refusedRankBy = quasiRankByIssue({ rankBy: input.rankBy, rankByPath: input.rankByPath });
  if (refusedRankBy) return { issues: [refusedRankBy] };
  const rankings: Partial<Record<RankingCriterion, BandedEntry[]>> & ReturnType<typeof rankAll> = rankAll(models, confidenceLevel, input.policy);
  const parameters = Object.fromEntries(models.map((m) => [m.name, m.parameters]));
  const intervalLevel = input.intervalLevel ?? DEFAULT_INTERVAL_LEVEL;
  const extras = summaryExtras({
    fitted, models, ranking: rankings[choice.rankBy] ?? [], criterion: choice.rankBy, over: input.extras?.average ?? 'all',
    predict: input.extras?.predict?.columns, intervalLevel,
  });
  if ('issues' in extras) return extras;
  const cautions = comparisonCautions({ dropped: 0, n: summary.rows, hasData: true, models, requestedRankBy: input.rankBy, ratio, policy: input.policy });
  cautions.splice(1, 0, SUMMARY_INPUT_CAUTION);
  cautions.push(...averagingCautions(extras.averaged, rankings[choice.rankBy] ?? []));
  return {
    result: {
      // Every fitted candidate here was solved by sweeping the summary's cross products.
      conventions: conventions(choice, confidenceLevel, intervalLevel, SWEEP_RANK_RULE),
      policy: { name: input.policy.name, hash: input.policyHash },
      dataset: { fingerprint, observations: summary.rows, rowsDropped: 0, response: input.response, weights: summary.weights ? '(summary)' : null },
      models,
      // Leave-one-out needs the rows: every model without a value, so the ranking says so.
      rankings: { ...rankings, loo: rankByLeaveOneOut(models.map((m) => ({ name: m.name, looRmse: null }))).map((e) => ({ ...e, band: null })) },
      verdict: verdict(rankings, choice.rankBy, { parameters, observations: summary.rows }),
      nestedTests: [],
      averaged: extras.averaged,
      cautions,
    },
  };
}
