// Terms -> design matrix columns on the common rows. Powers, products and
// transforms are formed in double-double (high + low) so that the solver's
// iterative refinement works against the design the caller asked for, not its
// double rounding; plain columns and dummies are exact, with low = 0.

import type { Columns, DesignMatrix, Term } from '../types.ts';
import { issue, type Issue, type IssuePath } from '../issues.ts';
import { ddLog, ddMul, ddPowInt, ddReciprocal, ddSqrt } from '../numeric/double-double.ts';
import { columnKind, unknownColumn } from './columns.ts';
import { factorCoding } from './factor-coding.ts';
import { numbersWrittenAsText } from './text-values.ts';
import { INTERCEPT_LABEL, powerLabel, productLabel, transformLabel } from './labels.ts';
import { columnKey, INTERCEPT_IDENTITY, productIdentity, type ColumnIdentity } from './column-identity.ts';

interface Piece {
  label: string;
  identity: ColumnIdentity;
  high: Float64Array;
  low: Float64Array;
}

interface Context {
  columns: Columns;
  rows: readonly number[];
  /**
   * Columns the candidate declares factors with a factor term, and the
   * reference it sets. The declaration holds for every use of the column in
   * the candidate, so "kiln" and a product with kiln code the same dummies.
   */
  factors: Map<string, string | undefined>;
}

type Pieces = { pieces: Piece[] } | { issue: Issue };

const TRANSFORMS = {
  log: { inDomain: (x: number) => x > 0, dd: ddLog },
  sqrt: { inDomain: (x: number) => x >= 0, dd: ddSqrt },
  reciprocal: { inDomain: (x: number) => x !== 0, dd: ddReciprocal },
} as const;

function hasColumn(columns: Columns, name: unknown): name is string {
  return typeof name === 'string' && Object.prototype.hasOwnProperty.call(columns, name);
}

/** The numbers of a numeric column on the used rows. */
function numericValues(ctx: Context, name: string, path: IssuePath, form: 'power' | 'transform' | null):
  { values: Float64Array } | { issue: Issue } {
  const values = ctx.columns[name];
  const kind = columnKind(values);
  if (kind === 'categorical' && form) return { issue: issue('term_not_numeric', path, { column: name, form }) };
  const out = new Float64Array(ctx.rows.length);
  for (let i = 0; i < ctx.rows.length; i++) {
    const v = values[ctx.rows[i]];
    if (typeof v !== 'number') {
      const row = ctx.rows[i];
      return {
        issue: v === null || v === undefined
          ? issue('value_missing', path, { column: name, row })
          : issue('column_mixed_types', path, { column: name, row }),
      };
    }
    out[i] = v;
  }
  return { values: out };
}

function exactPiece(label: string, identity: ColumnIdentity, values: Float64Array): Piece {
  return { label, identity, high: values, low: new Float64Array(values.length) };
}

function factorPieces(ctx: Context, name: string, path: IssuePath): Pieces {
  const result = factorCoding(name, ctx.columns[name], ctx.rows, ctx.factors.get(name), path);
  if ('issue' in result) return result;
  const { reference } = result.coding;
  return { pieces: result.coding.dummies.map((d) => exactPiece(d.label, ['level', name, d.level, reference], d.values)) };
}

/**
 * A text column used as it stands (not declared a factor) whose values all
 * read as numbers: JSON made from CSV. Coded as a factor it would get a level
 * per value and win on fit with a parameter per row, so it is refused.
 */
function textNumbersIssue(ctx: Context, name: string, path: IssuePath): Issue | null {
  if (ctx.factors.has(name)) return null;
  const text = numbersWrittenAsText(ctx.columns[name]);
  return text ? issue('numbers_as_text', path, { column: name, example: text.example, missingMarkers: text.markers }) : null;
}

function columnPieces(ctx: Context, name: string, path: IssuePath): Pieces {
  if (!hasColumn(ctx.columns, name)) return { issue: unknownColumn(path, name, ctx.columns) };
  if (columnKind(ctx.columns[name]) === 'categorical') {
    const refused = textNumbersIssue(ctx, name, path);
    return refused ? { issue: refused } : factorPieces(ctx, name, path);
  }
  const r = numericValues(ctx, name, path, null);
  return 'issue' in r ? r : { pieces: [exactPiece(name, ['column', name], r.values)] };
}

function powerPieces(ctx: Context, of: string, degree: number, path: IssuePath): Pieces {
  if (!hasColumn(ctx.columns, of)) return { issue: unknownColumn([...path, 'of'], of, ctx.columns) };
  if (!Number.isInteger(degree) || degree < 2) {
    return { issue: issue('power_degree_invalid', [...path, 'degree'], { column: of, degree }) };
  }
  const r = numericValues(ctx, of, path, 'power');
  if ('issue' in r) return r;
  const high = new Float64Array(r.values.length);
  const low = new Float64Array(r.values.length);
  r.values.forEach((x, i) => ([high[i], low[i]] = ddPowInt(x, degree)));
  return { pieces: [{ label: powerLabel(of, degree), identity: ['power', of, degree], high, low }] };
}

function transformPieces(ctx: Context, of: string, fn: keyof typeof TRANSFORMS, path: IssuePath): Pieces {
  if (!hasColumn(ctx.columns, of)) return { issue: unknownColumn([...path, 'of'], of, ctx.columns) };
  const rule = TRANSFORMS[fn];
  if (!rule) return { issue: issue('term_form_unknown', [...path, 'fn'], {}) };
  const r = numericValues(ctx, of, path, 'transform');
  if ('issue' in r) return r;
  const high = new Float64Array(r.values.length);
  const low = new Float64Array(r.values.length);
  for (let i = 0; i < r.values.length; i++) {
    const x = r.values[i];
    if (!rule.inDomain(x)) {
      return { issue: issue('transform_domain', path, { column: of, fn, row: ctx.rows[i], value: x }) };
    }
    [high[i], low[i]] = rule.dd(x);
  }
  return { pieces: [{ label: transformLabel(fn, of), identity: ['transform', fn, of], high, low }] };
}

/**
 * A product of columns: numeric members enter as themselves, factor members
 * as their dummies, and the product has one column per combination (the
 * first member varying slowest), e.g. peakTemp×kiln=west.
 */
function productPieces(ctx: Context, of: unknown, path: IssuePath): Pieces {
  const members = Array.isArray(of) ? of : [];
  const seen = new Set<unknown>();
  for (let k = 0; k < members.length; k++) {
    if (seen.has(members[k])) {
      return { issue: issue('product_repeated_column', [...path, 'of', k], { column: String(members[k]) }) };
    }
    seen.add(members[k]);
  }
  if (members.length < 2) return { issue: issue('product_of_one_column', [...path, 'of'], { columns: members.map(String) }) };
  let acc: Piece[] = [];
  for (let k = 0; k < members.length; k++) {
    const name = members[k];
    const at = [...path, 'of', k];
    if (!hasColumn(ctx.columns, name)) return { issue: unknownColumn(at, name, ctx.columns) };
    const factor = ctx.factors.has(name) || columnKind(ctx.columns[name]) === 'categorical';
    const refused = factor ? textNumbersIssue(ctx, name, at) : null;
    if (refused) return { issue: refused };
    let parts: Pieces;
    if (factor) parts = factorPieces(ctx, name, at);
    else {
      const r = numericValues(ctx, name, at, null);
      parts = 'issue' in r ? r : { pieces: [exactPiece(name, ['column', name], r.values)] };
    }
    if ('issue' in parts) return parts;
    if (k === 0) {
      acc = parts.pieces;
      continue;
    }
    const next: Piece[] = [];
    for (const a of acc) {
      for (const b of parts.pieces) {
        const high = new Float64Array(a.high.length);
        const low = new Float64Array(a.high.length);
        for (let i = 0; i < high.length; i++) [high[i], low[i]] = ddMul(a.high[i], a.low[i], b.high[i], b.low[i]);
        next.push({ label: productLabel([a.label, b.label]), identity: productIdentity(a.identity, b.identity), high, low });
      }
    }
    acc = next;
  }
  return { pieces: acc };
}

function termPieces(ctx: Context, term: Term, path: IssuePath): Pieces {
  if (typeof term === 'string') return columnPieces(ctx, term, path);
  if (!term || typeof term !== 'object') return { issue: issue('term_form_unknown', path, {}) };
  switch (term.kind) {
    case 'power':
      return powerPieces(ctx, term.of, term.degree, path);
    case 'product':
      return productPieces(ctx, term.of, path);
    case 'transform':
      return transformPieces(ctx, term.of, term.fn, path);
    case 'factor':
      if (!hasColumn(ctx.columns, term.of)) {
        return { issue: unknownColumn([...path, 'of'], term.of, ctx.columns) };
      }
      return factorPieces(ctx, term.of, path);
    default:
      return { issue: issue('term_form_unknown', path, {}) };
  }
}

/** Factor declarations of a candidate; two different references for one column is an issue. */
function declaredFactors(terms: readonly Term[], termsPath: IssuePath, issues: Issue[]): Map<string, string | undefined> {
  const factors = new Map<string, string | undefined>();
  terms.forEach((term, j) => {
    if (typeof term !== 'object' || term === null || term.kind !== 'factor' || typeof term.of !== 'string') return;
    const reference = term.reference === undefined || term.reference === null ? undefined : String(term.reference);
    const earlier = factors.get(term.of);
    if (earlier !== undefined && reference !== undefined && earlier !== reference) {
      issues.push(issue('factor_reference_conflict', [...termsPath, j, 'reference'], {
        column: term.of, references: [earlier, reference],
      }));
      return;
    }
    factors.set(term.of, reference ?? earlier);
  });
  return factors;
}

/**
 * The design matrix of one candidate on the given rows (positions in the
 * data, normally the common rows). `at` is where the candidate sits in the
 * request, e.g. ['candidates', 2]; issues point below it at
 * [...at, 'terms', j, ...]. Every term is checked, so one call reports all
 * the candidate's problems.
 */
export function buildDesign(
  columns: Columns,
  terms: readonly Term[],
  intercept: boolean,
  rows: readonly number[],
  at: IssuePath = [],
): { design: DesignMatrix } | { issues: Issue[] } {
  const issues: Issue[] = [];
  const termsPath = [...at, 'terms'];
  const ctx: Context = { columns, rows, factors: declaredFactors(terms, termsPath, issues) };
  const labels: string[] = [];
  const keys: string[] = [];
  const high: Float64Array[] = [];
  const low: Float64Array[] = [];
  const termOfColumn: number[] = [];
  // Two columns are one when they share a label (the response could not tell
  // their coefficients apart) or a key (a×b and b×a are the same column).
  const firstTermOf = new Map<string, number>();
  const firstTermOfKey = new Map<string, number>();
  if (intercept) {
    labels.push(INTERCEPT_LABEL);
    keys.push(columnKey(INTERCEPT_IDENTITY));
    high.push(new Float64Array(rows.length).fill(1));
    low.push(new Float64Array(rows.length));
    termOfColumn.push(-1);
    firstTermOf.set(INTERCEPT_LABEL, -1);
    firstTermOfKey.set(keys[0], -1);
  }
  terms.forEach((term, j) => {
    const path = [...termsPath, j];
    const result = termPieces(ctx, term, path);
    if ('issue' in result) {
      issues.push(result.issue);
      return;
    }
    for (const piece of result.pieces) {
      const key = columnKey(piece.identity);
      const first = firstTermOf.get(piece.label) ?? firstTermOfKey.get(key);
      if (first !== undefined) {
        issues.push(issue('duplicate_term', path, { label: piece.label, first }));
        return;
      }
      const bad = piece.high.findIndex((v) => !Number.isFinite(v));
      if (bad >= 0) {
        issues.push(issue('design_value_not_finite', path, { label: piece.label, row: rows[bad] }));
        return;
      }
      firstTermOf.set(piece.label, j);
      firstTermOfKey.set(key, j);
      labels.push(piece.label);
      keys.push(key);
      high.push(piece.high);
      low.push(piece.low);
      termOfColumn.push(j);
    }
  });
  if (issues.length > 0) return { issues };
  return { design: { rows: rows.length, labels, keys, high, low, intercept, termOfColumn } };
}
