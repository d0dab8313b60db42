// The validated request body as the core's input. Columns go into an object
// without a prototype, so a term naming "toString" or "constructor" finds no
// inherited property where the caller has no column.
import type { ComparisonInput } from '../core/compare.ts';
import type { Columns } from '../core/types.ts';
import type { ComparisonRequest } from './schemas/comparison-request.ts';

export function ownColumns(columns: Record<string, ReadonlyArray<number | string | null>>): Columns {
  const own: Record<string, ReadonlyArray<number | string | null>> = Object.create(null);
  for (const [name, values] of Object.entries(columns)) own[name] = values;
  return own;
}

export function toComparisonInput(body: ComparisonRequest): ComparisonInput {
  return {
    columns: ownColumns(body.data.columns),
    response: body.response,
    weights: body.weights ?? null,
    candidates: body.candidates.map((c) => ({ name: c.name, terms: c.terms, intercept: c.intercept })),
    rankBy: body.options.rankBy,
    confidenceLevel: body.options.confidenceLevel,
  };
}
