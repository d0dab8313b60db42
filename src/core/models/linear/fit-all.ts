// The candidates fitted here: each design on the common rows, and each fit on
// the response's scale the candidate asks for. What this may cost was settled
// before any of it was built (src/core/pricing), so nothing here counts work.
import { buildDesign } from '../../design/index.ts';
import { issue, type Issue } from '../../issues.ts';
import type { Columns, DesignMatrix } from '../../types.ts';
import { fitCandidate, type FittedModel } from './fitted-model.ts';
import type { ScoringContext } from '../external/external-model.ts';
import { transformResponse, type TransformedResponse } from '../response-transform.ts';
import type { ComparisonInput } from '../../comparison/compare.ts';

export function fitAll(
  input: ComparisonInput,
  columns: Columns,
  ctx: ScoringContext,
  issues: Issue[],
): Map<number, FittedModel> {
  const rows = ctx.rows!;
  const designs = new Map<number, DesignMatrix>();
  input.candidates.forEach((c, i) => {
    if (c.form !== 'fit') return;
    const built = buildDesign(columns, c.terms, c.intercept, rows, ['candidates', i]);
    if ('issues' in built) {
      issues.push(...built.issues);
      return;
    }
    const p = built.design.labels.length;
    // More coefficients than rows: nothing can be estimated, let alone scored.
    if (p > rows.length) issues.push(issue('too_few_rows', ['candidates', i], { rows: rows.length, parameters: p }));
    designs.set(i, built.design);
  });
  const fitted = new Map<number, FittedModel>();
  if (issues.length > 0) return fitted;

  const scales = new Map<string, TransformedResponse>();
  for (const [i, design] of designs) {
    const c = input.candidates[i];
    if (c.form !== 'fit') continue;
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
    fitted.set(i, fitCandidate(c, design, response, ctx.weights, input.intervalLevel));
  }
  return fitted;
}
