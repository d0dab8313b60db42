// Large records stored, then read: the list reads the envelope and the listing
// table only, so its cost does not grow with the size of the records on the
// page (asserted by behaviour: nothing the size of a record body is parsed
// while a page is answered), before and after a restart; verification checks
// large rows in a worker thread while the service keeps answering.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import t from 'tap';
import { defaultConfig } from '../../src/config.ts';
import { openAuditStore, requestDigest, type AuditStore, type NewRecord } from '../../src/audit/open.ts';
import { buildApp } from '../../src/http/app.ts';
import { buildTestApp } from '../helper.ts';

// Demo scenario (invented): predictions of glaze thickness for many planned firings.
export function largeRecord(i: number, predictionRows: number): NewRecord {
  const request = { response: 'thickness', candidates: [{ name: 'by-dwell', terms: ['dwell'] }], planned: i };
  const predictions = Array.from({ length: predictionRows }, (_, r) => ({ estimate: 0.4 + r * 1e-6, standardError: 0.01, lower: 0.38, upper: 0.42 }));
  return {
    kind: 'comparison', caller: 'kiln-planning', label: `planned firings ${i}`, serviceVersion: '0.1.0', conventionsVersion: '1', policy: null,
    datasetFingerprint: `sha256:${String(i).repeat(64).slice(0, 64)}`, requestDigest: requestDigest(request), request,
    result: {
      verdict: { chosen: 'by-dwell', rankBy: 'aicc', agree: true },
      models: [{ name: 'by-dwell', predictions }, { name: 'dwell-squared', predictions }],
      rankings: { aicc: [{ rank: 1, name: 'by-dwell', value: 1, delta: 0, weight: 0.7 }, { rank: 2, name: 'dwell-squared', value: 2.7, delta: 1.7, weight: 0.3 }] },
    },
  };
}

/** The longest text JSON.parse is given while `during` runs. */
export async function longestParsed<T>(during: () => Promise<T>): Promise<{ value: T; longest: number }> {
  const parse = JSON.parse;
  let longest = 0;
  JSON.parse = ((text: string, reviver?: (this: unknown, key: string, value: unknown) => unknown) => {
    longest = Math.max(longest, String(text).length);
    return parse(text, reviver);
  }) as typeof JSON.parse;
  try {
    return { value: await during(), longest };
  } finally {
    JSON.parse = parse;
  }
}

t.test('a page of large records lists without reading their bodies, before and after a restart', async (t) => {
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-large-'));
  t.teardown(() => rmSync(dir, { recursive: true, force: true }));
  const file = join(dir, 'audit.sqlite');
  // Load shedding off: the test's own appends of large records hold the loop.
  const config = defaultConfig({ auditDb: file, eventLoopMaxDelayMs: 0 });

  const open = async (): Promise<{ store: AuditStore; list: () => Promise<{ records: { id: string; best: string; label: string }[] }> }> => {
    const store = await openAuditStore(file);
    const app = await buildApp({ config, store, logger: false });
    t.teardown(async () => {
      await app.close();
      await store.close();
    });
    return {
      store,
      list: async () => {
        const res = await app.inject({ method: 'GET', url: '/v1/comparisons?limit=100' });
        t.equal(res.statusCode, 200, res.body.slice(0, 200));
        return JSON.parse(res.body);
      },
    };
  };

  const first = await open();
  // Four records of ~5 MB of result each (2 models × 30,000 prediction rows).
  const ids: string[] = [];
  for (let i = 1; i <= 4; i++) ids.push((await first.store.append(largeRecord(i, 30_000))).id);
  const before = await longestParsed(first.list);
  t.same(before.value.records.map((r) => r.id), [...ids].reverse());
  t.ok(before.value.records.every((r) => r.best === 'by-dwell'), 'the best model comes from the listing table');
  t.ok(before.longest < 100_000, `nothing record-sized was parsed (longest text parsed: ${before.longest} characters)`);

  // A restart: a new store and app on the same file.
  const second = await open();
  const after = await longestParsed(second.list);
  t.same(after.value.records.map((r) => r.label), ['planned firings 4', 'planned firings 3', 'planned firings 2', 'planned firings 1']);
  t.ok(after.longest < 100_000, `after a restart too (${after.longest})`);
});

t.test('verify walks many large records while /healthz keeps answering', async (t) => {
  const { app, store } = await buildTestApp(t);
  // Six records of ~2 MB of result each: every one is checked in the worker thread.
  for (let i = 1; i <= 6; i++) await store.append(largeRecord(i, 12_000));
  let settled = false;
  const verifying = app.inject({ method: 'GET', url: '/v1/audit/verify' }).finally(() => { settled = true; });
  let answered = 0;
  const statuses = new Set<number>();
  while (!settled) {
    statuses.add((await app.inject('/healthz')).statusCode);
    if (!settled) answered++;
    await sleep(5);
  }
  t.same([...statuses], [200]);
  const report = (await verifying).json();
  t.same({ ok: report.ok, records: report.records, firstBroken: report.firstBroken }, { ok: true, records: 6, firstBroken: null });
  t.ok(answered >= 3, `/healthz answered ${answered} times while the chain was being verified`);
});

t.test('chart and report of a record with 100,000 prediction rows per model: a bounded page that says what it left out', async (t) => {
  const { app, store } = await buildTestApp(t);
  const base = largeRecord(7, 100_000);
  const coefficients = Array.from({ length: 1_000 }, (_, j) => ({ term: `dwell×batch=${j}`, estimate: j / 1000, standardError: 0.01 }));
  const result = base.result as { models: Record<string, unknown>[] };
  const record = await store.append({
    ...base,
    result: {
      ...base.result,
      models: result.models.map((m) => ({ ...m, coefficients, aliased: Array.from({ length: 300 }, (_, j) => `batch=${j}`) })),
      averaged: {
        terms: coefficients.map((c) => ({ term: c.term, estimate: c.estimate, unconditionalStandardError: 0.02, importance: 0.5 })),
        predictions: (result.models[0].predictions as unknown[]),
      },
    },
  });
  const report = await app.inject({ method: 'GET', url: `/v1/comparisons/${record.id}/report` });
  t.equal(report.statusCode, 200, report.body.slice(0, 300));
  t.ok(report.body.length < 1_000_000, `the page stays small (${report.body.length} characters)`);
  t.match(report.body, /Showing the first 50 of 100000 averaged predictions; the stored record \(GET \/v1\/comparisons\/[0-9a-f-]+\) holds them all\./);
  t.match(report.body, /Showing the first 200 of 1000 coefficients/);
  t.match(report.body, /Showing the first 200 of 1000 averaged terms/);
  t.match(report.body, /and 100 more/, 'aliased names are cut short too');
  const chart = await app.inject({ method: 'GET', url: `/v1/comparisons/${record.id}/chart.svg` });
  t.equal(chart.statusCode, 200);
  t.ok(chart.body.length < 100_000, `the chart draws the models, not the rows (${chart.body.length} characters)`);
});
