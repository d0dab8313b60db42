// The generalised-linear parts of POST /v1/comparisons (names fixed in the
// public contract): a fitted candidate's family, link and offset, the
// request's trials column, means fitted elsewhere, and each model's own
// fields in the answer.
import { z } from 'zod';
import { ColumnName, FiniteNumber } from './common.ts';
import { Convergence, DistributionParameters } from './model-kind-fields.ts';
import { FAMILY_NAMES, GLM_CONVENTIONS, LINK_NAMES } from '../../core/models/glm/index.ts';

// Each field says what it takes when given something else ({ "family": 7 }):
// validation.ts resolves the candidate union to the form the caller meant,
// so these are the words the caller reads.
const oneOf = (field: string, names: readonly string[]) => `${field} must be one of ${names.map((n) => JSON.stringify(n)).join(', ')}`;

export const GlmFamily = z.enum(FAMILY_NAMES, { error: () => oneOf('family', FAMILY_NAMES) }).meta({
  id: 'GlmFamily',
  description: 'The distribution of the response. gaussian (the default) with the identity link and no offset is least squares, unchanged.',
});

export const GlmLink = z.enum(LINK_NAMES, { error: () => oneOf('link', LINK_NAMES) }).meta({
  id: 'GlmLink',
  description: 'Default: the family\'s canonical link (identity for gaussian, logit for binomial, log for poisson and negativeBinomial, inverse for gamma, inverseSquare for inverseGaussian). A link the family does not admit is a 422.',
});

/** Added to the fitted candidate: absent means today's least-squares model. */
export const GlmCandidateFields = {
  family: GlmFamily.optional(),
  link: GlmLink.optional(),
  offset: z.string({ error: () => 'offset names a numeric column of data.columns (its name as a string, such as "logExposure"), not the values themselves' })
    .min(1, 'a column name cannot be empty').max(200, 'a column name has at most 200 characters').optional().meta({ description: 'A numeric column added to the linear predictor as it is (for example the log of an exposure); rows where it is missing are left out for every candidate.' }),
};

export const TrialsColumn = ColumnName.optional().meta({
  description: 'A numeric column with the number of trials of each row: binomial candidates then read the response as successes (whole numbers, 0 ≤ y ≤ trials). Without it, binomial candidates need a 0/1 response. Only binomial candidates read it: with none it is refused (422 naming trials and the candidates); the other candidates beside binomial ones model the response without it, and a caution (trials_not_read) says so.',
});

const Positive = FiniteNumber.positive();

export const FittedMeansCandidate = z
  .strictObject({
    name: z.string().min(1).max(200),
    family: GlmFamily,
    fitted: z.array(FiniteNumber.nullable()).min(1).max(5_000_000).meta({
      description: 'The fitted mean of each row (success probabilities for binomial), aligned like residuals: one per row the comparison uses, or one per data row with null exactly where the comparison drops a row.',
    }),
    parameters: z.number().int().min(1).max(100_000).meta({ description: 'k: every parameter the model estimated, θ, shape or dispersion included.' }),
    theta: Positive.optional().meta({ description: 'negativeBinomial: θ, with variance μ + μ²/θ (required).' }),
    shape: Positive.optional().meta({ description: 'gamma: the shape, with variance μ²/shape (required).' }),
    dispersion: Positive.optional().meta({ description: 'inverseGaussian: φ, with variance φμ³ (required).' }),
  })
  .meta({ id: 'FittedMeansCandidate', description: 'A generalised linear model fitted elsewhere, sent by its fitted means; the full log-likelihood of its family is computed here from the response.' });


/** Per model, present for generalised linear models only. */
export const GlmModelFields = {
  family: GlmFamily.optional(),
  link: GlmLink.nullable().optional().meta({ description: 'Null for means fitted elsewhere.' }),
  deviance: z.number().nullable().optional().meta({ description: 'Σ prior weight × unit deviance at the fitted means.' }),
  nullDeviance: z.number().nullable().optional().meta({ description: 'Deviance of the intercept-only model with the same offset (offset-only without an intercept); null for means fitted elsewhere.' }),
  pearsonChiSquare: z.number().nullable().optional(),
  distributionParameters: DistributionParameters,
  convergence: Convergence,
  devianceExplained: z.number().nullable().optional().meta({ description: '1 − deviance/nullDeviance; r2 and adjustedR2 are null for non-Gaussian families (a caution says why).' }),
};

export const GlmConventions = z
  .strictObject(Object.fromEntries(Object.keys(GLM_CONVENTIONS).map((k) => [k, z.string()])) as Record<keyof typeof GLM_CONVENTIONS, z.ZodString>)
  .meta({ id: 'GlmConventions' });

export const OverdispersionOption = z
  .strictObject({
    // Said in full on the literal: a missing, null or misspelt cHat fails both branches and is reported by this one.
    cHat: z.union([FiniteNumber.positive(), z.literal('estimate', { error: () => 'cHat is a number greater than 0, or the string "estimate"' })]).meta({
      description: 'ĉ, the variance inflation of counts: a number, or "estimate" for Pearson χ²/(n − rank) of the fitted generalised linear candidate with the most parameters.',
    }),
  })
  .meta({ id: 'OverdispersionOption', description: 'Adds QAIC = −2 logL/ĉ + 2k and QAICc = QAIC + 2k(k+1)/(n − k − 1), k counting ĉ (Burnham & Anderson 2002), per model and as rankings.qaic and rankings.qaicc.' });

export const OverdispersionResult = z
  .strictObject({
    cHat: z.number(),
    source: z.string().meta({ description: '"given", or the name of the candidate whose Pearson χ²/(n − rank) it is.' }),
    df: z.number().int().nullable().meta({ description: 'Residual degrees of freedom of the estimate; null when given.' }),
    belowOne: z.boolean().meta({ description: 'An estimate below 1: ĉ = 1 is the usual choice then (no underdispersion to correct); the service leaves that to the caller.' }),
  })
  .meta({ id: 'OverdispersionResult' });
