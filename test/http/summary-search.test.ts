// A search from data.summary against the same search from the rows: the
// same best subsets, criteria, weights and importance to 1e-9 (the summary
// fit solves the normal equations, the rows' refit uses QR; the reference is
// the rows' QR, itself checked against NIST StRD). The summary is made by
// streaming the rows as CSV through POST /v1/summaries, and a summary merged
// from two halves' summaries gives the same search.
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import { demoColumns } from '../../scripts/demo-data.ts';
import { mergeSummaries } from '../../src/core/summary/index.ts';

const close = (a: number, b: number, tol = 1e-9) => Math.abs(a - b) <= tol * Math.max(1, Math.abs(b));

t.test('a search from a streamed summary equals the search from the rows', async (t) => {
  const { app } = await buildTestApp(t);
  const d = demoColumns();
  const keep = d.shrinkage.map((y, i) => y !== null && d.moisture[i] !== null);
  const names = ['peakTemp', 'holdMinutes', 'moisture', 'west', 'shrinkage'];
  const value = (c: string, i: number) => (c === 'west' ? (d.kiln[i] === 'west' ? 1 : 0) : (d as unknown as Record<string, (number | null)[]>)[c][i]);
  const rows = d.peakTemp.map((_, i) => i).filter((i) => keep[i]);
  const columns = Object.fromEntries(names.map((c) => [c, rows.map((i) => value(c, i))]));
  const csv = (part: number[]) => [names.join(','), ...part.map((i) => names.map((c) => value(c, i)).join(','))].join('\n');
  const summarise = async (part: number[]) => {
    const res = await app.inject({ method: 'POST', url: `/v1/summaries?columns=${names.join(',')}`, headers: { 'content-type': 'text/csv' }, payload: csv(part) });
    t.equal(res.statusCode, 200, res.body.slice(0, 300));
    return res.json().summary;
  };
  const whole = await summarise(rows);
  const merged = mergeSummaries(await summarise(rows.slice(0, 50)), await summarise(rows.slice(50)));
  t.ok(merged.ok);
  const pool = ['peakTemp', 'holdMinutes', 'moisture', 'west'];
  for (const [rankBy, intercept] of [['aicc', true], ['bic', true], ['hqc', false]] as const) {
    const search = async (data: unknown) => {
      const res = await app.inject({ method: 'POST', url: '/v1/searches', payload: { data, response: 'shrinkage', pool, rankBy, intercept, top: 16 } });
      t.equal(res.statusCode, 200, res.body.slice(0, 300));
      return res.json();
    };
    const fromRows = await search({ columns });
    for (const [what, summary] of [['whole', whole], ['merged halves', merged.ok ? merged.summary : null]] as const) {
      const fromSummary = await search({ summary });
      t.equal(fromSummary.evaluated, fromRows.evaluated);
      t.equal(fromSummary.dataset.observations, fromRows.dataset.observations);
      t.same(fromSummary.models.map((m: { terms: string[] }) => m.terms), fromRows.models.map((m: { terms: string[] }) => m.terms), `${what}, ${rankBy}: same subsets in the same order`);
      for (const key of ['aic', 'aicc', 'bic', 'hqc', 'logLikelihood', 'rss', 'delta', 'weight', 'r2'] as const) {
        t.ok(fromSummary.models.every((m: Record<string, number>, i: number) => close(m[key], fromRows.models[i][key])), `${what}, ${rankBy}, intercept ${intercept}: ${key} to 1e-9`);
      }
      t.ok(fromSummary.importance.every((x: { weight: number }, j: number) => close(x.weight, fromRows.importance[j].weight)), 'importance to 1e-9');
      t.ok(fromSummary.models[0].cautions.some((c: { code: string }) => c.code === 'rows_unavailable'), 'row-level numbers said unavailable');
      t.equal(fromSummary.models[0].press, null);
    }
  }
  const product = await app.inject({ method: 'POST', url: '/v1/searches', payload: { data: { summary: whole }, response: 'shrinkage', pool: [{ kind: 'power', of: 'peakTemp', degree: 2 }] } });
  t.equal(product.statusCode, 422);
  t.equal(product.json().errors[0].code, 'summary_rows_needed');
  const bad = await app.inject({ method: 'POST', url: '/v1/searches', payload: { data: { summary: { ...whole, centredCrossProducts: whole.centredCrossProducts.map((r: number[], j: number) => r.map((v, k) => (j === 0 && k === 1 ? v * 2 : v))) } }, response: 'shrinkage', pool } });
  t.equal(bad.json().errors?.[0]?.code, 'summary_not_symmetric');
  const weighted = await app.inject({ method: 'POST', url: '/v1/searches', payload: { data: { summary: whole }, weights: 'w', response: 'shrinkage', pool } });
  t.equal(weighted.statusCode, 400, 'weights live inside a summary');
});
