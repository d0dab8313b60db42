// Per-model fields that more than one kind of model reports under the same
// fixed name (api-families.md): a distribution's own parameters and how an
// iterative fit ended. One shape each, so a model's answer reads alike
// whatever kind fitted it; members only one kind has are optional.
import { z } from 'zod';
import { NonlinearConvergence } from './nonlinear-candidate.ts';

const nullableNumber = z.number().nullable();

export const DistributionParameters = z
  .array(z.strictObject({
    name: z.string().meta({ description: 'theta, shape or dispersion (generalised linear models); shape, scale, sdlog, rate… (life distributions).' }),
    estimate: z.number(),
    standardError: nullableNumber.meta({ description: 'Null when the parameter was stated by the caller (means fitted elsewhere).' }),
  }))
  .optional()
  .meta({
    description:
      'The distribution\'s own parameters, each counted in k: θ (negativeBinomial), shape (gamma) or dispersion (inverseGaussian, gaussian σ²) for generalised linear models; the usual parameters of a life distribution (standard errors by the delta method; those that depend on the location listed only for a model without terms).',
  });

/** How an IRLS or Newton–Raphson fit ended (generalised linear models, life distributions). */
const IterativeConvergence = z.strictObject({
  converged: z.boolean(),
  iterations: z.number().int(),
  rule: z.string(),
  stepHalvings: z.number().int().optional().meta({ description: 'Generalised linear models: IRLS steps halved because the deviance rose.' }),
  decrement: z.number().optional().meta({ description: 'Life distributions: the Newton decrement at the estimates.' }),
});

export const Convergence = z
  .union([IterativeConvergence, NonlinearConvergence])
  .nullable()
  .optional()
  .meta({ description: 'How an iterative fit ended (generalised linear models, nonlinear mean functions, life distributions); null for means fitted elsewhere. A fit that does not converge is refused (422), never ranked.' });
