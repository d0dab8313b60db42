// The hierarchy rule of a search (the marginality principle of polynomial
// and interaction models; Nelder 1977, Peixoto 1987 "well-formulated"
// polynomials): a model that holds a power or a product also holds every
// lower-order term it is built from.
//   power x^d       needs x and x^2 .. x^(d-1)
//   product a×b×c   needs every proper sub-product: a, b, c, a×b, a×c, b×c
// A factor counts as its column (kiln and the factor term of kiln, reference west,
// satisfy the same need). Transforms (log x, 1/x) are new variables and need
// nothing. Products of powers are not a term form of the contract (a product
// may not repeat a column), so no rule is needed for them; the monomial
// reading here (a term is the multiset of columns it multiplies) would
// extend to one unchanged: a monomial needs every monomial that divides it.
// A need met by an `always` term is met in every subset; a need met by
// neither the pool nor `always` makes the term unable to enter at all, and
// is reported so the caller can see why it never appears. An always term is
// in every subset, so its own needs must be always terms too: one met only
// by the pool (or nowhere) is reported, and the search refuses to run.

import type { Term } from '../types.ts';

/** The columns a term multiplies, as a sorted multiset; null for a term outside the monomial rule (a transform). */
function monomial(term: Term): string[] | null {
  if (typeof term === 'string') return [term];
  switch (term.kind) {
    case 'factor':
      return [term.of];
    case 'power':
      return Array.from({ length: term.degree }, () => term.of);
    case 'product':
      return [...term.of].sort();
    default:
      return null;
  }
}

const keyOf = (m: readonly string[]): string => JSON.stringify(m);

/** Every proper, non-empty sub-multiset of a sorted multiset, sorted, without repeats. */
function properDivisors(m: readonly string[]): string[][] {
  const out = new Map<string, string[]>();
  const total = 1 << m.length;
  for (let mask = 1; mask < total - 1; mask++) {
    const part = m.filter((_, i) => (mask >>> i) & 1);
    out.set(keyOf(part), part);
  }
  return [...out.values()];
}

export interface HierarchyRules {
  /** Per pool term, the pool terms it needs (indices into the pool). */
  requires: number[][];
  /** Pool terms that can never enter, with the lower-order terms that are missing from both pool and always. */
  unreachable: { term: number; missing: string[][] }[];
  /** Always terms with a need always does not meet: each need, and the pool term that holds it (null: nowhere). */
  alwaysUnmet: { term: number; needs: string[]; poolTerm: number | null }[];
}

export function hierarchyRules(pool: readonly Term[], always: readonly Term[]): HierarchyRules {
  const poolIndex = new Map<string, number>();
  pool.forEach((t, i) => {
    const m = monomial(t);
    if (m && !poolIndex.has(keyOf(m))) poolIndex.set(keyOf(m), i);
  });
  const alwaysKeys = new Set(always.map(monomial).filter((m): m is string[] => m !== null).map(keyOf));
  const requires: number[][] = [];
  const unreachable: HierarchyRules['unreachable'] = [];
  pool.forEach((t, i) => {
    const m = monomial(t);
    const needs: number[] = [];
    const missing: string[][] = [];
    if (m && m.length > 1) {
      for (const d of properDivisors(m)) {
        const k = keyOf(d);
        if (alwaysKeys.has(k)) continue;
        const j = poolIndex.get(k);
        if (j === undefined) missing.push(d);
        else if (j !== i && !needs.includes(j)) needs.push(j);
      }
    }
    requires.push(needs.sort((a, b) => a - b));
    if (missing.length > 0) unreachable.push({ term: i, missing });
  });
  const alwaysUnmet: HierarchyRules['alwaysUnmet'] = [];
  always.forEach((t, i) => {
    const m = monomial(t);
    if (!m || m.length < 2) return;
    for (const d of properDivisors(m)) {
      if (alwaysKeys.has(keyOf(d))) continue;
      alwaysUnmet.push({ term: i, needs: d, poolTerm: poolIndex.get(keyOf(d)) ?? null });
    }
  });
  return { requires, unreachable, alwaysUnmet };
}

/** No rules: every subset is admitted. */
export function noHierarchy(poolSize: number): HierarchyRules {
  return { requires: Array.from({ length: poolSize }, () => []), unreachable: [], alwaysUnmet: [] };
}
