// What a design column is, as opposed to what it is called. A label is for
// people and a data column's name can imitate one ("x^2" holding sin x, a
// column named "intercept"); a key is built from the structured term, so
// two columns of one comparison share a key exactly when the design builder
// formed them the same way from the same data: nested tests and model
// averaging compare keys, never labels.
//
// A key is the JSON text of a small tree:
//   ["intercept"]
//   ["column", name]
//   ["power", of, degree]
//   ["transform", fn, of]
//   ["level", column, level, reference]     a treatment dummy, with the
//                                            reference its coefficient is
//                                            measured against
//   ["product", member, member, ...]        members in code-point order of
//                                            their keys, since a×b and b×a
//                                            are the same column
import { compareCodePoints } from './code-point-order.ts';

export type ColumnIdentity =
  | ['intercept']
  | ['column', string]
  | ['power', string, number]
  | ['transform', 'log' | 'sqrt' | 'reciprocal', string]
  | ['level', string, string, string]
  | ['product', ...ColumnIdentity[]];

export const INTERCEPT_IDENTITY: ColumnIdentity = ['intercept'];

/** The product of two columns' identities, flattened and put in canonical order. */
export function productIdentity(a: ColumnIdentity, b: ColumnIdentity): ColumnIdentity {
  const members = (x: ColumnIdentity): ColumnIdentity[] => (x[0] === 'product' ? (x.slice(1) as ColumnIdentity[]) : [x]);
  const all = [...members(a), ...members(b)];
  all.sort((p, q) => compareCodePoints(JSON.stringify(p), JSON.stringify(q)));
  return ['product', ...all];
}

export function columnKey(identity: ColumnIdentity): string {
  return JSON.stringify(identity);
}

function parseKey(key: string): ColumnIdentity | null {
  try {
    const value: unknown = JSON.parse(key);
    return Array.isArray(value) && typeof value[0] === 'string' ? (value as ColumnIdentity) : null;
  } catch {
    return null;
  }
}

/** What kind of column a key identifies ("power", "product", …), or null for a key that is not one. */
export function keyKind(key: string): ColumnIdentity[0] | null {
  return parseKey(key)?.[0] ?? null;
}

/** The factor codings a column involves: column and reference per dummy, in key order. */
export function keyReferences(key: string): { column: string; reference: string }[] {
  const out: { column: string; reference: string }[] = [];
  const walk = (id: ColumnIdentity) => {
    if (id[0] === 'level') out.push({ column: id[1], reference: id[3] });
    else if (id[0] === 'product') (id.slice(1) as ColumnIdentity[]).forEach(walk);
  };
  const id = parseKey(key);
  if (id) walk(id);
  return out;
}

function describe(id: ColumnIdentity): string {
  switch (id[0]) {
    case 'intercept':
      return 'the intercept';
    case 'column':
      return `data column ${JSON.stringify(id[1])}`;
    case 'power':
      return `${JSON.stringify(id[1])} to the power ${id[2]}`;
    case 'transform':
      return `${id[1]} of ${JSON.stringify(id[2])}`;
    case 'level':
      return `${JSON.stringify(id[1])} = ${JSON.stringify(id[2])} against ${JSON.stringify(id[3])}`;
    case 'product':
      return (id.slice(1) as ColumnIdentity[]).map(describe).join(' times ');
  }
}

/**
 * Words that tell apart columns whose labels are alike. For a column with
 * factor dummies it is the coding: "reference east", or
 * "references kiln east, glaze matte" for several factors; otherwise (a data
 * column named like a built one) what the column is: 'data column "x^2"',
 * '"x" to the power 2'.
 */
export function columnQualifier(key: string): string {
  const refs = keyReferences(key);
  if (refs.length === 1) return `reference ${refs[0].reference}`;
  if (refs.length > 1) return `references ${refs.map((r) => `${r.column} ${r.reference}`).join(', ')}`;
  const id = parseKey(key);
  return id ? describe(id) : key;
}
