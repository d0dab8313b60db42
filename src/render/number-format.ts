// Fixed number formatting for pictures and pages. Only toFixed and
// toExponential are used: their output is specified exactly by ECMA-262
// (Number.prototype.toFixed / toExponential), unlike toLocaleString, so the
// same record gives the same bytes on every machine and locale.

/** A number the renderers can print, or null when it is absent or not finite. */
export function finiteOrNull(value: unknown): number | null {
  return typeof value === 'number' && Number.isFinite(value) ? value : null;
}

/** Drops the sign of a value that prints as zero ("-0.00" reads as a defect). */
function unsignedZero(text: string): string {
  return /^-0(\.0+)?$/.test(text) ? text.slice(1) : text;
}

/**
 * A value with a fixed number of decimals while it stays readable, switching
 * to three significant digits in exponent form outside [1e-4, 1e9).
 */
export function formatFixed(value: unknown, decimals: number, absent = 'n/a'): string {
  const x = finiteOrNull(value);
  if (x === null) return absent;
  const size = Math.abs(x);
  if (size !== 0 && (size >= 1e9 || size < 10 ** -Math.max(decimals, 4))) {
    return x.toExponential(2).replace('e+', 'e');
  }
  return unsignedZero(x.toFixed(decimals));
}

/** Six significant digits, for coefficients and other free-scale values. */
export function formatSignificant(value: unknown, absent = 'n/a'): string {
  const x = finiteOrNull(value);
  if (x === null) return absent;
  if (x === 0) return '0';
  const size = Math.abs(x);
  if (size >= 1e9 || size < 1e-4) return x.toExponential(5).replace(/\.?0+e/, 'e').replace('e+', 'e');
  const decimals = Math.max(0, 5 - Math.floor(Math.log10(size)));
  // Trailing zeros would claim precision nobody measured ("4.00000" rows).
  const text = x.toFixed(Math.min(decimals, 10));
  return unsignedZero(text.includes('.') ? text.replace(/\.?0+$/, '') : text);
}

/** A criterion difference: two decimals below 100, fewer above. */
export function formatDelta(value: unknown, absent = 'no value'): string {
  const x = finiteOrNull(value);
  if (x === null) return absent;
  const size = Math.abs(x);
  if (size >= 1e6) return x.toExponential(2).replace('e+', 'e');
  return unsignedZero(x.toFixed(size >= 1000 ? 0 : size >= 100 ? 1 : 2));
}

/**
 * A difference in the units of its criterion: likelihood criteria (the
 * -2 log L scale) read well to two decimals; adjusted R² and leave-one-out
 * errors live on small scales and need four.
 */
export function formatCriterionDelta(criterion: string, value: unknown, absent = 'no value'): string {
  if (criterion === 'aicc' || criterion === 'aic' || criterion === 'bic' || criterion === 'hqc') return formatDelta(value, absent);
  return formatFixed(value, 4, absent);
}

/** A weight in [0, 1] as a percentage; tiny but positive weights are not shown as 0. */
export function formatPercent(value: unknown, absent = 'n/a'): string {
  const x = finiteOrNull(value);
  if (x === null) return absent;
  const percent = x * 100;
  if (percent > 0 && percent < 0.05) return '<0.1%';
  if (percent < 100 && percent > 99.95) return '>99.9%';
  return `${unsignedZero(percent.toFixed(1))}%`;
}

/** A p-value: four decimals, with a floor rather than a run of zeros. */
export function formatPValue(value: unknown, absent = 'n/a'): string {
  const x = finiteOrNull(value);
  if (x === null) return absent;
  if (x < 0.0001) return '<0.0001';
  return x.toFixed(4);
}

/** A count (observations, parameters, rows): integer text. */
export function formatCount(value: unknown, absent = 'n/a'): string {
  const x = finiteOrNull(value);
  if (x === null) return absent;
  return Number.isInteger(x) ? String(x) : formatSignificant(x);
}
