// Durable appends per second for the audit stores: one at a time (each append
// awaited before the next: one COMMIT, one fsync each), and 64 in flight with
// and without group commit. Ratios are against single-row SQLite in this run.
// PostgreSQL rows appear when PARSIMETRY_TEST_PG_URL is set (scripts/postgres.sh start).
//   npx tsx scripts/bench-audit.ts [appends per scenario, default 3000]
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { openAuditStore, requestDigest, type AuditStore, type NewRecord } from '../src/audit/open.ts';
import { dropBenchSchemas } from './bench-pg.ts';

const N = Number(process.argv[2] ?? 3000);
const PG_URL = process.env.PARSIMETRY_TEST_PG_URL;

// A record of the size a small comparison produces (demo data: tile shrinkage).
function record(n: number): NewRecord {
  const request = {
    data: { columns: { shrinkage: Array.from({ length: 40 }, (_, i) => 5 + ((i * 37) % 11) / 10), peakTemp: Array.from({ length: 40 }, (_, i) => 1150 + i * 2) } },
    response: 'shrinkage',
    candidates: [{ name: 'linear', terms: ['peakTemp'] }, { name: 'quadratic', terms: ['peakTemp', { kind: 'power', of: 'peakTemp', degree: 2 }] }],
  };
  return {
    kind: 'comparison', caller: 'bench', label: `bench ${n}`, serviceVersion: '0.1.0', conventionsVersion: '1', policy: null,
    datasetFingerprint: 'fp-bench', requestDigest: requestDigest(request), request,
    result: { ranking: [{ name: 'linear', aic: 10.1, aicc: 10.8, bic: 13.4, weight: 0.61 }, { name: 'quadratic', aic: 11.0, aicc: 12.1, bic: 16.0, weight: 0.39 }] },
  };
}

async function run(store: AuditStore, inFlight: number): Promise<number> {
  for (let i = 0; i < 50; i++) await store.append(record(i)); // warm up statements and connections
  let next = 0;
  const start = process.hrtime.bigint();
  await Promise.all(Array.from({ length: inFlight }, async () => {
    while (next < N) await store.append(record(next++));
  }));
  const seconds = Number(process.hrtime.bigint() - start) / 1e9;
  const report = await store.verify();
  if (!report.ok || report.records !== N + 50) throw new Error(`chain broken after bench: ${JSON.stringify(report)}`);
  return N / seconds;
}

interface Row { name: string; rate: number }
const rows: Row[] = [];
const dir = mkdtempSync(join(tmpdir(), 'parsimetry-bench-'));
const schemas: string[] = [];
try {
  const scenarios: [string, (s?: string) => Promise<AuditStore>, number, 'sqlite' | 'pg'][] = [
    ['sqlite  single-row, 1 in flight', () => openAuditStore(join(dir, 'a.sqlite'), { groupCommit: false }), 1, 'sqlite'],
    ['sqlite  single-row, 64 in flight', () => openAuditStore(join(dir, 'b.sqlite'), { groupCommit: false }), 64, 'sqlite'],
    ['sqlite  group commit, 64 in flight', () => openAuditStore(join(dir, 'c.sqlite'), { groupCommit: true }), 64, 'sqlite'],
  ];
  if (PG_URL) {
    const pgStore = (groupCommit: boolean) => (schema?: string) => openAuditStore(PG_URL, { groupCommit, schema });
    scenarios.push(
      ['postgres single-row, 1 in flight', pgStore(false), 1, 'pg'],
      ['postgres single-row, 64 in flight (head lock contended)', pgStore(false), 64, 'pg'],
      ['postgres group commit, 64 in flight', pgStore(true), 64, 'pg'],
    );
  }
  for (const [name, open, inFlight, kind] of scenarios) {
    const schema = kind === 'pg' ? `audit_bench_${randomBytes(4).toString('hex')}` : undefined;
    if (schema) schemas.push(schema);
    const store = await open(schema);
    try {
      rows.push({ name, rate: await run(store, inFlight) });
    } finally {
      await store.close();
    }
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
  await dropBenchSchemas(PG_URL, schemas);
}

const base = rows[0].rate;
const width = Math.max(...rows.map((r) => r.name.length));
console.log(`durable audit appends, ${N} per scenario (each verified afterwards)`);
console.log(`${'scenario'.padEnd(width)}  appends/s  ratio vs sqlite single-row`);
for (const r of rows) console.log(`${r.name.padEnd(width)}  ${r.rate.toFixed(0).padStart(9)}  ${(r.rate / base).toFixed(2).padStart(6)}x`);
if (!PG_URL) console.log('(PostgreSQL skipped: set PARSIMETRY_TEST_PG_URL, e.g. from scripts/postgres.sh start)');
