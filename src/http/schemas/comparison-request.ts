// POST /v1/comparisons request: the single source of its validation, its
// TypeScript type and its part of the OpenAPI document.
import { z } from 'zod';
import { ColumnName, Criterion, FiniteNumber, Term } from './common.ts';
import { PairToTest } from './comparison-extras.ts';
import { SummaryData } from './summary.ts';
import { FittedMeansCandidate, GlmCandidateFields, OverdispersionOption, TrialsColumn } from './glm.ts';
import { Censoring, LifetimeCandidate, Percentiles, SurvivalTimes } from './lifetime.ts';
import { nonlinearCandidate } from './nonlinear-candidate.ts';
import { isMissingMarker, readsAsNumber } from '../../core/design/text-values.ts';

export { Criterion, criterionNames } from './common.ts';

const ColumnValuesSchema = z
  .array(
    z.union([FiniteNumber, z.string().max(200), z.null()], {
      error: (issue) =>
        typeof issue.input === 'number'
          ? 'numbers must be finite (a JSON number beyond ±1.8e308 overflows to infinity)'
          : typeof issue.input === 'string'
            ? 'a text value has at most 200 characters'
            : 'each value is a number, a string (categorical) or null (missing)',
    }),
  )
  .max(5_000_000)
  .superRefine((values, ctx) => {
    // One column is one kind of measurement: numbers and text in one column is a
    // data-entry mistake, not a factor. The usual mistakes are named: a
    // missing-value marker ("NA", "") or a number written as text.
    let sawNumber = -1;
    let sawText = -1;
    for (let i = 0; i < values.length; i++) {
      const v = values[i];
      if (typeof v === 'number' && sawNumber < 0) sawNumber = i;
      else if (typeof v === 'string' && sawText < 0) sawText = i;
      if (sawNumber >= 0 && sawText >= 0) {
        const text = values[sawText] as string;
        // A marker or a number written as text is the value at fault, so the path points at it.
        if (isMissingMarker(text)) {
          ctx.addIssue({ code: 'custom', path: [sawText], message: `row ${sawText} holds ${JSON.stringify(text)} in a column of numbers: use null for a missing value` });
        } else if (readsAsNumber(text)) {
          ctx.addIssue({ code: 'custom', path: [sawText], message: `row ${sawText} holds ${JSON.stringify(text)}, a number written as text, in a column of numbers: send it as a JSON number` });
        } else {
          ctx.addIssue({
            code: 'custom', path: [Math.max(sawNumber, sawText)],
            message: `a column holds numbers or text, not both (row ${sawNumber} is a number, row ${sawText} is text)`,
          });
        }
        return;
      }
    }
  });

export const DataSchema = z
  .strictObject({
    columns: z
      .record(ColumnName, ColumnValuesSchema)
      .superRefine((columns, ctx) => {
        const names = Object.keys(columns);
        if (names.length === 0) {
          ctx.addIssue({ code: 'custom', message: 'data.columns needs at least one column' });
          return;
        }
        const length = columns[names[0]].length;
        for (const name of names) {
          if (columns[name].length !== length) {
            ctx.addIssue({
              code: 'custom',
              path: [name],
              message: `all columns must have the same length: "${names[0]}" has ${length} values, "${name}" has ${columns[name].length}`,
            });
          }
        }
      })
      .meta({ description: 'Equal-length arrays: numbers, strings (categorical) or null (missing).' }),
  })
  .meta({ id: 'Data' });

const CandidateName = z.string().min(1).max(200);
const Parameters = z.number().int().min(1).max(100_000).meta({
  description: 'k: estimated coefficients plus one for the error variance (the service echoes it).',
});
const Observations = z.number().int().min(1).meta({
  description: 'Rows the model was fitted on; must equal the rows this comparison uses.',
});

export const ResponseTransform = z
  .strictObject({
    fn: z.enum(['log', 'sqrt', 'boxcox']),
    lambda: FiniteNumber.min(-5).max(5).optional().meta({ description: 'Box–Cox λ (required for boxcox): (y^λ − 1)/λ, ln y at λ = 0.' }),
  })
  .superRefine((t, ctx) => {
    if (t.fn === 'boxcox' && t.lambda === undefined) ctx.addIssue({ code: 'custom', path: ['lambda'], message: 'boxcox needs lambda' });
    if (t.fn !== 'boxcox' && t.lambda !== undefined) ctx.addIssue({ code: 'custom', path: ['lambda'], message: `lambda applies to boxcox only, not ${t.fn}` });
  })
  .meta({
    id: 'ResponseTransform',
    description:
      'The model was fitted to g(y); the service adds the log-Jacobian from the data\'s response column so its likelihood is on the scale of y (log: −Σ ln y; sqrt: −Σ ln(2√y); boxcox: (λ−1) Σ ln y).',
  });

/** The weights column's name; an array here is the commonest slip, so the message says what the field is. */
export const WeightsColumn = z
  .string({
    error: (issue) =>
      Array.isArray(issue.input)
        ? 'weights names a column of data.columns that holds the relative weights (e.g. "weights": "w"), not the weights themselves: put the array in data.columns and name it here'
        : 'weights names a column of data.columns (a string), or is null',
  })
  .min(1, 'a column name cannot be empty')
  .max(200, 'a column name has at most 200 characters')
  .nullable()
  .optional()
  .meta({ description: 'The name of a numeric column of data.columns holding relative weights (positive; 0 leaves a row out).' });

export const FittedCandidate = z
  .strictObject({
    name: CandidateName,
    terms: z.array(Term).max(200),
    intercept: z.boolean().default(true),
    response: ResponseTransform.optional(),
    ...GlmCandidateFields,
  })
  .superRefine((c, ctx) => {
    // A response transform changes the scale of a Gaussian least-squares model; a GLM models the response through its link instead.
    if (c.response && ((c.family ?? 'gaussian') !== 'gaussian' || c.link !== undefined || c.offset !== undefined)) {
      ctx.addIssue({ code: 'custom', path: ['response'], message: 'a response transform applies to least-squares candidates only; a generalised linear model relates the response to its terms through its link' });
    }
  })
  .meta({ id: 'FittedCandidate', description: 'A model the service fits: least squares by default, a generalised linear model with family (and link, offset).' });

export const NonlinearCandidate = nonlinearCandidate(ResponseTransform);

export const ResidualsCandidate = z
  .strictObject({
    name: CandidateName,
    residuals: z.array(FiniteNumber.nullable()).min(1).max(5_000_000).meta({
      description:
        'Residuals of a least-squares model fitted elsewhere on the same rows: either one per row the comparison uses, or one per data row with null exactly where the comparison drops a row.',
    }),
    parameters: Parameters,
    response: ResponseTransform.optional(),
  })
  .meta({ id: 'ResidualsCandidate', description: 'A Gaussian model fitted elsewhere, sent by its residuals; the log-likelihood is computed here.' });

export const RssCandidate = z
  .strictObject({
    name: CandidateName,
    rss: FiniteNumber.min(0).meta({ description: 'Residual sum of squares (Σ w e² when the request has weights).' }),
    parameters: Parameters,
    observations: Observations,
    response: ResponseTransform.optional(),
  })
  .meta({ id: 'RssCandidate', description: 'A least-squares fit made elsewhere, sent by its residual sum of squares; the full log-likelihood is derived here.' });

export const LikelihoodCandidate = z
  .strictObject({
    name: CandidateName,
    logLikelihood: FiniteNumber.meta({ description: 'The maximised log-likelihood with all constants included (the caller vouches for them).' }),
    parameters: Parameters,
    observations: Observations,
    estimation: z.enum(['ml', 'reml']).default('ml'),
    fixedEffects: z.array(z.string().min(1).max(200)).max(500).optional().meta({
      description: 'The fixed-effect terms, required with estimation "reml": REML likelihoods compare only models with the same fixed effects.',
    }),
    response: ResponseTransform.optional(),
  })
  .meta({ id: 'LikelihoodCandidate', description: 'A model fitted elsewhere with any likelihood.' });

/** Keys a caller may send in place of the likelihood: criteria, which a referee recomputes rather than takes. */
const CRITERION_KEYS = ['aic', 'aicc', 'bic', 'hqc', 'AIC', 'AICc', 'BIC', 'HQC'];

/**
 * Said when a candidate matches none of the forms: the forms themselves, and
 * for a candidate sent by a criterion value, the likelihood to send instead.
 */
function candidateFormsMessage(input: unknown): string {
  const forms = 'a candidate is one of: { name, terms, intercept?, response?, family?, link?, offset? } (fitted here); { name, residuals, parameters }; { name, rss, parameters, observations }; { name, logLikelihood, parameters, observations, estimation? }; { name, family, fitted, parameters, theta? | shape? | dispersion? }; { name, distribution, terms? } (a life distribution fitted here); { name, expression, start | starts, bounds?, response? } (a nonlinear mean function fitted here)';
  if (input === null || typeof input !== 'object' || Array.isArray(input)) return `${forms}.`;
  const sent = CRITERION_KEYS.find((k) => Object.prototype.hasOwnProperty.call(input, k));
  if (sent) {
    return `${forms}. A criterion value ("${sent}") is not a candidate form: the service computes every criterion itself under one convention, so send the model's maximised logLikelihood (constants included; from AIC, logLikelihood = k − AIC/2) with parameters (k) and observations (n).`;
  }
  return `${forms}.`;
}

export const Candidate = z
  .union([FittedCandidate, ResidualsCandidate, RssCandidate, LikelihoodCandidate, FittedMeansCandidate, LifetimeCandidate, NonlinearCandidate], { error: (issue) => candidateFormsMessage(issue.input) })
  .meta({ id: 'Candidate', description: 'One of the seven candidate forms: terms (fitted here: least squares, or a generalised linear model with family), residuals, rss, logLikelihood, fitted (means of a generalised linear model fitted elsewhere), distribution (a life distribution fitted here), or expression (a nonlinear mean function fitted here).' });

export const ComparisonOptions = z
  .strictObject({
    rankBy: Criterion.optional().meta({ description: 'The criterion the verdict chooses by; default from the team policy (aicc unless the policy says otherwise; a policy ranking by qaic or qaicc ranks a comparison without options.overdispersion by aic or aicc). qaic and qaicc need options.overdispersion (422 without it); the verdict then chooses by QAIC or QAICc, and averages by their weights. May be given here or at the top level of the request (as searches take it), not both with different values.' }),
    confidenceLevel: z.number().gt(0).lt(1).optional().meta({ description: 'Cumulative weight of the confidence set; default from the team policy (0.95).' }),
    intervalLevel: z.number().gt(0).lt(1).optional().meta({ description: 'Confidence level of the coefficient and prediction intervals (default 0.95).' }),
    tests: z.array(PairToTest).max(200).optional().meta({ description: 'Pairs to test besides those found automatically; each must be nested: two least-squares models fitted here, or two generalised linear models fitted here of one family and link, offset and trials (a deviance test, and an F test where the family estimates its dispersion). A pair with a nonlinear (expression) candidate is taken as nested on the caller\'s word — expressions have no columns to compare — after checking the same sample, fewer parameters in the smaller and a larger model fitting at least as well; its reason says so.' }),
    percentiles: Percentiles.optional(),
    survivalAt: SurvivalTimes.optional(),
    average: z.enum(['all', 'confidenceSet']).default('all').meta({ description: 'Average over all fitted candidates or over the confidence set.' }),
    overdispersion: OverdispersionOption.optional(),
    predict: z
      .strictObject({ columns: z.record(ColumnName, z.array(z.union([FiniteNumber, z.string().max(200), z.null()])).max(100_000)) })
      .optional()
      .meta({ description: 'New rows (the columns the fitted candidates use, a GLM\'s offset column included; not the trials column) at which every fitted model and the average predict, with intervals; may carry the weights column to give new observations weights (default 1). A generalised linear model predicts its mean (the success probability for the binomial) with the link-scale interval mapped by the inverse link.' }),
  })
  .meta({ id: 'ComparisonOptions' });

export const ComparisonRequest = z
  .strictObject({
    data: z.union([DataSchema, SummaryData]).optional().meta({
      description: 'Rows as columns, or a summary of them (data.summary) for data too large to send; required unless every candidate is sent by rss or logLikelihood.',
    }),
    response: ColumnName.optional().meta({ description: 'The numeric response column (required with data).' }),
    weights: WeightsColumn,
    trials: TrialsColumn,
    censoring: Censoring.optional(),
    rankBy: Criterion.optional().meta({ description: 'The same as options.rankBy, accepted here as POST /v1/searches takes it; giving both with different values is refused.' }),
    candidates: z.array(Candidate).min(1, 'at least one candidate is needed').max(200),
    datasetFingerprint: z.string().regex(/^sha256:[0-9a-f]{64}$/, 'expected "sha256:" and 64 lowercase hex digits').optional().meta({
      description: 'The fingerprint the caller expects (README: dataset fingerprint); a mismatch is a 422.',
    }),
    options: ComparisonOptions.default({ average: 'all' }),
    label: z.string().max(1000).optional(),
  })
  .superRefine((request, ctx) => {
    const seen = new Map<string, number>();
    request.candidates.forEach((candidate, index) => {
      const earlier = seen.get(candidate.name);
      if (earlier !== undefined) {
        ctx.addIssue({
          code: 'custom',
          path: ['candidates', index, 'name'],
          message: `candidate names must be unique: "${candidate.name}" is also candidate ${earlier}`,
        });
      } else seen.set(candidate.name, index);
    });
    if (request.data && request.response === undefined) {
      ctx.addIssue({ code: 'custom', path: ['response'], message: 'with data, name the response column' });
    }
    if (request.rankBy !== undefined && request.options.rankBy !== undefined && request.rankBy !== request.options.rankBy) {
      ctx.addIssue({
        code: 'custom',
        path: ['rankBy'],
        message: `rankBy is given twice with different values ("${request.rankBy}" here, "${request.options.rankBy}" in options); give it once`,
      });
    }
  })
  .meta({ id: 'ComparisonRequest' });

export type ComparisonRequest = z.output<typeof ComparisonRequest>;
