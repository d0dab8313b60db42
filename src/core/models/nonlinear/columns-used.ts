// The data columns an expression reads, known before any fit, so the
// comparison's common rows drop rows missing a value in them (as for the
// columns of a linear candidate's terms). Names the data do not have are left
// out here: the candidate's own check names them with their offset.
import type { Columns } from '../../types.ts';
import type { NonlinearCandidateSpec } from './candidate.ts';
import { namesUsed, parseExpression } from './expression/parse.ts';

export function expressionColumnsUsed(spec: NonlinearCandidateSpec, columns: Columns): string[] {
  const parsed = parseExpression(spec.expression);
  if ('failure' in parsed) return [];
  const parameters = new Set(Object.keys(spec.start ?? spec.starts?.[0] ?? {}));
  return [...namesUsed(parsed.tree).keys()].filter((name) => !parameters.has(name) && Object.prototype.hasOwnProperty.call(columns, name));
}
