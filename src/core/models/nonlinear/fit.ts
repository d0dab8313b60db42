// A nonlinear candidate fitted to its rows under the service's Gaussian
// convention: the least-squares solution from the best of its start vectors,
// the log-likelihood with every constant (weights and a response transform's
// Jacobian as for linear models), k = parameters + 1, and the coefficient
// table from s² (J'WJ)^-1 with J the Jacobian at the solution. A fit that does
// not converge, runs into values it cannot step around, or ends with a
// rank-deficient Jacobian is an issue naming the candidate, never a result.
import { issue, type Issue, type IssuePath } from '../../issues.ts';
import { gaussianLogLikelihood } from '../../likelihood.ts';
import { centredTotalSumOfSquares } from '../../sums-of-squares.ts';
import { isExactFit } from '../../fit/exact-fit.ts';
import type { NonlinearCandidate } from './candidate.ts';
import { coefficientTable } from './coefficient-table.ts';
import { ResidualProblem } from './residual-problem.ts';
import { bestOutcome, DEFAULT_MAX_ITERATIONS, solveFromStart, type StartOutcome } from './solve.ts';
import { CONVERGENCE_RULE } from './conventions.ts';
import type { NonlinearFit, StartSummary } from './result.ts';

export interface NonlinearFitInput {
  /** Values of candidate.columns on the rows the comparison uses, in that order. */
  columns: readonly Float64Array[];
  /** The response on the candidate's scale and the log-Jacobian of its transform (0 without). */
  response: { values: Float64Array; jacobian: number };
  /** Relative weights on the rows and Σ ln w, or null. */
  weights: { values: Float64Array; sumLogWeights: number } | null;
}

export interface NonlinearFitOptions {
  /** The candidate's path in the request, for issues (e.g. ['candidates', 2]). */
  at: IssuePath;
  /** Level of the coefficient intervals (default 0.95). */
  intervalLevel?: number;
  /** Iteration cap per start vector (default 1000). */
  maxIterations?: number;
}

function summary(o: StartOutcome): StartSummary {
  return {
    start: o.start, status: o.status,
    rss: o.status === 'converged' ? o.rss : null,
    iterations: o.status === 'start-not-finite' ? 0 : o.iterations,
  };
}

/** The issue for a candidate none of whose starts converged: the most telling failure among them. */
function failureIssue(candidate: NonlinearCandidate, outcomes: StartOutcome[], at: IssuePath, limit: number): Issue {
  const starts = outcomes.length;
  const name = candidate.name;
  const find = <S extends StartOutcome['status']>(status: S) =>
    outcomes.find((o): o is Extract<StartOutcome, { status: S }> => o.status === status);
  const deficient = find('rank-deficient');
  if (deficient) return issue('nonlinear_rank_deficient', at, { candidate: name, parameters: deficient.dependent.map((j) => candidate.parameters[j]) });
  const capped = find('iteration-cap');
  if (capped) return issue('nonlinear_not_converged', at, { candidate: name, reason: 'iteration cap', iterations: capped.iterations, limit, starts });
  const stuck = find('no-minimum');
  if (stuck) return issue('nonlinear_not_converged', at, { candidate: name, reason: 'no minimum', iterations: stuck.iterations, limit, starts });
  const nonFinite = find('non-finite');
  if (nonFinite) return issue('nonlinear_non_finite', at, { candidate: name, row: nonFinite.row, starts });
  const first = find('start-not-finite')!;
  const startPath = candidate.starts.length === 1 ? [...at, 'start'] : [...at, 'starts', first.start];
  return issue('nonlinear_start_not_finite', startPath, { candidate: name, start: first.start, row: first.row });
}

export function fitNonlinear(
  candidate: NonlinearCandidate,
  input: NonlinearFitInput,
  options: NonlinearFitOptions,
): { ok: true; fit: NonlinearFit } | { issues: Issue[] } {
  const { at } = options;
  const y = input.response.values;
  const n = y.length;
  const p = candidate.parameters.length;
  const level = options.intervalLevel ?? 0.95;
  const limit = options.maxIterations ?? DEFAULT_MAX_ITERATIONS;
  if (n <= p) return { issues: [issue('too_few_rows', at, { rows: n, parameters: p })] };

  const weights = input.weights?.values ?? null;
  const problem = new ResidualProblem(candidate.tape, { columns: input.columns, y, weights });
  const bounds = { lower: candidate.lower, upper: candidate.upper };
  const outcomes = candidate.starts.map((start, s) => solveFromStart(problem, start, s, bounds, limit));
  const best = bestOutcome(outcomes);
  if (!best) return { issues: [failureIssue(candidate, outcomes, at, limit)] };

  const { x, residuals, rss, jacobian } = best.refined;
  const { unscaled, factor, conditionNumber } = best.covariance;

  const df = n - p;
  const sigma = Math.sqrt(rss / df);
  const standardErrors = candidate.parameters.map((_, j) => (sigma > 0 ? sigma * Math.sqrt(unscaled[j][j]) : null));
  let weightedResponseNorm = 0;
  for (let i = 0; i < n; i++) weightedResponseNorm += (weights ? weights[i] : 1) * y[i] * y[i];
  const exactFit = isExactFit(Math.sqrt(rss), Math.sqrt(weightedResponseNorm));
  const logLikelihood = exactFit
    ? null
    : gaussianLogLikelihood({ n, rss, sumLogWeights: input.weights?.sumLogWeights ?? 0, jacobian: input.response.jacobian });
  const tss = centredTotalSumOfSquares(y, weights ?? undefined);
  const fitted = y.map((v, i) => v - residuals[i]);

  return {
    ok: true,
    fit: {
      kind: 'nonlinear',
      name: candidate.name,
      expression: candidate.expression,
      measure: 'density',
      observations: n,
      parameters: p + 1,
      logLikelihood,
      exactFit,
      rss,
      tss,
      r2: tss > 0 ? 1 - rss / tss : null,
      sigma,
      residualDf: df,
      sumLogWeights: input.weights?.sumLogWeights ?? 0,
      responseTransform: candidate.response ? { ...candidate.response, jacobian: input.response.jacobian } : null,
      intervalLevel: level,
      coefficients: coefficientTable(candidate.parameters, x, standardErrors, df, level),
      estimates: Array.from(x),
      covariance: unscaled.map((row) => row.map((v) => sigma * sigma * v)),
      unscaledCovariance: unscaled,
      conditionNumber,
      atBounds: candidate.parameters.filter((_, j) => x[j] === candidate.lower[j] || x[j] === candidate.upper[j]),
      convergence: {
        converged: true,
        iterations: best.iterations,
        evaluations: best.evaluations,
        refinementSteps: best.refined.steps,
        stoppedBy: best.stop,
        finalStep: best.refined.lastRelativeStep,
        gradientCosine: best.refined.gradientCosine,
        start: best.start,
        starts: outcomes.map(summary),
        rule: CONVERGENCE_RULE,
      },
      fitted,
      residuals,
      weights,
      jacobian,
      factor,
    },
  };
}
