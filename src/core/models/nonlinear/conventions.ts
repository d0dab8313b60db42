// The convention of nonlinear candidates in plain words, for the response's
// `conventions` and the README. Numbers quoted here come from the constants
// the code uses, so the words cannot drift from the behaviour.
import { EXPRESSION_LIMITS, FUNCTIONS } from './expression/syntax.ts';
import { MAX_PARAMETERS } from './candidate.ts';
import { RANK_TOLERANCE } from './covariance.ts';
import { MAX_REFINEMENT_STEPS } from './refine.ts';
import { CERTIFICATE_STEP, DEFAULT_MAX_ITERATIONS, EVALUATIONS_PER_ITERATION, LM_TOLERANCES } from './solve.ts';

export const CONVERGENCE_RULE =
  `Levenberg–Marquardt with Moré's (1978) scaling and trust region stops when the actual and predicted relative reductions of the sum of squares are both at most ${LM_TOLERANCES.ftol}, ` +
  `or the trust region's radius is at most ${LM_TOLERANCES.xtol} of the scaled parameter vector's length, ` +
  `or the largest cosine between the residual vector and a Jacobian column is at most ${LM_TOLERANCES.gtol}, ` +
  `or rounding allows no further progress; then up to ${MAX_REFINEMENT_STEPS} Gauss–Newton steps with residuals evaluated in double-double refine the solution while the sum of squares falls. ` +
  `The fit counts as converged when, after that, the Gauss–Newton step would change the scaled parameters by at most ${CERTIFICATE_STEP} of their length; ` +
  `it fails after ${DEFAULT_MAX_ITERATIONS} iterations (Jacobian evaluations; ${EVALUATIONS_PER_ITERATION * DEFAULT_MAX_ITERATIONS} residual evaluations) per start vector.`;

export const NONLINEAR_CONVENTIONS = {
  expression:
    `numbers, + - * / ^ (right-associative, binding tighter than unary minus), unary minus, parentheses, the functions ${FUNCTIONS.join(', ')} (radians; log is natural) and the constant pi; ` +
    `names that are keys of start are parameters, every other name a numeric data column; at most ${EXPRESSION_LIMITS.maxLength} characters, ${EXPRESSION_LIMITS.maxDepth} levels of nesting and ${MAX_PARAMETERS} parameters`,
  logLikelihood:
    'the full Gaussian maximum-likelihood value with constants included, as for linear models: -n/2 (ln 2π + ln(RSS/n) + 1) + ½ Σ ln w (+ the Jacobian of a response transform), with RSS = Σ w (y - f(x; b))² at the least-squares estimates',
  parameterCount: 'k = the expression\'s parameters (the keys of start) plus one for the error variance; a parameter that ends on a bound still counts',
  standardErrors:
    `from s² (J'WJ)^-1 with s² = RSS/(n - p) and J the exact Jacobian of the expression at the estimates (automatic differentiation, not differences), computed by QR of the Jacobian; t statistics, p-values and intervals use Student's t with n - p degrees of freedom — the usual linearisation, exact only for models linear in their parameters`,
  rank: `the fit is refused when a Jacobian column's part not explained by the parameters before it is below ${RANK_TOLERANCE} of its length (parameters not identified)`,
  convergence: CONVERGENCE_RULE,
  starts: 'with several start vectors (starts) each is fitted; the converged solution with the smallest sum of squares wins and convergence.start says which',
  bounds: 'a parameter may be held in [lower, upper]; a parameter on a bound whose gradient points outwards is held there, steps are projected onto the bounds; standard errors of a parameter on a bound ignore the bound',
  afterRanking:
    'leverages are those of the Jacobian\'s hat matrix and leave-one-out errors e/(1 - h) their linearised approximation; predictions carry delta-method standard errors of the mean response',
} as const;
