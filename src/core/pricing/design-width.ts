// The width of a design predicted from the term specifications alone, by the
// coding rules of design/build-design.ts: a numeric column, power or
// transform is one column; a text column, or any column a factor term of the
// same model declares, is a factor of L - 1 dummies (treatment coding); a
// product has one column per combination of its members' columns, so its
// width is the product of theirs (a member is a factor when it holds text or
// a factor term declares it; a plain column term only when it holds text). Terms the builder will refuse (an unknown
// column) count one column: the refusal comes later, with its own reason.
import type { Term } from '../types.ts';
import type { DataShape } from './data-shape.ts';

export interface DesignWidth {
  /** Design columns, the intercept included. */
  columns: number;
  /** Per term, in order. */
  perTerm: number[];
  /** A level count stopped past the bound, so `columns` is a lower bound (and beyond the bound). */
  atLeast: boolean;
}

/**
 * `bound` is the design-column cap: level counts stop just past it, so a
 * width beyond the cap is reported as beyond it (not always exactly).
 */
export function designWidth(shape: DataShape, terms: readonly Term[], intercept: boolean, bound: number): DesignWidth {
  const declared = new Set<string>();
  for (const term of terms) if (typeof term === 'object' && term.kind === 'factor') declared.add(term.of);
  let atLeast = false;
  const dummies = (column: string) => {
    const levels = shape.levels(column, bound + 1);
    if (levels > bound + 1) atLeast = true;
    return Math.max(0, levels - 1);
  };
  const memberWidth = (column: string) =>
    shape.has(column) && (declared.has(column) || shape.categorical(column)) ? dummies(column) : 1;
  const perTerm = terms.map((term) => {
    if (typeof term === 'string') return shape.categorical(term) ? dummies(term) : 1;
    switch (term.kind) {
      case 'factor':
        return shape.has(term.of) ? dummies(term.of) : 1;
      case 'product':
        return term.of.reduce((width, column) => width * memberWidth(column), 1);
      default:
        return 1;
    }
  });
  return { columns: (intercept ? 1 : 0) + perTerm.reduce((a, b) => a + b, 0), perTerm, atLeast };
}
