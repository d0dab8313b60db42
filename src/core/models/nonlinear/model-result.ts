// The report of a fitted nonlinear candidate in the one shape every kind
// reports (ModelResult): the likelihood, criteria and coefficient tests are
// made by the same code as for least-squares models fitted here, so the two
// kinds cannot drift apart in convention; then what is particular to an
// expression (the expression itself, its convergence, the linearisation).
import type { Caution } from '../../scoring/cautions.ts';
import { leastSquaresModelResult } from '../linear/least-squares-result.ts';
import type { ModelResult } from '../model-result.ts';
import type { NonlinearFit } from './result.ts';

export const LINEARISATION_CAUTION: Caution = {
  code: 'nonlinear_linearised',
  message:
    'This model is nonlinear in its parameters: its standard errors, t tests, p-values and intervals come from the Jacobian at the estimates (the usual linearisation), exact only for a model linear in its parameters, and optimistic when the model curves strongly or the rows are few. Its R² is descriptive only. A least-squares solution can be a local minimum: other start vectors can reach another.',
};

function boundCaution(parameters: readonly string[]): Caution {
  const one = parameters.length === 1;
  return {
    code: 'parameter_at_bound',
    message: `${parameters.map((p) => JSON.stringify(p)).join(', ')} ended on ${one ? 'its bound' : 'their bounds'}; ${one ? 'its standard error ignores' : 'their standard errors ignore'} the bound and mean little, and the parameter still counts in k.`,
  };
}

export function nonlinearModelResult(fit: NonlinearFit): ModelResult {
  const p = fit.estimates.length;
  const report = leastSquaresModelResult({
    name: fit.name,
    // The total sum of squares is taken about the (weighted) mean, as for a model with an intercept.
    intercept: true,
    observations: fit.observations,
    rank: p,
    rss: fit.rss,
    tss: fit.tss,
    sigma: fit.sigma,
    exactFit: fit.exactFit,
    sumLogWeights: fit.sumLogWeights,
    transform: fit.responseTransform ? { fn: fit.responseTransform.fn, lambda: fit.responseTransform.lambda } : undefined,
    jacobian: fit.responseTransform?.jacobian ?? 0,
    labels: fit.coefficients.map((c) => c.term),
    coefficients: fit.estimates,
    standardErrors: fit.coefficients.map((c) => c.standardError),
    aliased: [],
    conditionNumber: fit.conditionNumber,
    intervalLevel: fit.intervalLevel,
  });
  const cautions = [...report.cautions, LINEARISATION_CAUTION];
  if (fit.atBounds.length > 0) cautions.push(boundCaution(fit.atBounds));
  return {
    ...report,
    // An expression has no intercept term of its own; the notion does not apply.
    intercept: null,
    expression: fit.expression,
    convergence: fit.convergence,
    cautions,
  };
}
