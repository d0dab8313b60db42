// Treatment coding of a categorical column: one 0/1 dummy per level other
// than the reference. Levels are found on the rows the comparison uses (a
// level seen only on dropped rows would give an all-zero column) and sorted
// so the same data always gives the same columns: strings by code point,
// numbers (a numeric column declared a factor) by value.

import type { ColumnValues } from '../types.ts';
import { issue, type Issue, type IssuePath } from '../issues.ts';
import { compareCodePoints } from './code-point-order.ts';
import { dummyLabel } from './labels.ts';

export interface FactorDummy {
  level: string;
  label: string;
  values: Float64Array;
}

export interface FactorCoding {
  levels: string[];
  reference: string;
  dummies: FactorDummy[];
}

/** The distinct levels on the given rows, in the deterministic order described above. */
export function factorLevels(values: ColumnValues, rows: readonly number[]): string[] {
  const numbers = new Set<number>();
  const strings = new Set<string>();
  for (const r of rows) {
    const v = values[r];
    if (typeof v === 'number') numbers.add(v === 0 ? 0 : v); // -0 and 0 are one level
    else if (typeof v === 'string') strings.add(v);
  }
  const numeric = [...numbers].sort((a, b) => a - b).map(String);
  return [...numeric, ...[...strings].sort(compareCodePoints)];
}

/**
 * Dummies for `column` on `rows`, against `reference` (default: the first level).
 * Labels read "kiln=west". A reference that is not among the levels, or a column
 * with fewer than two levels on the rows used, is an issue at `path`.
 */
export function factorCoding(
  column: string,
  values: ColumnValues,
  rows: readonly number[],
  reference: string | undefined,
  path: IssuePath,
): { coding: FactorCoding } | { issue: Issue } {
  const levels = factorLevels(values, rows);
  if (reference !== undefined && !levels.includes(reference)) {
    return { issue: issue('factor_level_unknown', path, { column, level: reference, levels }) };
  }
  if (levels.length < 2) {
    return { issue: issue('factor_one_level', path, { column, levels }) };
  }
  const ref = reference ?? levels[0];
  const dummies: FactorDummy[] = [];
  for (const level of levels) {
    if (level === ref) continue;
    const col = new Float64Array(rows.length);
    for (let i = 0; i < rows.length; i++) {
      const v = values[rows[i]];
      if (v !== null && String(v === 0 ? 0 : v) === level) col[i] = 1;
    }
    dummies.push({ level, label: dummyLabel(column, level), values: col });
  }
  return { coding: { levels, reference: ref, dummies } };
}
