// Building a SubsetProblem: from a data summary (the fixed summary form, or
// the one summariseRows makes from design columns of raw rows).
// With an intercept the kernel works on the centred cross products directly.
// Without one it needs raw sums of products, reconstructed here as
// C + W mean mean^T; that reconstruction loses the digits that centring
// saved (relative error ~1e-16 * (mean/spread)^2), so no-intercept searches
// are less accurate than intercept ones — the refit of the top models by QR
// on the rows (when rows were given) restores full accuracy for those.

import { summariseRows } from '../summary/summarise.ts';
import type { DataSummary, SummaryIssue } from '../summary/types.ts';
import type { DesignMatrix } from '../types.ts';
import type { HierarchyRules } from './hierarchy.ts';
import type { SubsetProblem } from './types.ts';

export interface SummarySearchSpec {
  response: string;
  /** Per pool term, the summary columns of its block. */
  pool: string[][];
  /** Summary columns of the always terms. */
  always: string[];
  intercept: boolean;
  /** From hierarchyRules: requires, and the unreachable terms as blocked. */
  requires?: number[][];
  blocked?: number[];
}

export type ProblemOutcome = { ok: true; problem: SubsetProblem; columns: string[] } | { ok: false; issues: SummaryIssue[] };

export function subsetProblemFromSummary(summary: DataSummary, spec: SummarySearchSpec): ProblemOutcome {
  const index = new Map(summary.columns.map((c, j) => [c, j]));
  const issues: SummaryIssue[] = [];
  const wanted = [...spec.pool.flat(), ...spec.always, spec.response];
  for (const name of new Set(wanted)) {
    if (!index.has(name)) {
      issues.push({
        code: 'summary_column_unknown',
        path: ['data', 'summary', 'columns'],
        message: `The summary lists no column ${JSON.stringify(name)}; a search from a summary can use only its listed columns.`,
        facts: { column: name },
      });
    }
  }
  if (issues.length > 0) return { ok: false, issues };
  // Design columns in order: pool blocks, then always, then the response.
  const columns: string[] = [];
  const position = new Map<string, number>();
  const place = (name: string): number => {
    let at = position.get(name);
    if (at === undefined) {
      at = columns.length;
      columns.push(name);
      position.set(name, at);
    }
    return at;
  };
  const poolBlocks = spec.pool.map((block) => block.map(place));
  const alwaysColumns = spec.always.map(place);
  const d = columns.length + 1;
  const source = [...columns, spec.response].map((c) => index.get(c) as number);
  const w = summary.weights ? summary.weights.sum : summary.rows;
  const cross = new Float64Array(d * d);
  for (let i = 0; i < d; i++) {
    for (let j = 0; j < d; j++) {
      const a = source[i];
      const b = source[j];
      let v = summary.centredCrossProducts[a][b];
      if (!spec.intercept) v += w * summary.means[a] * summary.means[b];
      cross[i * d + j] = v;
    }
  }
  return {
    ok: true,
    columns,
    problem: {
      observations: summary.rows,
      logWeightSum: summary.weights ? summary.weights.sumLog : 0,
      intercept: spec.intercept,
      dimension: d,
      crossProducts: cross,
      poolBlocks,
      alwaysColumns,
      requires: spec.requires ?? spec.pool.map(() => []),
      blocked: spec.blocked ?? [],
    },
  };
}

/**
 * From a design built (by buildDesign) over the terms [...pool, ...always]
 * in that order: column blocks come from `termOfColumn`. One pass over the
 * rows (the corrected two-pass summary); everything after is O(d^2) per subset.
 */
export function subsetProblemFromDesign(
  design: DesignMatrix,
  response: Float64Array,
  weights: Float64Array | null,
  poolSize: number,
  rules?: HierarchyRules,
): SubsetProblem {
  const columns: Float64Array[] = [];
  const names: string[] = [];
  const pool: string[][] = Array.from({ length: poolSize }, () => []);
  const always: string[] = [];
  design.termOfColumn.forEach((term, j) => {
    if (term < 0) return;
    const values = new Float64Array(design.rows);
    const hi = design.high[j];
    const lo = design.low[j];
    for (let i = 0; i < design.rows; i++) values[i] = hi[i] + lo[i];
    const name = `#${j}`;
    columns.push(values);
    names.push(name);
    if (term < poolSize) pool[term].push(name);
    else always.push(name);
  });
  columns.push(response);
  names.push('#response');
  const summary = summariseRows(columns, weights, names);
  const outcome = subsetProblemFromSummary(summary, {
    response: '#response',
    pool,
    always,
    intercept: design.intercept,
    requires: rules?.requires,
    blocked: rules?.unreachable.map((u) => u.term),
  });
  if (!outcome.ok) throw new Error('design columns missing from their own summary'); // unreachable: names made above
  return outcome.problem;
}
