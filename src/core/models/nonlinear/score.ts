// Nonlinear candidates scored on the comparison's rows: each expression
// checked and compiled, its columns read on the common rows, the response put
// on the candidate's scale (with the Jacobian that brings its likelihood back
// to the response as sent), fitted, and reported beside every other kind.
// Every problem is an issue naming the candidate; none is ranked half-fitted.
import type { Issue } from '../../issues.ts';
import type { Columns } from '../../types.ts';
import { transformResponse, type TransformedResponse } from '../response-transform.ts';
import type { ScoringContext } from '../scoring-context.ts';
import { scoredModel, type ScoredModel } from '../scored-model.ts';
import { prepareNonlinearCandidate, type NonlinearCandidateSpec } from './candidate.ts';
import { expressionColumnValues } from './data.ts';
import { fitNonlinear } from './fit.ts';
import { nonlinearCapabilities } from './model-capabilities.ts';
import { nonlinearModelResult } from './model-result.ts';

export function scoreNonlinearCandidates(
  candidates: ReadonlyMap<number, NonlinearCandidateSpec>,
  columns: Columns,
  ctx: ScoringContext,
  intervalLevel: number | undefined,
  issues: Issue[],
): Map<number, ScoredModel> {
  const scored = new Map<number, ScoredModel>();
  const rows = ctx.rows!;
  const hasColumn = (name: string) => Object.prototype.hasOwnProperty.call(columns, name);
  const scales = new Map<string, TransformedResponse>();
  for (const [i, spec] of candidates) {
    const at = ['candidates', i];
    const prepared = prepareNonlinearCandidate(spec, hasColumn, at);
    if ('issues' in prepared) {
      issues.push(...prepared.issues);
      continue;
    }
    const { candidate } = prepared;
    const values = expressionColumnValues(candidate, columns, rows, at);
    if ('issues' in values) {
      issues.push(...values.issues);
      continue;
    }
    let response: TransformedResponse = { values: ctx.y!, jacobian: 0 };
    if (spec.response) {
      const key = JSON.stringify(spec.response);
      const made = scales.get(key) ?? transformResponse(ctx.y!, rows, spec.response, [...at, 'response']);
      if ('issues' in made) {
        issues.push(...made.issues);
        continue;
      }
      scales.set(key, made);
      response = made;
    }
    const fitted = fitNonlinear(candidate, { columns: values.values, response, weights: ctx.weights }, { at, intervalLevel });
    if ('issues' in fitted) {
      issues.push(...fitted.issues);
      continue;
    }
    scored.set(i, scoredModel(nonlinearModelResult(fitted.fit), 'density', nonlinearCapabilities(fitted.fit, candidate)));
  }
  return scored;
}
