// The data table as columns: what kind each column is, whether the table is
// well formed, which columns the candidates use, and the common rows on
// which every candidate is fitted.

import type { ColumnValues, Columns, Term } from '../types.ts';
import { issue, type Issue, type IssuePath } from '../issues.ts';
import { nearestName } from './text-values.ts';

/** numeric: numbers (and nulls); categorical: strings (and nulls); empty: only nulls. */
export type ColumnKind = 'numeric' | 'categorical' | 'empty' | 'mixed';

export function columnKind(values: ColumnValues): ColumnKind {
  let sawNumber = false;
  let sawString = false;
  for (const v of values) {
    if (typeof v === 'number') sawNumber = true;
    else if (typeof v === 'string') sawString = true;
  }
  if (sawNumber && sawString) return 'mixed';
  return sawNumber ? 'numeric' : sawString ? 'categorical' : 'empty';
}

/**
 * Shape checks on the whole table, before any row is chosen: equal lengths,
 * one kind per column, finite numbers. Run this first; the other functions
 * assume a table that passes.
 */
export function checkColumns(columns: Columns, at: IssuePath = ['data', 'columns']): Issue[] {
  const issues: Issue[] = [];
  const names = Object.keys(columns);
  if (names.length === 0) return issues;
  const expected = columns[names[0]].length;
  for (const name of names) {
    const values = columns[name];
    if (values.length !== expected) {
      issues.push(issue('column_length_mismatch', [...at, name], { column: name, length: values.length, expected }));
    }
    let firstNumber = -1;
    let firstString = -1;
    for (let i = 0; i < values.length; i++) {
      const v = values[i];
      if (typeof v === 'number') {
        if (firstNumber < 0) firstNumber = i;
        if (!Number.isFinite(v)) {
          issues.push(issue('value_not_finite', [...at, name, i], { column: name, row: i }));
          break;
        }
      } else if (typeof v === 'string') {
        if (firstString < 0) firstString = i;
      }
    }
    if (firstNumber >= 0 && firstString >= 0) {
      const row = Math.max(firstNumber, firstString);
      issues.push(issue('column_mixed_types', [...at, name, row], { column: name, row }));
    }
  }
  return issues;
}

/** Column names a list of terms refers to, each once, in order of first use. */
export function columnsUsedBy(terms: readonly Term[]): string[] {
  const seen = new Set<string>();
  const add = (name: unknown) => {
    if (typeof name === 'string') seen.add(name);
  };
  for (const term of terms) {
    if (typeof term === 'string') add(term);
    else if (term && typeof term === 'object') {
      if (Array.isArray(term.of)) term.of.forEach(add);
      else add(term.of);
    }
  }
  return [...seen];
}

/**
 * The rows every candidate is fitted on. Criteria are only comparable on the
 * same observations, so a row with a missing value in any column that any
 * candidate uses (response and weights included) is dropped for all of them.
 * Names the data does not have are ignored here; building a design reports them.
 * Row indices are positions in the data; `dropped` counts the rows left out.
 */
export function commonRows(columns: Columns, usedColumnNames: readonly string[]): { rows: number[]; dropped: number } {
  let total = 0;
  for (const values of Object.values(columns)) total = Math.max(total, values.length);
  const used = [...new Set(usedColumnNames)]
    .filter((name) => Object.prototype.hasOwnProperty.call(columns, name))
    .map((name) => columns[name]);
  const rows: number[] = [];
  for (let i = 0; i < total; i++) {
    // A short column counts as missing past its end (checkColumns reports the mismatch).
    if (used.every((values) => i < values.length && values[i] !== null && values[i] !== undefined)) rows.push(i);
  }
  return { rows, dropped: total - rows.length };
}

/** Listed by name in an unknown-column issue; beyond this, counted. */
const LISTED_COLUMNS = 20;

/** The issue for a name the data does not have: the data's columns and the nearest name, if one is near. */
export function unknownColumn(path: IssuePath, name: unknown, columns: Columns): Issue {
  const names = Object.keys(columns);
  const column = String(name);
  return issue('unknown_column', path, {
    column,
    available: names.slice(0, LISTED_COLUMNS),
    columns: names.length,
    suggestion: nearestName(column, names),
  });
}
