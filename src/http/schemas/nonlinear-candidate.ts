// A nonlinear candidate in a comparison request (api-families.md, fixed
// names: name, expression, start, bounds; starts is ours), and what a
// nonlinear model adds to its answer. An expression that cannot be read is
// refused here (400) with the offset and what was expected; what needs the
// data (a name that is no column, a fit that does not converge) is a 422
// from the core.
import { z } from 'zod';
import { expressionIssue, isParameterName } from '../../core/models/nonlinear/candidate.ts';
import { EXPRESSION_LIMITS, FUNCTIONS } from '../../core/models/nonlinear/expression/syntax.ts';
import { FiniteNumber } from './common.ts';

const StartVector = z.record(z.string().min(1).max(200), FiniteNumber).meta({
  description: 'One start value per parameter; its keys name the parameters (every other name in the expression is a data column). A key that is a function or constant of the grammar (exp, pi) is a 422 parameter_name_invalid at start/<key>, before the expression is read.',
});

/** The candidate's schema; the response transform's schema comes from the request's file, which imports this one. */
export const nonlinearCandidate = <T extends z.ZodType>(responseTransform: T) => z
  .strictObject({
    name: z.string().min(1).max(200),
    expression: z.string().max(EXPRESSION_LIMITS.maxLength * 4).meta({
      description: `The mean function: numbers, + - * / ^ (right-associative, binding tighter than unary minus), unary minus, parentheses, the functions ${FUNCTIONS.join(', ')} (radians; log is natural) and pi; at most ${EXPRESSION_LIMITS.maxLength} characters and ${EXPRESSION_LIMITS.maxDepth} levels of nesting.`,
    }),
    start: StartVector.optional(),
    starts: z.array(StartVector).min(1).max(20).optional().meta({
      description: 'Several start vectors with the same keys; each is fitted and the converged solution with the smallest sum of squares wins (convergence.start says which). Give start or starts, not both.',
    }),
    bounds: z.record(z.string().min(1).max(200), z.tuple([FiniteNumber.nullable(), FiniteNumber.nullable()])).optional().meta({
      description: 'Per parameter [lower, upper]; null for no bound on that side.',
    }),
    response: responseTransform.optional(),
  })
  .superRefine((c, ctx) => {
    // A parameter named like a function or constant ("exp", "pi") can make the
    // expression unreadable; that name is the fault, a 422 from the core
    // (parameter_name_invalid, naming start/<name>), not a syntax error here.
    const names = Object.keys(c.start ?? c.starts?.[0] ?? {});
    if (!names.every(isParameterName)) return;
    const found = expressionIssue(c.expression, ['expression']);
    if (found) ctx.addIssue({ code: 'custom', path: ['expression'], message: found.message });
  })
  .meta({ id: 'NonlinearCandidate', description: 'A mean function nonlinear in its parameters, written as an expression and fitted here by least squares under the Gaussian convention (k = parameters + 1).' });

const StartOutcome = z.strictObject({
  start: z.number().int(),
  status: z.enum(['converged', 'iteration-cap', 'no-minimum', 'rank-deficient', 'non-finite', 'start-not-finite']),
  rss: z.number().nullable(),
  iterations: z.number().int(),
});

export const NonlinearConvergence = z
  .strictObject({
    converged: z.literal(true).meta({ description: 'Always true in an answer: a fit that does not converge is a 422 naming the candidate.' }),
    iterations: z.number().int().meta({ description: 'Levenberg–Marquardt iterations (Jacobian evaluations) of the winning start.' }),
    evaluations: z.number().int().meta({ description: 'Residual evaluations of the winning start, trial steps included.' }),
    refinementSteps: z.number().int().meta({ description: 'Gauss–Newton steps with double-double residuals that lowered the sum of squares.' }),
    stoppedBy: z.string().meta({ description: 'Which of the stopping tests ended the iteration.' }),
    finalStep: z.number().meta({ description: 'The certificate: the relative size of a Gauss–Newton step from the solution (at most 1e-6 to count as converged).' }),
    gradientCosine: z.number().meta({ description: 'Largest cosine between the residuals and a free parameter\'s Jacobian column at the solution.' }),
    start: z.number().int().meta({ description: 'The start vector whose solution won (0 for start).' }),
    starts: z.array(StartOutcome).meta({ description: 'Every start vector\'s outcome, in request order.' }),
    rule: z.string().meta({ description: 'The convergence rule in words.' }),
  })
  .meta({ id: 'NonlinearConvergence' });

export const NonlinearConventions = z
  .strictObject({
    expression: z.string(),
    logLikelihood: z.string(),
    parameterCount: z.string(),
    standardErrors: z.string(),
    rank: z.string(),
    convergence: z.string(),
    starts: z.string(),
    bounds: z.string(),
    afterRanking: z.string(),
  })
  .meta({ id: 'NonlinearConventions' });
