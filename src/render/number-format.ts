// Fixed number formatting for pictures and pages. Only toFixed and
// toExponential are used: their output is specified exactly by ECMA-262
// (Number.prototype.toFixed / toExponential), unlike toLocaleString, so the
// same record gives the same bytes on every machine and locale.
//
// One style for a reader: plain decimals while they stay readable, and
// "1.73 × 10⁵⁴" (never "1.73e54") for what is too large or too small for
// them, so no page sets a programming notation beside plain numbers.

/** A number the renderers can print, or null when it is absent or not finite. */
export function finiteOrNull(value: unknown): number | null {
  return typeof value === 'number' && Number.isFinite(value) ? value : null;
}

/** Drops the sign of a value that prints as zero ("-0.00" reads as a defect). */
function unsignedZero(text: string): string {
  return /^-0(\.0+)?$/.test(text) ? text.slice(1) : text;
}

const superscripts: Record<string, string> = {
  '-': '\u207b', '0': '\u2070', '1': '\u00b9', '2': '\u00b2', '3': '\u00b3', '4': '\u2074',
  '5': '\u2075', '6': '\u2076', '7': '\u2077', '8': '\u2078', '9': '\u2079',
};

/** "1.73 × 10⁵⁴", "-2.8 × 10⁻⁵" (with no-break spaces): a mantissa of `significant` digits (trailing zeros dropped) times a power of ten. */
export function scientific(x: number, significant: number): string {
  const [mantissa, exponent] = x.toExponential(Math.max(0, significant - 1)).split('e');
  const digits = mantissa.includes('.') ? mantissa.replace(/\.?0+$/, '') : mantissa;
  const power = String(Number(exponent)).replace(/[-0-9]/g, (c) => superscripts[c]);
  // No-break spaces: a table cell never parts the mantissa from its power of ten.
  return `${digits}\u00a0×\u00a010${power}`;
}

/**
 * A value with a fixed number of decimals while it stays readable, switching
 * to three significant digits times a power of ten outside [1e-4, 1e9).
 */
export function formatFixed(value: unknown, decimals: number, absent = 'n/a'): string {
  const x = finiteOrNull(value);
  if (x === null) return absent;
  const size = Math.abs(x);
  if (size !== 0 && (size >= 1e9 || size < 10 ** -Math.max(decimals, 4))) return scientific(x, 3);
  return unsignedZero(x.toFixed(decimals));
}

/** Six significant digits, for coefficients and other free-scale values. */
export function formatSignificant(value: unknown, absent = 'n/a', significant = 6): string {
  const x = finiteOrNull(value);
  if (x === null) return absent;
  if (x === 0) return '0';
  const size = Math.abs(x);
  if (size >= 1e9 || size < 1e-4) return scientific(x, significant);
  const decimals = Math.max(0, significant - 1 - Math.floor(Math.log10(size)));
  // Trailing zeros would claim precision nobody measured ("4.00000" rows).
  const text = x.toFixed(Math.min(decimals, 10));
  return unsignedZero(text.includes('.') ? text.replace(/\.?0+$/, '') : text);
}

/** A criterion difference: two decimals below 100, fewer above. */
export function formatDelta(value: unknown, absent = 'no value'): string {
  const x = finiteOrNull(value);
  if (x === null) return absent;
  const size = Math.abs(x);
  if (size >= 1e6) return scientific(x, 3);
  return unsignedZero(x.toFixed(size >= 1000 ? 0 : size >= 100 ? 1 : 2));
}

/**
 * A difference in the units of its criterion: likelihood criteria (the
 * -2 log L scale) read well to two decimals; adjusted R² and leave-one-out
 * errors live on small scales and need four, with a floor rather than a
 * power of ten, so a column of them keeps one style ("< 0.0001" beside "0.0008").
 */
export function formatCriterionDelta(criterion: string, value: unknown, absent = 'no value'): string {
  if (criterion === 'aicc' || criterion === 'aic' || criterion === 'bic' || criterion === 'hqc' || criterion === 'qaic' || criterion === 'qaicc') return formatDelta(value, absent);
  const x = finiteOrNull(value);
  if (x === null) return absent;
  if (x > 0 && x < 0.00005) return '< 0.0001';
  if (Math.abs(x) >= 1e6) return scientific(x, 3);
  return unsignedZero(x.toFixed(4));
}

/**
 * An evidence ratio (≥ 1): three significant digits, whole numbers up to a
 * million, and a power of ten beyond ("1.73 × 10⁵⁴"), where the exact figure
 * no longer matters to anyone weighing evidence but its size does.
 */
export function formatRatio(value: unknown, absent = 'n/a'): string {
  const x = finiteOrNull(value);
  if (x === null) return absent;
  const size = Math.abs(x);
  if (size >= 1e6 || (size !== 0 && size < 1e-4)) return scientific(x, 3);
  if (size >= 100) return x.toFixed(0);
  return formatSignificant(x, absent, 3);
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
  if (x < 0.0001) return '< 0.0001';
  return x.toFixed(4);
}

/** A count (observations, parameters, rows): integer text. */
export function formatCount(value: unknown, absent = 'n/a'): string {
  const x = finiteOrNull(value);
  if (x === null) return absent;
  return Number.isInteger(x) ? String(x) : formatSignificant(x);
}
