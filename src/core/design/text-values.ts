// What text in a data column most likely meant. Data made from a CSV file
// often carries numbers as strings ("75.0") and missing values as markers
// ("NA", ""); taken at face value the first makes a factor with a level per
// value and the second a level called "NA". These helpers let the checks say
// what to send instead. Pure string tests, no locale: a decimal point, never
// a decimal comma.

/** A plain decimal number as text: optional sign, digits with an optional point, optional exponent. */
const DECIMAL = /^\s*[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?\s*$/;

/** Markers that spreadsheets, R, pandas and SQL exports write for a missing value (common practice). */
const MISSING_MARKERS = new Set(['', 'na', 'n/a', '#n/a', 'nan', 'null', 'none', 'nil', '-', '.', '?', 'missing', 'inf', '-inf', '+inf', 'infinity', '-infinity']);

export function readsAsNumber(text: string): boolean {
  return DECIMAL.test(text) && Number.isFinite(Number(text));
}

/** True for "NA", "", "NaN", "null" and the like (case and surrounding space ignored). */
export function isMissingMarker(text: string): boolean {
  return MISSING_MARKERS.has(text.trim().toLowerCase());
}

/**
 * The text values of a column as numbers would read them: null when some value
 * is real text (a level), else the first numeric-looking value and the
 * missing markers seen. A column needs at least one numeric-looking value.
 */
export function numbersWrittenAsText(values: ReadonlyArray<unknown>): { example: string; markers: string[] } | null {
  let example: string | null = null;
  const markers = new Set<string>();
  for (const v of values) {
    if (typeof v !== 'string') continue;
    if (readsAsNumber(v)) example ??= v;
    else if (isMissingMarker(v)) markers.add(v);
    else return null;
  }
  return example === null ? null : { example, markers: [...markers] };
}

/** Edit distance of two short strings (Levenshtein), capped early past `limit`. */
function distance(a: string, b: string, limit: number): number {
  if (Math.abs(a.length - b.length) > limit) return limit + 1;
  let previous = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const current = [i];
    let best = i;
    for (let j = 1; j <= b.length; j++) {
      current[j] = Math.min(previous[j] + 1, current[j - 1] + 1, previous[j - 1] + (a[i - 1] === b[j - 1] ? 0 : 1));
      best = Math.min(best, current[j]);
    }
    if (best > limit) return limit + 1;
    previous = current;
  }
  return previous[b.length];
}

/**
 * The name a caller most likely meant: the same name in another case, or
 * else the nearest by edit distance (at most 2, and less than a third of the
 * name's length, so short names are not matched to anything). Null when none is near.
 */
export function nearestName(name: string, names: readonly string[]): string | null {
  const lower = name.toLowerCase();
  const sameLetters = names.find((n) => n.toLowerCase() === lower);
  if (sameLetters !== undefined) return sameLetters;
  const limit = Math.min(2, Math.floor((name.length - 1) / 3));
  if (limit < 1) return null;
  let best: string | null = null;
  let bestDistance = limit + 1;
  for (const n of names) {
    const d = distance(lower, n.toLowerCase(), limit);
    if (d < bestDistance) {
      best = n;
      bestDistance = d;
    }
  }
  return best;
}
