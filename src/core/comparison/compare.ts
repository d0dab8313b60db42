// A comparison from start to finish: the rows every candidate is scored on, the
// response and weights, each candidate (fitted here or elsewhere) under the one
// convention, rankings under every criterion, the verdict. Returns the result,
// or every issue that prevents it (never throws for input).
import { columnsUsedBy, sampleRows } from '../design/index.ts';
import type { CriterionName, RankingCriterion } from '../scoring/criteria.ts';
import { verdict, type Verdict } from '../scoring/verdict.ts';
import { issue, type Issue } from '../issues.ts';
import { datasetFingerprint } from '../fingerprint.ts';
import { chooseRankBy, type Policy } from '../scoring/policy.ts';
import type { Columns } from '../types.ts';
import type { ModelResult } from '../models/model-result.ts';
import { kindConventions, scoreCandidates, type CandidateInput } from '../models/registry.ts';
import { expressionColumnsUsed } from '../models/nonlinear/columns-used.ts';
import { NONLINEAR_CONVENTIONS } from '../models/nonlinear/conventions.ts';
import type { ScoringContext } from '../models/scoring-context.ts';
import { estimationIssues } from './estimation-rules.ts';
import { measureMixIssue } from './measure-mix.ts';
import { overdispersionCriteria, quasiRankByIssue, unscaledRankingCaution, type OverdispersionRequest, type OverdispersionResult } from './overdispersion.ts';
import { glmExtraColumns } from '../models/glm/candidate.ts';
import { rankAll, type BandedEntry } from '../scoring/rankings.ts';
import { checksCaution, comparisonCautions, type Caution } from '../scoring/cautions.ts';
import { conventions, type Conventions } from './conventions.ts';
import { comparisonExtras, type Extras, type ExtrasOptions } from './extras/index.ts';
import { averagingCautions } from './extras/averaging.ts';
import { trialsUse } from './trials-use.ts';
import { DEFAULT_INTERVAL_LEVEL } from '../inference/coefficient-tests.ts';
import { lifePicture, type CensoringColumns, type LifePicture } from '../models/lifetime/index.ts';
import { censoredSample, censoringRowColumns } from './censored-sample.ts';
import { lifetimeCautions, lifetimeConventions } from './lifetime-conventions.ts';
import { lifePictureDecision } from './life-picture-budget.ts';

export type { CandidateInput } from '../models/registry.ts';

export interface ComparisonInput {
  /** Null when the request sends no data (every candidate stated by rss or logLikelihood). */
  columns: Columns | null;
  response: string | null;
  weights: string | null;
  candidates: CandidateInput[];
  /** The request's own choices; the policy fills what it leaves out. */
  rankBy?: RankingCriterion;
  /** Where the request gave rankBy, to name it in a refusal (default options.rankBy). */
  rankByPath?: string[];
  confidenceLevel?: number;
  /** Confidence level of coefficient and prediction intervals (default 0.95). */
  intervalLevel?: number;
  expectedFingerprint?: string;
  /** The request-level trials column, read by binomial candidates (each carries it too). */
  trials?: string | null;
  /** Request-level censoring: the status column and the upper column of interval rows. */
  censoring?: CensoringColumns | null;
  /** options.percentiles, read by lifetime models. */
  percentiles?: readonly number[];
  /** options.survivalAt, read by lifetime models. */
  survivalAt?: readonly number[];
  extras?: ExtrasOptions;
  /** QAIC and QAICc under one ĉ, given or estimated (options.overdispersion). */
  overdispersion?: OverdispersionRequest;
  policy: Policy;
  policyHash: string;
}

export interface ComparisonOutcome {
  conventions: Conventions;
  policy: { name: string; hash: string };
  dataset: { fingerprint: string | null; observations: number; rowsDropped: number; response: string | null; weights: string | null };
  models: ModelResult[];
  rankings: Record<CriterionName | 'loo', BandedEntry[]> & Partial<Record<'qaic' | 'qaicc', BandedEntry[]>>;
  overdispersion?: Omit<OverdispersionResult, 'values' | 'rankings'>;
  verdict: Verdict;
  nestedTests: Extras['nestedTests'];
  averaged: Extras['averaged'];
  cautions: Caution[];
  /** With life models: what the life-data picture draws (lifetime/life-picture.ts). */
  lifePicture?: LifePicture;
}

/** The data columns a candidate reads besides the response and weights: its terms, and a GLM's offset and trials. */
function candidateColumns(c: CandidateInput): string[] {
  if (c.form === 'fit') return columnsUsedBy(c.terms);
  if (c.form === 'glm') return [...columnsUsedBy(c.terms), ...glmExtraColumns(c)];
  if (c.form === 'fitted') return glmExtraColumns(c);
  if (c.form === 'lifetime') return columnsUsedBy(c.terms);
  return [];
}

/** Trials columns no candidate also reads as a term or offset: prediction rows need not carry them. */
function trialsOnlyColumns(input: ComparisonInput): Set<string> {
  const out = new Set(input.candidates.flatMap((c) => ((c.form === 'glm' || c.form === 'fitted') && c.family === 'binomial' && c.trials ? [c.trials] : [])));
  if (out.size === 0 || !input.columns) return out;
  for (const c of input.candidates) {
    const read = c.form === 'expression' ? expressionColumnsUsed(c, input.columns)
      : c.form === 'glm' ? [...columnsUsedBy(c.terms), ...(c.offset ? [c.offset] : [])]
        : c.form === 'fitted' ? [] : candidateColumns(c);
    for (const column of read) out.delete(column);
  }
  return out;
}

type Rows = { ctx: ScoringContext; dropped: number; used: string[]; missingWeights: number; zeroWeights: number };

/** The rows, response and weights every candidate is scored on. */
function scoringRows(input: ComparisonInput, issues: Issue[]): Rows | null {
  const { columns, candidates } = input;
  if (!columns || input.response === null) {
    candidates.forEach((c, i) => {
      if (c.form === 'fit' || c.form === 'glm' || c.form === 'lifetime' || c.form === 'expression' || (c.form === 'residuals' && c.response)) issues.push(issue('data_required', ['candidates', i], { form: c.form === 'residuals' ? 'a response transform' : 'a candidate fitted here' }));
      if (c.form === 'fitted') issues.push(issue('data_required', ['candidates', i], { form: 'a candidate sent by its fitted means' }));
    });
    if (input.weights) issues.push(issue('data_required', ['weights'], { form: 'a weights column' }));
    const first = candidates[0];
    const n = first.form === 'residuals' ? first.residuals.length : 'observations' in first ? first.observations : 0;
    const nSource = `candidate ${JSON.stringify(first.name)} ${first.form === 'residuals' ? 'has residuals for' : 'states'}`;
    return { ctx: { n, rows: null, dataRows: null, y: null, weights: null, nSource }, dropped: 0, used: [], missingWeights: 0, zeroWeights: 0 };
  }
  const termColumns = [...new Set([
    ...candidates.flatMap((c) => (c.form === 'expression' ? expressionColumnsUsed(c, columns) : candidateColumns(c))),
    ...censoringRowColumns(input.censoring ?? null),
  ])];
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
  // Before any row is read or model fitted: a trials column nobody reads is a request to fix.
  const trials = trialsUse(input.trials, input.candidates);
  if ('issue' in trials) return { issues: [trials.issue] };
  const issues: Issue[] = [];
  const scoring = scoringRows(input, issues);
  if (!scoring) return { issues };
  const { ctx, dropped, used } = scoring;
  const intervalLevel = input.intervalLevel ?? DEFAULT_INTERVAL_LEVEL;

  issues.push(...estimationIssues(input.candidates.map((c, index) => ({
    name: c.name, index, estimation: c.form === 'logLikelihood' ? c.estimation : 'ml', fixedEffects: c.form === 'logLikelihood' ? c.fixedEffects : undefined,
  }))));

  const censored = censoredSample({ ...input, censoring: input.censoring ?? null }, ctx, issues);
  if (issues.length > 0) return { issues };
  const scored = scoreCandidates(input.candidates, { columns: input.columns, ctx, intervalLevel: input.intervalLevel, censored, percentiles: input.percentiles,
    survivalAt: input.survivalAt, predicting: input.extras?.predict !== undefined,
  }, issues);
  const models: ModelResult[] = scored.map((m) => m.report);
  const mixed = issues.length === 0 ? measureMixIssue(scored) : null;
  if (mixed) issues.push(mixed);

  if (issues.length > 0) return { issues };
  // Only once every used column is known to exist and hold values on the used rows.
  const fingerprint = input.columns && ctx.rows
    // The upper column decides interval rows' likelihood, so it is part of the data the answer rests on.
    ? datasetFingerprint({ columns: input.columns, response: input.response!, weights: input.weights, used: [...used, ...(input.censoring?.upper ? [input.censoring.upper] : [])], rows: ctx.rows })
    : null;
  if (input.expectedFingerprint && input.expectedFingerprint !== fingerprint) {
    return { issues: [issue('fingerprint_mismatch', ['datasetFingerprint'], { expected: input.expectedFingerprint, actual: fingerprint })] };
  }

  const refusedRankBy = quasiRankByIssue(input);
  if (refusedRankBy) return { issues: [refusedRankBy] };
  const largestK = Math.max(...models.map((m) => m.parameters));
  const ratio = largestK > 0 ? ctx.n / largestK : null;
  const choice = chooseRankBy(input.rankBy, input.policy, ratio, input.overdispersion !== undefined);
  const confidenceLevel = input.confidenceLevel ?? input.policy.confidenceLevel;
  const quasi = input.overdispersion ? overdispersionCriteria(models, input.overdispersion, confidenceLevel, input.policy) : null;
  if (quasi && 'code' in quasi) return { issues: [quasi] };
  if (quasi) quasi.values.forEach((v, i) => Object.assign(models[i], { qaic: v.qaic, qaicc: v.qaicc }));
  // QAIC and QAICc, when present, rank, weigh and average like the others.
  const rankings = { ...rankAll(models, confidenceLevel, input.policy), ...(quasi ? quasi.rankings : {}) };
  const parameters = Object.fromEntries(models.map((m) => [m.name, m.parameters]));
  const trialsColumns = trialsOnlyColumns(input);
  const extras = comparisonExtras({
    columns: input.columns, rows: ctx.rows, weights: ctx.weights?.values, weightsColumn: input.weights, intervalLevel,
    // The status and trials columns decide rows and likelihoods but are no terms: prediction rows need not carry them
    // (a binomial predicts the success probability per trial).
    sample: JSON.stringify([input.response, input.weights]), lifetimeSample: JSON.stringify([input.response, input.censoring ?? null]), termColumns: used.filter((c) => c !== input.censoring?.status && !trialsColumns.has(c)),
    scored, models, rankings, rankBy: choice.rankBy, options: input.extras ?? {},
  });
  if ('issues' in extras) return extras;
  const lifeCurves = scored.flatMap((m) => (m.capabilities.lifeCurve ? [m.capabilities.lifeCurve] : []));
  const pictureDecision = lifePictureDecision(input);
  const picture = censored && lifeCurves.length > 0 && pictureDecision.draw ? lifePicture(censored, lifeCurves, intervalLevel) : null;

  return {
    result: {
      conventions: {
        ...conventions(choice, confidenceLevel, intervalLevel),
        ...kindConventions(input.candidates),
        ...lifetimeConventions(input.candidates),
        ...(input.candidates.some((c) => c.form === 'expression') ? { nonlinear: NONLINEAR_CONVENTIONS } : {}),
      },
      policy: { name: input.policy.name, hash: input.policyHash },
      dataset: { fingerprint, observations: ctx.n, rowsDropped: dropped, response: input.response, weights: input.weights },
      models,
      rankings: { ...rankings, loo: extras.loo.map((e) => ({ ...e, band: null })) },
      ...(quasi ? { overdispersion: { cHat: quasi.cHat, source: quasi.source, df: quasi.df, belowOne: quasi.belowOne } } : {}),
      verdict: verdict(rankings, choice.rankBy, { parameters, observations: ctx.n, cHat: quasi?.cHat ?? null }),
      nestedTests: extras.nestedTests,
      averaged: extras.averaged,
      cautions: [
        ...comparisonCautions({
          dropped, n: ctx.n, hasData: input.columns !== null, models, requestedRankBy: input.rankBy, ratio, policy: input.policy,
          weights: input.weights, missingWeights: scoring.missingWeights, zeroWeights: scoring.zeroWeights,
        }),
        ...checksCaution(models),
        ...averagingCautions(extras.averaged, rankings[choice.rankBy] ?? []),
        ...lifetimeCautions(input.candidates),
        ...pictureDecision.cautions,
        ...unscaledRankingCaution(quasi, choice.rankBy),
        ...trials.cautions,
      ],
      ...(picture ? { lifePicture: picture } : {}),
    },
  };
}
