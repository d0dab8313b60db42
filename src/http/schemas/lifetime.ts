// The request and response pieces of life data (README: life data): a
// lifetime candidate, the request's censoring columns, the options a life
// model reads, and the fields a lifetime model adds to its result.
import { z } from 'zod';
import { ColumnName, Term } from './common.ts';
import { Convergence, DistributionParameters } from './model-kind-fields.ts';
import { CENSORING_STATUSES } from '../../core/models/lifetime/censoring.ts';
import { DISTRIBUTION_NAMES } from '../../core/models/lifetime/distributions.ts';

const distributionWords = `distribution must be one of ${DISTRIBUTION_NAMES.map((n) => JSON.stringify(n)).join(', ')}`;
const nullableNumber = z.number().nullable();

export const LifetimeCandidate = z
  .strictObject({
    name: z.string().min(1).max(200),
    // A string first: a candidate without the key then fails like the other
    // forms (the union's forms message), one with an unknown name at its field.
    distribution: z.string({ error: () => distributionWords }).pipe(z.enum(DISTRIBUTION_NAMES, { error: () => distributionWords })).meta({
      description: 'The life distribution fitted by maximum likelihood. exponential, weibull, lognormal, loglogistic and gamma are distributions of positive time (their location is that of ln t); normal, logistic and smallestExtremeValue are on the time scale.',
    }),
    terms: z.array(Term).max(200).default([]).meta({
      description: 'Terms of the location, built as for least squares (an intercept is always included): an accelerated-failure-time model. None: one distribution for every row.',
    }),
  })
  .meta({ id: 'LifetimeCandidate', description: 'A life distribution fitted here by maximum likelihood, to exact and censored times (request-level censoring).' });

export const Censoring = z
  .strictObject({
    status: ColumnName.meta({ description: `A column whose value on each row is one of ${CENSORING_STATUSES.map((s) => `"${s}"`).join(', ')}: what the response value means on that row.` }),
    upper: ColumnName.optional().meta({ description: 'A numeric column holding the end of the window on interval rows (read on those rows only: null elsewhere drops nothing).' }),
  })
  .meta({
    id: 'Censoring',
    description: 'Censored observations: "exact" (failed at the response time), "right" (still working at it), "left" (already failed when first looked at, at it), "interval" (failed between it and the upper column). Only lifetime candidates (and a logLikelihood stated by the caller) can use censored rows.',
  });

export const Percentiles = z
  .array(z.number().gt(0, 'a percentile is asked for by its probability, strictly between 0 and 1').lt(1, 'a percentile is asked for by its probability, strictly between 0 and 1'))
  .min(1)
  .max(100)
  .meta({ description: 'Probabilities at which a lifetime model reports its percentiles of life (e.g. 0.1 for the B10 life), with Wald intervals at intervalLevel: for a model without terms in models[].percentiles, for a model with terms at each options.predict row (models[].lifePredictions).' });

export const SurvivalTimes = z
  .array(z.number())
  .min(1)
  .max(100)
  .meta({ description: 'Times at which a lifetime model reports the probability of surviving beyond them, S(t), with delta-method intervals at intervalLevel on the scale of the distribution\'s standardised deviate (log-log for the Weibull, exponential and smallest extreme value, logit for the log-logistic and logistic, probit for the lognormal and normal; log-log for the gamma), mapped back so they stay inside 0..1. For a model without terms in models[].survival, for a model with terms at each options.predict row.' });

const Bounded = z.strictObject({ estimate: z.number(), lower: nullableNumber, upper: nullableNumber });
const SurvivalEntry = z.strictObject({ time: z.number(), estimate: z.number(), lower: nullableNumber, upper: nullableNumber });
const PercentileEntry = z.strictObject({ probability: z.number(), estimate: z.number(), lower: nullableNumber, upper: nullableNumber });

const LifeRowPrediction = z
  .strictObject({
    location: z.strictObject({ estimate: z.number(), standardError: nullableNumber, lower: nullableNumber, upper: nullableNumber }).meta({
      description: 'μ = x\'β at the row, with its Wald interval: of ln t for the distributions of positive time, of t for normal, logistic and smallestExtremeValue.',
    }),
    medianLife: Bounded.meta({ description: 'The median life at the row (the 50th percentile), with its interval (delta method on ln t for the distributions of positive time).' }),
    percentiles: z.array(PercentileEntry).meta({ description: 'The percentiles asked for in options.percentiles, at the row.' }),
    survival: z.array(SurvivalEntry).meta({ description: 'Survival probabilities at options.survivalAt, at the row.' }),
  })
  .meta({ id: 'LifeRowPrediction' });


/** The fields a lifetime model adds to ModelResult (absent on the other kinds). */
export const LIFETIME_MODEL_FIELDS = {
  distribution: z.enum(DISTRIBUTION_NAMES).optional().meta({ description: 'Lifetime models: the distribution fitted.' }),
  distributionParameters: DistributionParameters,
  convergence: Convergence,
  percentiles: z
    .array(PercentileEntry)
    .nullable()
    .optional()
    .meta({ description: 'Lifetime models without terms: the percentiles of life asked for in options.percentiles, with Wald intervals at options.intervalLevel; null when none were asked for, or when the model has terms (a caution, life_values_depend_on_row, then says so and where the values are).' }),
  survival: z
    .array(SurvivalEntry)
    .nullable()
    .optional()
    .meta({ description: 'Lifetime models without terms: survival probabilities at options.survivalAt with their intervals; null as for percentiles.' }),
  lifePredictions: z
    .array(LifeRowPrediction.nullable())
    .optional()
    .meta({ description: 'Lifetime models, with options.predict: one entry per new row (null where the row breaks a relation among aliased columns). Life models have no mean response, so predictions stays null for them.' }),
  logLikelihoodLogTime: nullableNumber.optional().meta({
    description: 'Lifetime models of positive time: the same likelihood on the ln t scale (logLikelihood + Σ ln t over exact failures), for matching tools that report that one; never ranked.',
  }),
  censoring: z
    .strictObject({ exact: z.number().int(), right: z.number().int(), left: z.number().int(), interval: z.number().int() })
    .optional()
    .meta({ description: 'Lifetime models: how many rows of each censoring status the model was fitted to.' }),
};

export const LifetimeConventions = z
  .record(z.string(), z.string())
  .optional()
  .meta({ description: 'Present when the comparison has lifetime candidates: how their likelihood, parameters, standard errors, intervals and tests are computed.' });
