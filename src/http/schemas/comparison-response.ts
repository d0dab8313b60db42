// POST /v1/comparisons response. Numbers that do not exist are null, never NaN
// or Infinity, and a caution says why.
import { z } from 'zod';
import { Criterion } from './comparison-request.ts';
import { Averaged, Diagnostics, NestedTest, Prediction } from './comparison-extras.ts';
import { GlmConventions, GlmModelFields, OverdispersionResult } from './glm.ts';
import { LIFETIME_MODEL_FIELDS, LifetimeConventions } from './lifetime.ts';
import { LifePicture } from './life-picture.ts';
import { NonlinearConventions } from './nonlinear-candidate.ts';

const nullableNumber = z.number().nullable();

export const Caution = z
  .strictObject({
    code: z.string().meta({ description: 'A stable machine-readable reason.' }),
    message: z.string().meta({ description: 'The same reason in plain words.' }),
  })
  .meta({ id: 'Caution' });

export const Coefficient = z
  .strictObject({
    term: z.string().meta({ description: 'Readable label of the design column, e.g. "intercept", "peakTemp^2", "log(moisture)", "kiln=west", "peakTemp×kiln=west".' }),
    estimate: nullableNumber,
    standardError: nullableNumber,
    tStatistic: nullableNumber.meta({ description: 'estimate / standardError; null when either is missing or the standard error is 0.' }),
    pValue: nullableNumber.meta({ description: 'Two-sided p-value of tStatistic from Student\'s t with n − p degrees of freedom (conventions.inference).' }),
    lower: nullableNumber.meta({ description: 'Lower end of the confidence interval at options.intervalLevel: estimate − t · standardError.' }),
    upper: nullableNumber.meta({ description: 'Upper end of the confidence interval at options.intervalLevel.' }),
  })
  .meta({ id: 'Coefficient', description: 'One design column\'s coefficient. The test and interval exist for models fitted here (from rows or a summary); null where the standard error does not.' });

export const ModelResult = z
  .strictObject({
    name: z.string(),
    source: z.enum(['fit', 'residuals', 'rss', 'logLikelihood', 'fitted', 'lifetime']).meta({
      description: '"fit": fitted here (least squares or a generalised linear model); "lifetime": a life distribution fitted here by maximum likelihood; otherwise the form in which a model fitted elsewhere was sent ("fitted": its fitted means).',
    }),
    estimation: z.enum(['ml', 'reml']),
    intercept: z.boolean().nullable().meta({ description: 'Null for a model fitted elsewhere.' }),
    parameters: z.number().int().meta({ description: 'k: numerical rank of the design plus one for the error variance.' }),
    observations: z.number().int(),
    logLikelihood: nullableNumber,
    aic: nullableNumber,
    aicc: nullableNumber,
    bic: nullableNumber,
    hqc: nullableNumber,
    rss: nullableNumber.meta({ description: 'Residual sum of squares (weighted: sum of w·e²).' }),
    r2: nullableNumber,
    adjustedR2: nullableNumber,
    r2Basis: z.enum(['centred', 'uncentred']).nullable().meta({
      description: 'centred: about the (weighted) mean of the response; uncentred (model without intercept): about zero; null when R² is not available.',
    }),
    sigma: nullableNumber.meta({ description: 'Residual standard error sqrt(rss/(n - rank)).' }),
    responseTransform: z
      .strictObject({ fn: z.enum(['log', 'sqrt', 'boxcox']), lambda: z.number().optional(), jacobian: z.number() })
      .nullable()
      .meta({ description: 'The response transform the model describes, with the log-Jacobian added to its log-likelihood.' }),
    coefficients: z.array(Coefficient),
    aliased: z.array(z.string()).meta({ description: 'Design columns that are (numerically) linear combinations of the columns before them; their estimates are null.' }),
    conditionNumber: nullableNumber.meta({ description: 'Condition number estimate of the centred, scaled design the solver factorised.' }),
    press: nullableNumber.meta({ description: 'Exact leave-one-out prediction error sum of squares Σ w (e/(1−h))² from the hat matrix; null fitted elsewhere.' }),
    looRmse: nullableNumber.meta({ description: 'sqrt(press / Σw): the weighted root-mean-square leave-one-out error, in units of the response; sqrt(press / n) without weights.' }),
    diagnostics: Diagnostics.nullable(),
    predictions: z.array(Prediction).nullable(),
    predictionScale: z
      .strictObject({
        backTransform: z.enum(['none', 'median', 'inverseLink']).meta({ description: 'none: a model of the response itself; median: a model of a transformed response, taken back to the original scale as the median; inverseLink: a generalised linear model\'s mean (the success probability for the binomial), its interval built on the link scale and both ends mapped by the inverse link.' }),
        description: z.string(),
      })
      .nullable()
      .meta({ description: 'How predictions relate to the response as sent; null when no predictions were asked for. Predictions are always on the response\'s original scale.' }),
    cautions: z.array(Caution),
    ...GlmModelFields,
    qaic: nullableNumber.optional().meta({ description: 'QAIC under options.overdispersion; absent without it.' }),
    qaicc: nullableNumber.optional(),
    ...LIFETIME_MODEL_FIELDS,
    expression: z.string().optional().meta({ description: 'A nonlinear candidate\'s expression as sent (its coefficients are its parameters, term = parameter name).' }),
  })
  .meta({ id: 'ModelResult' });

export const RankingEntry = z
  .strictObject({
    rank: z.number().int().nullable().meta({ description: 'Competition rank (ties share a rank); null when the model has no value.' }),
    name: z.string(),
    value: nullableNumber,
    delta: nullableNumber.meta({ description: 'Distance from the best, always >= 0 (for adjustedR2: best - value).' }),
    weight: nullableNumber.meta({ description: 'Akaike weight (for bic: approximate posterior probability under equal prior odds); null for adjustedR2.' }),
    evidenceRatio: nullableNumber,
    cumulativeWeight: nullableNumber,
    inConfidenceSet: z.boolean().nullable(),
    band: z.string().nullable().meta({ description: 'The team policy\'s wording for this Δ (null for adjustedR2 and for models without a value).' }),
  })
  .meta({ id: 'RankingEntry' });

const Ranking = z.array(RankingEntry);

export const Verdict = z
  .strictObject({
    agree: z.boolean().meta({ description: 'True when every criterion that ranked a model picks the same one; with options.overdispersion QAIC and QAICc count too, so a model that wins only on the unscaled likelihood does not make the criteria agree.' }),
    best: z.strictObject({
      aicc: z.string().nullable(),
      aic: z.string().nullable(),
      bic: z.string().nullable(),
      hqc: z.string().nullable(),
      adjustedR2: z.string().nullable(),
      qaic: z.string().nullable().optional().meta({ description: 'With options.overdispersion only.' }),
      qaicc: z.string().nullable().optional().meta({ description: 'With options.overdispersion only.' }),
    }),
    rankBy: Criterion,
    chosen: z.string().nullable().meta({ description: 'The best model under rankBy.' }),
    summary: z.string().meta({ description: 'One plain-language account of what the criteria pick and why they may differ.' }),
    leanings: z
      .array(z.strictObject({ model: z.string(), parameters: z.number().int().nullable(), criteria: z.array(Criterion) }))
      .meta({ description: 'The picks grouped by model, most parameters first.' }),
    tiesForFirst: z
      .partialRecord(Criterion, z.array(z.string()))
      .meta({ description: 'Criteria on which two or more models tie for first, with their names.' }),
  })
  .meta({ id: 'Verdict' });

export const Conventions = z
  .strictObject({
    version: z.string(),
    parameterCount: z.string(),
    logLikelihood: z.string(),
    weights: z.string(),
    r2: z.string(),
    commonRows: z.string(),
    rank: z.string(),
    rankBy: Criterion,
    fittedElsewhere: z.string(),
    responseTransforms: z.string(),
    rankByReason: z.string(),
    confidenceLevel: z.number(),
    inference: z.string().meta({ description: 'How coefficients are tested and their intervals built.' }),
    predictions: z.string().meta({ description: 'How predictions, their intervals, back-transforms and averages are made.' }),
    intervalLevel: z.number().meta({ description: 'Confidence level of coefficient and prediction intervals (options.intervalLevel, default 0.95).' }),
    glm: GlmConventions.optional().meta({ description: 'The convention of generalised linear models, present when the comparison has one.' }),
    lifetime: LifetimeConventions,
    nonlinear: NonlinearConventions.optional().meta({ description: 'The convention of nonlinear candidates; present when the comparison has one.' }),
  })
  .meta({ id: 'Conventions' });

export const Dataset = z
  .strictObject({
    fingerprint: z.string().nullable().meta({ description: '"sha256:" + hex digest of the canonical serialisation of the used data (README: dataset fingerprint); null when no data were sent.' }),
    observations: z.number().int(),
    rowsDropped: z.number().int(),
    response: z.string().nullable(),
    weights: z.string().nullable(),
  })
  .meta({ id: 'Dataset' });

export const ComparisonResult = z
  .strictObject({
    id: z.string(),
    createdAt: z.string(),
    serviceVersion: z.string(),
    conventions: Conventions,
    policy: z.strictObject({ name: z.string(), hash: z.string() }).meta({ description: 'The team policy in force (POLICY_FILE) and the SHA-256 of its canonical JSON.' }),
    dataset: Dataset,
    models: z.array(ModelResult),
    rankings: z.strictObject({
      aicc: Ranking,
      aic: Ranking,
      bic: Ranking,
      hqc: Ranking,
      adjustedR2: Ranking,
      loo: Ranking.meta({ description: 'By looRmse, smaller is better; no weights.' }),
      qaic: Ranking.optional().meta({ description: 'By QAIC, with options.overdispersion only.' }),
      qaicc: Ranking.optional().meta({ description: 'By QAICc, with options.overdispersion only.' }),
    }),
    overdispersion: OverdispersionResult.optional().meta({ description: 'The ĉ behind rankings.qaic and rankings.qaicc.' }),
    verdict: Verdict,
    nestedTests: z.array(NestedTest),
    averaged: Averaged.nullable(),
    cautions: z.array(Caution),
    lifePicture: LifePicture.optional(),
  })
  .meta({ id: 'ComparisonResult' });

export type ComparisonResult = z.output<typeof ComparisonResult>;
