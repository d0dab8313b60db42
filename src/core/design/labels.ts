// The readable names of design columns and of terms. One place, so that a
// label in a response, a chart and an audit record is always spelled alike.
//
// The service's own labelling, chosen to read as plain arithmetic:
//   intercept            the constant column
//   peakTemp             a numeric column as sent
//   peakTemp^2           a power
//   log(moisture)        a transform (also sqrt(x) and 1/x)
//   kiln=west            the 0/1 column of level "west" of factor kiln
//   peakTemp×kiln=west   a product of columns (× is U+00D7)

import type { Term } from '../types.ts';

export const INTERCEPT_LABEL = 'intercept';

/** The sign joining the parts of a product column. */
export const PRODUCT_SIGN = '×';

export function powerLabel(column: string, degree: number): string {
  return `${column}^${degree}`;
}

export function transformLabel(fn: 'log' | 'sqrt' | 'reciprocal', column: string): string {
  return fn === 'reciprocal' ? `1/${column}` : `${fn}(${column})`;
}

/** A dummy of a factor: "kiln=west" is 1 where kiln is "west", 0 elsewhere. */
export function dummyLabel(column: string, level: string): string {
  return `${column}=${level}`;
}

/** The parts of a product column, already labelled, joined as "peakTemp×kiln=west". */
export function productLabel(parts: readonly string[]): string {
  return parts.join(PRODUCT_SIGN);
}

/**
 * A term described back in a compact form of the request's own: "peakTemp",
 * "peakTemp^2", "peakTemp×holdMinutes", "log(moisture)", "1/x",
 * "kiln (factor)", "kiln (factor, reference west)". Stable, so it can key a
 * term across candidates (importance in a search, averaged coefficients).
 */
export function termLabel(term: Term): string {
  if (typeof term === 'string') return term;
  switch (term.kind) {
    case 'power':
      return powerLabel(term.of, term.degree);
    case 'product':
      return productLabel(term.of);
    case 'transform':
      return transformLabel(term.fn, term.of);
    case 'factor':
      return term.reference === undefined ? `${term.of} (factor)` : `${term.of} (factor, reference ${term.reference})`;
    default:
      return JSON.stringify(term);
  }
}
