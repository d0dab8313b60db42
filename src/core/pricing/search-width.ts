// The widths both search prices start from (least squares and generalised
// linear): the design over the whole pool and the always terms, the swept
// matrix's order d (design columns without the intercept, plus the response),
// and how many columns the always terms bring to every subset.
import type { SearchRequestInput } from '../search/request-problem.ts';
import type { DataShape } from './data-shape.ts';
import { designWidth, type DesignWidth } from './design-width.ts';

export interface SearchWidth {
  width: DesignWidth;
  /** Design columns of the whole pool and the always terms. */
  w: number;
  /** Order of the swept matrix: w without the intercept, plus the response. */
  d: number;
  /** Pool terms. */
  m: number;
  /** Columns the always terms add to every subset. */
  alwaysWidth: number;
}

export function searchWidth(input: SearchRequestInput, shape: DataShape, designColumnsLimit: number): SearchWidth {
  const width = designWidth(shape, [...input.pool, ...input.always], input.intercept, designColumnsLimit);
  const w = width.columns;
  const m = input.pool.length;
  return { width, w, d: w - (input.intercept ? 1 : 0) + 1, m, alwaysWidth: width.perTerm.slice(m).reduce((a, b) => a + b, 0) };
}
