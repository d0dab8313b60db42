// The numbers of the life-data picture, stored with a comparison that has
// life models (core/models/lifetime/life-picture.ts) and drawn by
// GET /v1/comparisons/{id}/life.svg without refitting anything.
import { z } from 'zod';
import { PICTURE_POINTS, PICTURE_RISE } from '../../core/models/lifetime/life-picture.ts';

const nullableNumber = z.number().nullable();

const KaplanMeierSteps = z
  .strictObject({
    method: z.literal('kaplanMeier'),
    intervalLevel: z.number(),
    steps: z.array(z.strictObject({ time: z.number(), fractionFailed: z.number(), lower: nullableNumber, upper: nullableNumber })).meta({
      description: `The Kaplan–Meier estimate of the fraction failed F(t) = 1 − S(t) just after each kept failure time, with its band (Greenwood's variance on the log(−log S) scale). A step is kept once F has risen by ${PICTURE_RISE} since the last kept one, so the stored steps are never further than that from the full estimate.`,
    }),
    censoredTimes: z.array(z.number()).meta({ description: 'Times of right-censored units (distinct, at most 200, spread by rank), for tick marks.' }),
    censoredCount: z.number().int().meta({ description: 'How many units were right-censored.' }),
  });

const TurnbullSteps = z
  .strictObject({
    method: z.literal('turnbull'),
    intervals: z.array(z.strictObject({ left: z.number(), right: nullableNumber, before: z.number(), after: z.number() })).meta({
      description: `Turnbull's estimate: where F rises, from before (just below left) to after (at right; right null: beyond every inspection); inside each interval it is not determined. Neighbouring intervals are merged while together they rise by less than ${PICTURE_RISE}.`,
    }),
    converged: z.boolean().meta({ description: 'Whether the self-consistency iteration met its rule (conventions.lifetime).' }),
  });

export const LifePicture = z
  .strictObject({
    logTime: z.boolean().meta({ description: 'A log-time axis (every observed time positive); otherwise linear.' }),
    axis: z.strictObject({ min: z.number(), max: z.number() }).meta({ description: 'The ends of the time axis the picture draws.' }),
    times: z.array(z.number()).meta({ description: `The ${PICTURE_POINTS} times, evenly spread over the axis, at which every curve is given.` }),
    estimate: z.discriminatedUnion('method', [KaplanMeierSteps, TurnbullSteps]).meta({
      description: 'The nonparametric estimate: Kaplan–Meier when every row is exact or right-censored, Turnbull\'s estimate as soon as one is left- or interval-censored.',
    }),
    curves: z.array(z.strictObject({
      model: z.string(),
      distribution: z.string(),
      reference: z.enum(['single', 'rowAverage']).meta({
        description: 'single: the model has no terms, one F(t) for every unit. rowAverage: the model has terms; drawn as F(t | x) averaged over the comparison\'s rows (at most 256 equal-count groups of rows by location), the counterpart of the estimate from the whole sample.',
      }),
      fractionFailed: z.array(nullableNumber).meta({ description: 'F(t) at each of times.' }),
    })),
    notes: z.array(z.string()).meta({ description: 'The rules above in words.' }),
  })
  .meta({
    id: 'LifePicture',
    description: 'Present when the comparison has life models: what GET /v1/comparisons/{id}/life.svg draws, computed when the comparison ran. A picture shows how the fitted distributions follow the data; like the criteria, it does not validate a life model.',
  });
