// Ordering of names and factor levels by Unicode code point. JavaScript's
// default string sort compares UTF-16 code units, which orders characters
// beyond U+FFFF before U+E000..U+FFFF; code points give one order that every
// language reproduces, and no locale enters.

/** Negative, zero or positive as a sorts before, with or after b by code point. */
export function compareCodePoints(a: string, b: string): number {
  let i = 0;
  let j = 0;
  while (i < a.length && j < b.length) {
    const ca = a.codePointAt(i)!;
    const cb = b.codePointAt(j)!;
    if (ca !== cb) return ca < cb ? -1 : 1;
    i += ca > 0xffff ? 2 : 1;
    j += cb > 0xffff ? 2 : 1;
  }
  const restA = a.length - i;
  const restB = b.length - j;
  return restA === restB ? 0 : restA < restB ? -1 : 1;
}
