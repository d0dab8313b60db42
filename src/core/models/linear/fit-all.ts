// The candidates fitted here: each design on the common rows, and each fit on
// the response's scale the candidate asks for. What this may cost was settled
// before any of it was built (src/core/pricing), so nothing here counts work.
import type { Issue } from '../../issues.ts';
import type { Columns } from '../../types.ts';
import { candidateDesigns } from '../candidate-designs.ts';
import { fitCandidate, type FittedCandidateInput, type FittedModel } from './fitted-model.ts';
import type { ScoringContext } from '../scoring-context.ts';
import { transformResponse, type TransformedResponse } from '../response-transform.ts';

/** Candidates by their place in the request. */
export type IndexedCandidates = ReadonlyMap<number, FittedCandidateInput>;

export function fitAll(
  candidates: IndexedCandidates,
  columns: Columns,
  ctx: ScoringContext,
  intervalLevel: number | undefined,
  issues: Issue[],
): Map<number, FittedModel> {
  const rows = ctx.rows!;
  const designs = candidateDesigns(candidates, columns, rows, issues);
  const fitted = new Map<number, FittedModel>();
  if (issues.length > 0) return fitted;

  const scales = new Map<string, TransformedResponse>();
  for (const [i, design] of designs) {
    const c = candidates.get(i)!;
    let response: TransformedResponse = { values: ctx.y!, jacobian: 0 };
    if (c.response) {
      const key = JSON.stringify(c.response);
      const cached = scales.get(key) ?? transformResponse(ctx.y!, rows, c.response, ['candidates', i, 'response']);
      if ('issues' in cached) {
        issues.push(...cached.issues);
        continue;
      }
      scales.set(key, cached);
      response = cached;
    }
    fitted.set(i, fitCandidate(c, design, response, ctx.weights, intervalLevel));
  }
  return fitted;
}
