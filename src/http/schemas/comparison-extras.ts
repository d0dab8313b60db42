// The parts of a comparison response that come after the ranking: nested-model
// tests, model averaging, leave-one-out, assumption checks and predictions.
import { z } from 'zod';
import { Criterion } from './common.ts';

const n = z.number().nullable();

export const NestedTest = z
  .strictObject({
    smaller: z.string(),
    larger: z.string(),
    df: z.number().int().meta({ description: 'Rank difference: numerator df of F and df of the χ² test.' }),
    residualDf: z.number().int().meta({ description: 'Denominator df of F: n − rank of the larger model.' }),
    fStatistic: n.meta({ description: 'Partial F = ((RSS_s − RSS_l)/df) / (RSS_l/residualDf); for generalised linear models whose family estimates its dispersion (Gaussian, gamma, inverse Gaussian), ((D_s − D_l)/df) / φ̂ with φ̂ = Pearson χ²/residualDf of the larger model; null where the family fixes the dispersion (binomial, Poisson, negative binomial).' }),
    fPValue: n.meta({ description: 'Upper tail of F(df, residualDf), via the regularised incomplete beta function.' }),
    lrStatistic: n.meta({ description: 'Likelihood ratio 2(logL_l − logL_s); for binomial and Poisson models the difference of their deviances.' }),
    lrPValue: n.meta({ description: 'Upper tail of χ²(df), via the regularised incomplete gamma function.' }),
    reason: z.string().nullable().meta({ description: 'Why statistics are null, when they are.' }),
  })
  .meta({ id: 'NestedTest', description: 'A pair of fitted models of one kind, one nested in the other (its design columns a subset, same response, weights and rows; for generalised linear models also the same family, link, offset and trials).' });

const predictionFields = {
  estimate: n.meta({ description: 'The predicted (median = mean, for a model of y itself) response at the row, on the response\'s original scale.' }),
  standardError: n.meta({ description: 'Standard error of the estimate (delta method after a back-transform).' }),
  lower: n.meta({ description: 'Confidence interval for the mean (median) response at options.intervalLevel.' }),
  upper: n,
  predictionLower: n.meta({ description: 'Prediction interval for a new observation at options.intervalLevel (weight 1, or the weights column\'s value in the prediction rows).' }),
  predictionUpper: n,
};

export const Prediction = z.strictObject(predictionFields).meta({
  id: 'Prediction',
  description: 'A prediction at a new row of options.predict.columns, on the response\'s original scale (conventions.predictions): the estimate, its standard error, an interval for the mean response and one for a new observation.',
});

export const AveragedTerm = z
  .strictObject({
    term: z.string(),
    importance: z.number().meta({ description: 'Summed weight of the averaged models that contain the term.' }),
    estimate: z.number().meta({ description: 'Average over all averaged models, zero where a model lacks the term.' }),
    unconditionalStandardError: n,
    overModelsWithTerm: z.strictObject({ estimate: z.number(), unconditionalStandardError: n }).meta({
      description: 'Average over the models containing the term only, weights renormalised over them.',
    }),
  })
  .meta({ id: 'AveragedTerm' });

export const Averaged = z
  .strictObject({
    criterion: Criterion,
    over: z.enum(['all', 'confidenceSet']),
    models: z.array(z.string()).meta({ description: 'The models whose coefficients were averaged: all on one response scale.' }),
    weightCovered: z.number().meta({ description: 'Their summed weight under the criterion; a caution says when it is below 1.' }),
    responseTransform: z
      .strictObject({ fn: z.enum(['log', 'sqrt', 'boxcox']), lambda: z.number().optional() })
      .nullable()
      .meta({ description: 'The scale of the averaged coefficients (the scale holding the most weight): null for the response as sent.' }),
    glm: z
      .strictObject({ family: z.string(), link: z.string() })
      .nullable()
      .meta({ description: 'The family and link of averaged generalised linear model coefficients (they are on that link scale; models of another family or link are excluded); null for least-squares coefficients.' }),
    excluded: z.array(z.strictObject({ name: z.string(), reason: z.string() })).meta({ description: 'Models whose coefficients were not averaged, and why.' }),
    estimator: z.enum(['eq6.12', 'eq4.9']),
    estimatorDescription: z.string(),
    averages: z.strictObject({ estimate: z.string(), overModelsWithTerm: z.string() }),
    terms: z.array(AveragedTerm),
    predictions: z.array(Prediction).meta({
      description: 'Averaged predictions on the response\'s original scale over every model that can predict (predictionsOver): Σ w ŷ, the unconditional standard error, and model-averaged tail-area intervals (conventions.predictions).',
    }),
    predictionsOver: z
      .strictObject({ models: z.array(z.string()), weightCovered: z.number() })
      .nullable()
      .meta({ description: 'The models whose predictions were averaged and their summed weight; null when no prediction rows were sent.' }),
    notes: z.array(z.string()),
  })
  .meta({ id: 'Averaged', description: 'Model-averaged coefficients (Burnham & Anderson 2002) over the ranking criterion\'s weights.' });

const Check = { passed: z.boolean().nullable() };

const GlmChecks = z
  .strictObject({
    overdispersion: z.strictObject({
      pearsonChiSquare: z.number(),
      residualDf: z.number().int(),
      ratio: n.meta({ description: 'Pearson χ² / residual df: about 1 when the family\'s variance holds.' }),
      threshold: n.meta({ description: 'The upper 0.05 point of χ²(df)/df: a ratio above it is unlikely by chance under the family\'s variance. Null where not checked: families that estimate their dispersion (Gaussian, gamma, inverse Gaussian), a 0/1 binomial response, no residual df.' }),
      pValue: n.meta({ description: 'Pearson\'s goodness-of-fit test: upper tail of χ²(residual df) at Pearson χ² (large-sample).' }),
      ...Check,
      note: z.string(),
    }),
    devianceResiduals: z.strictObject({
      maxAbsolute: n.meta({ description: 'Largest |deviance residual| / √(φ (1 − h)).' }),
      maxAbsoluteRow: z.number().int().nullable().meta({ description: 'Data row (0-based, as sent) of the largest.' }),
      threshold: z.number().meta({ description: 'Standardised deviance residuals beyond ±3 are flagged (common practice: rare for a standard normal).' }),
      largeRows: z.number().int(),
      largeRowIndices: z.array(z.number().int()).meta({ description: 'Data rows (0-based, as sent) beyond the threshold.' }),
      ...Check,
      note: z.string(),
    }),
  })
  .meta({ id: 'GlmChecks', description: 'Overdispersion (Pearson χ²/df) and the standardised deviance residuals of a generalised linear model; leverage and Cook\'s distance (influence) come from the design weighted by the final IRLS weights. A failed check is said in plain words among the model\'s cautions (code assumption_check).' });

export const Diagnostics = z
  .strictObject({
    available: z.boolean(),
    reason: z.string().nullable(),
    residualNormality: z.strictObject({
      test: z.literal('Jarque–Bera'), statistic: n, df: z.literal(2), pValue: n, skewness: n, kurtosis: n, alpha: z.number(), ...Check, note: z.string(),
    }),
    heteroscedasticity: z.strictObject({
      test: z.literal('Breusch–Pagan (studentised, Koenker)'), statistic: n, df: z.number().int().nullable(), pValue: n, alpha: z.number(), ...Check, note: z.string().nullable(),
    }),
    autocorrelation: z.strictObject({
      test: z.literal('Durbin–Watson'), statistic: n, acceptableRange: z.tuple([z.number(), z.number()]), ...Check,
      note: z.string().meta({ description: 'Durbin–Watson is meaningful only when the row order is time (or another sequence) order.' }),
    }),
    multicollinearity: z.strictObject({
      varianceInflationFactors: z.array(z.strictObject({ term: z.string(), vif: n })),
      maxVarianceInflation: n,
      varianceInflationThreshold: z.number(),
      conditionNumber: n.meta({ description: 'Condition number of the centred regressors scaled to unit length (the square root of that of their correlation matrix): what the check uses, with the VIFs.' }),
      conditionNumberThreshold: z.number(),
      uncentredConditionNumber: n.meta({ description: 'Belsley–Kuh–Welsch scaled condition number of the uncentred design, intercept included: information only, large for any data far from zero.' }),
      ...Check,
      note: z.string().nullable(),
    }),
    influence: z.strictObject({
      maxCooksDistance: n,
      maxCooksDistanceRow: z.number().int().nullable().meta({ description: 'Data row (0-based, as sent) of the largest Cook\'s distance.' }),
      cooksDistanceThreshold: z.number(),
      leverageThreshold: z.number().meta({ description: '2p/n (rule of thumb).' }),
      highLeverageRows: z.number().int(),
      highLeverageRowIndices: z.array(z.number().int()).meta({ description: 'Data rows (0-based, as sent) above the leverage threshold.' }),
      ...Check,
    }),
    glm: GlmChecks.optional().meta({ description: 'Generalised linear models fitted here only: the checks that belong to the family.' }),
  })
  .meta({ id: 'Diagnostics', description: 'Checks of the assumptions behind every criterion: independent, identically distributed normal errors for least squares; for a generalised linear model, its family\'s own (glm), the normal-error checks only for the Gaussian family. What a failed check means is said once, among the model\'s cautions (code assumption_check).' });

export const PairToTest = z.strictObject({ smaller: z.string().min(1), larger: z.string().min(1) });
