// Fits a nonlinear candidate on plain columns through the engine's public
// face, as the comparison will: prepare the candidate, read its columns on
// all rows, transform the response if asked, fit. For the tests of this folder.
import {
  expressionColumnValues, fitNonlinear, prepareNonlinearCandidate,
  type NonlinearCandidate, type NonlinearCandidateSpec, type NonlinearFit, type NonlinearFitOptions,
} from '../../../../src/core/models/nonlinear/index.ts';
import { transformResponse } from '../../../../src/core/models/response-transform.ts';
import { sumOfLogs } from '../../../../src/core/likelihood.ts';
import type { Issue } from '../../../../src/core/issues.ts';

export interface PlainProblem {
  spec: NonlinearCandidateSpec;
  columns: Record<string, number[]>;
  y: number[];
  weights?: number[] | null;
}

export type FitOutcome = { fit: NonlinearFit; candidate: NonlinearCandidate } | { issues: Issue[] };

export function fitPlain(problem: PlainProblem, options: Partial<NonlinearFitOptions> = {}): FitOutcome {
  const at = options.at ?? ['candidates', 0];
  const prepared = prepareNonlinearCandidate(problem.spec, (name) => Object.hasOwn(problem.columns, name), at);
  if ('issues' in prepared) return prepared;
  const { candidate } = prepared;
  const rows = problem.y.map((_, i) => i);
  const columns = expressionColumnValues(candidate, problem.columns, rows, at);
  if ('issues' in columns) return columns;
  const y = Float64Array.from(problem.y);
  const response = candidate.response ? transformResponse(y, rows, candidate.response, [...at, 'response']) : { values: y, jacobian: 0 };
  if ('issues' in response) return response;
  const weights = problem.weights ? { values: Float64Array.from(problem.weights), sumLogWeights: sumOfLogs(problem.weights) } : null;
  const fitted = fitNonlinear(candidate, { columns: columns.values, response, weights }, { ...options, at });
  return 'issues' in fitted ? fitted : { fit: fitted.fit, candidate };
}

/** The fit, or a thrown error listing the issues (for tests that expect success). */
export function fitted(outcome: FitOutcome): { fit: NonlinearFit; candidate: NonlinearCandidate } {
  if ('issues' in outcome) throw new Error(outcome.issues.map((i) => i.message).join(' '));
  return outcome;
}
