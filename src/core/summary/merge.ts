// Pairwise combination of two summaries of disjoint row sets (Chan, Golub &
// LeVeque 1979/1983): with delta = mean_b - mean_a and W = W_a + W_b,
//   mean = mean_a + delta * W_b / W
//   C    = C_a + C_b + (W_a W_b / W) delta delta^T
// where W is the row count (unweighted) or the weight sum (weighted). The
// update is exact in exact arithmetic and, unlike adding raw sums of
// products, never subtracts two large nearly equal numbers.

import type { DataSummary, SummaryIssue } from './types.ts';

export type MergeOutcome = { ok: true; summary: DataSummary } | { ok: false; issues: SummaryIssue[] };

export function mergeSummaries(a: DataSummary, b: DataSummary): MergeOutcome {
  const issues: SummaryIssue[] = [];
  if (a.columns.length !== b.columns.length || a.columns.some((c, j) => c !== b.columns[j])) {
    issues.push({
      code: 'summary_columns_differ',
      path: ['columns'],
      message: 'The two summaries list different columns (or the same columns in another order); merge needs the same list.',
      facts: { first: a.columns, second: b.columns },
    });
  }
  if ((a.weights === undefined) !== (b.weights === undefined)) {
    issues.push({
      code: 'summary_weighting_differs',
      path: ['weights'],
      message: 'One summary is weighted and the other is not; they cannot be merged.',
      facts: { firstWeighted: a.weights ? 'yes' : 'no', secondWeighted: b.weights ? 'yes' : 'no' },
    });
  }
  if (issues.length > 0) return { ok: false, issues };
  if (a.rows === 0) return { ok: true, summary: copy(b) };
  if (b.rows === 0) return { ok: true, summary: copy(a) };
  const wa = a.weights ? a.weights.sum : a.rows;
  const wb = b.weights ? b.weights.sum : b.rows;
  const w = wa + wb;
  const p = a.columns.length;
  const delta = a.means.map((m, j) => b.means[j] - m);
  const means = a.means.map((m, j) => m + (delta[j] * wb) / w);
  const f = (wa * wb) / w;
  const cross = Array.from({ length: p }, (_, j) =>
    Array.from({ length: p }, (_, k) => a.centredCrossProducts[j][k] + b.centredCrossProducts[j][k] + f * delta[j] * delta[k]),
  );
  const summary: DataSummary = { rows: a.rows + b.rows, columns: [...a.columns], means, centredCrossProducts: cross };
  if (a.weights && b.weights) summary.weights = { sum: w, sumLog: a.weights.sumLog + b.weights.sumLog };
  return { ok: true, summary };
}

function copy(s: DataSummary): DataSummary {
  const out: DataSummary = {
    rows: s.rows,
    columns: [...s.columns],
    means: [...s.means],
    centredCrossProducts: s.centredCrossProducts.map((r) => [...r]),
  };
  if (s.weights) out.weights = { ...s.weights };
  return out;
}
