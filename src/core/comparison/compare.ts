// A comparison from start to finish: the rows every candidate is scored on, the
// response and weights, each candidate (fitted here or elsewhere) under the one
// convention, rankings under every criterion, the verdict. Returns the result,
// or every issue that prevents it (never throws for input).
import { columnsUsedBy, sampleRows } from '../design/index.ts';
import type { CriterionName } from '../scoring/criteria.ts';
import { verdict, type Verdict } from '../scoring/verdict.ts';
import { issue, type Issue } from '../issues.ts';
import { datasetFingerprint } from '../fingerprint.ts';
import { chooseRankBy, type Policy } from '../scoring/policy.ts';
import type { Columns } from '../types.ts';
import type { ModelResult } from '../models/model-result.ts';
import { scoreCandidates, type CandidateInput } from '../models/registry.ts';
import { expressionColumnsUsed } from '../models/nonlinear/columns-used.ts';
import { NONLINEAR_CONVENTIONS } from '../models/nonlinear/conventions.ts';
import type { ScoringContext } from '../models/scoring-context.ts';
import { estimationIssues } from './estimation-rules.ts';
import { rankAll, type BandedEntry } from '../scoring/rankings.ts';
import { checksCaution, comparisonCautions, type Caution } from '../scoring/cautions.ts';
import { conventions, type Conventions } from './conventions.ts';
import { comparisonExtras, type Extras, type ExtrasOptions } from './extras/index.ts';
import { averagingCautions } from './extras/averaging.ts';
import { DEFAULT_INTERVAL_LEVEL } from '../inference/coefficient-tests.ts';

export type { CandidateInput } from '../models/registry.ts';

export interface ComparisonInput {
  /** Null when the request sends no data (every candidate stated by rss or logLikelihood). */
  columns: Columns | null;
  response: string | null;
  weights: string | null;
  candidates: CandidateInput[];
  /** The request's own choices; the policy fills what it leaves out. */
  rankBy?: CriterionName;
  confidenceLevel?: number;
  /** Confidence level of coefficient and prediction intervals (default 0.95). */
  intervalLevel?: number;
  expectedFingerprint?: string;
  extras?: ExtrasOptions;
  policy: Policy;
  policyHash: string;
}

export interface ComparisonOutcome {
  conventions: Conventions;
  policy: { name: string; hash: string };
  dataset: { fingerprint: string | null; observations: number; rowsDropped: number; response: string | null; weights: string | null };
  models: ModelResult[];
  rankings: Record<CriterionName | 'loo', BandedEntry[]>;
  verdict: Verdict;
  nestedTests: Extras['nestedTests'];
  averaged: Extras['averaged'];
  cautions: Caution[];
}

type Rows = { ctx: ScoringContext; dropped: number; used: string[]; missingWeights: number; zeroWeights: number };

/** The rows, response and weights every candidate is scored on. */
function scoringRows(input: ComparisonInput, issues: Issue[]): Rows | null {
  const { columns, candidates } = input;
  if (!columns || input.response === null) {
    candidates.forEach((c, i) => {
      if (c.form === 'fit' || c.form === 'expression' || (c.form === 'residuals' && c.response)) issues.push(issue('data_required', ['candidates', i], { form: c.form === 'residuals' ? 'a response transform' : 'a candidate fitted here' }));
    });
    if (input.weights) issues.push(issue('data_required', ['weights'], { form: 'a weights column' }));
    const first = candidates[0];
    const n = first.form === 'residuals' ? first.residuals.length : 'observations' in first ? first.observations : 0;
    const nSource = `candidate ${JSON.stringify(first.name)} ${first.form === 'residuals' ? 'has residuals for' : 'states'}`;
    return { ctx: { n, rows: null, dataRows: null, y: null, weights: null, nSource }, dropped: 0, used: [], missingWeights: 0, zeroWeights: 0 };
  }
  const termColumns = [...new Set(candidates.flatMap((c) => (
    c.form === 'fit' ? columnsUsedBy(c.terms) : c.form === 'expression' ? expressionColumnsUsed(c, columns) : []
  )))];
  const sample = sampleRows(columns, input.response, input.weights, termColumns);
  if ('issues' in sample) {
    issues.push(...sample.issues);
    return null;
  }
  const { rows, dropped } = sample;
  return {
    ctx: {
      n: rows.length, rows, dataRows: rows.length + dropped, y: sample.y, weights: sample.weights,
      nSource: 'the rows this comparison uses number',
    },
    dropped,
    used: termColumns,
    missingWeights: sample.missingWeights,
    zeroWeights: sample.zeroWeights,
  };
}

export function compareModels(
  input: ComparisonInput,
): { result: ComparisonOutcome } | { issues: Issue[] } {
  const issues: Issue[] = [];
  const scoring = scoringRows(input, issues);
  if (!scoring) return { issues };
  const { ctx, dropped, used } = scoring;
  const intervalLevel = input.intervalLevel ?? DEFAULT_INTERVAL_LEVEL;

  issues.push(...estimationIssues(input.candidates.map((c, index) => ({
    name: c.name, index, estimation: c.form === 'logLikelihood' ? c.estimation : 'ml', fixedEffects: c.form === 'logLikelihood' ? c.fixedEffects : undefined,
  }))));

  const scored = scoreCandidates(input.candidates, { columns: input.columns, ctx, intervalLevel: input.intervalLevel }, issues);
  const models: ModelResult[] = scored.map((m) => m.report);

  if (issues.length > 0) return { issues };
  // Only once every used column is known to exist and hold values on the used rows.
  const fingerprint = input.columns && ctx.rows
    ? datasetFingerprint({ columns: input.columns, response: input.response!, weights: input.weights, used, rows: ctx.rows })
    : null;
  if (input.expectedFingerprint && input.expectedFingerprint !== fingerprint) {
    return { issues: [issue('fingerprint_mismatch', ['datasetFingerprint'], { expected: input.expectedFingerprint, actual: fingerprint })] };
  }

  const largestK = Math.max(...models.map((m) => m.parameters));
  const ratio = largestK > 0 ? ctx.n / largestK : null;
  const choice = chooseRankBy(input.rankBy, input.policy, ratio);
  const confidenceLevel = input.confidenceLevel ?? input.policy.confidenceLevel;
  const rankings = rankAll(models, confidenceLevel, input.policy);
  const parameters = Object.fromEntries(models.map((m) => [m.name, m.parameters]));
  const extras = comparisonExtras({
    columns: input.columns, rows: ctx.rows, weights: ctx.weights?.values, weightsColumn: input.weights, intervalLevel,
    sample: JSON.stringify([input.response, input.weights]), termColumns: used,
    scored, models, rankings, rankBy: choice.rankBy, options: input.extras ?? {},
  });
  if ('issues' in extras) return extras;

  return {
    result: {
      conventions: {
        ...conventions(choice, confidenceLevel, intervalLevel),
        ...(input.candidates.some((c) => c.form === 'expression') ? { nonlinear: NONLINEAR_CONVENTIONS } : {}),
      },
      policy: { name: input.policy.name, hash: input.policyHash },
      dataset: { fingerprint, observations: ctx.n, rowsDropped: dropped, response: input.response, weights: input.weights },
      models,
      rankings: { ...rankings, loo: extras.loo.map((e) => ({ ...e, band: null })) },
      verdict: verdict(rankings, choice.rankBy, { parameters, observations: ctx.n }),
      nestedTests: extras.nestedTests,
      averaged: extras.averaged,
      cautions: [
        ...comparisonCautions({
          dropped, n: ctx.n, hasData: input.columns !== null, models, requestedRankBy: input.rankBy, ratio, policy: input.policy,
          weights: input.weights, missingWeights: scoring.missingWeights, zeroWeights: scoring.zeroWeights,
        }),
        ...checksCaution(models),
        ...averagingCautions(extras.averaged, rankings[choice.rankBy]),
      ],
    },
  };
}
