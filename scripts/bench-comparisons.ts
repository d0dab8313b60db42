// Comparisons per second through the whole HTTP path (app.inject: validation,
// fitting, ranking, the audit append, serialisation), with the SQLite store,
// the PostgreSQL store (when PARSIMETRY_TEST_PG_URL is set) and a baseline that
// keeps nothing, 1 and 16 requests in flight. Ratios are against the baseline
// measured in the same run. First it runs scripts/bench-audit.ts (imported, not
// copied) for the durable appends per second of the stores alone.
//   npx tsx scripts/bench-comparisons.ts [comparisons per scenario, default 1000] [appends per store scenario, default 3000] [--comparisons-only]
import { randomBytes, randomUUID } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { openAuditStore, type AuditStore, type NewRecord, type StoredRecord } from '../src/audit/open.ts';
import { defaultConfig } from '../src/config.ts';
import { buildApp } from '../src/http/app.ts';
import { demoComparison } from './demo-data.ts';
import { dropBenchSchemas } from './bench-pg.ts';

const args = process.argv.slice(2).filter((a) => !a.startsWith('--'));
const N = Number(args[0] ?? 1000);
const APPENDS = Number(args[1] ?? 3000);
const PG_URL = process.env.PARSIMETRY_TEST_PG_URL;

if (!process.argv.includes('--comparisons-only')) {
  // bench-audit.ts reads its count from argv[2] and prints its own table on import.
  process.argv.splice(2, process.argv.length - 2, String(APPENDS));
  await import('./bench-audit.ts');
  console.log('');
}

/**
 * BASELINE ONLY, never used by the service: answers append() at once and keeps
 * nothing, so the difference to it is what durable recording costs. (The service
 * itself never replies without a committed record.)
 */
function nothingKeptBaseline(): AuditStore {
  let seq = 0;
  const zeros = '0'.repeat(64);
  return {
    backend: 'sqlite',
    async append(input: NewRecord): Promise<StoredRecord> {
      seq += 1;
      return { ...(input as StoredRecord), id: randomUUID(), createdAt: new Date().toISOString(), seq, prevHash: zeros, hash: zeros };
    },
    get: async () => null,
    chainLinks: async () => ({ previous: null, next: null, head: null }),
    list: async () => ({ records: [], corrupt: [], nextCursor: null }),
    verify: async () => ({ ok: true, records: seq, head: null, firstBroken: null }),
    ready: async () => true,
    head: async () => ({ seq, id: null, hash: zeros }),
    close: async () => {},
  };
}

// Two request sizes: a dashboard's small check, and the demo comparison.
// Demo scenario (invented): tile shrinkage in a ceramics plant.
function smallBody(i: number) {
  const peakTemp = [1150, 1160, 1172, 1185, 1196, 1204, 1213, 1228, 1236, 1249, 1252, 1240];
  return {
    data: { columns: { peakTemp, shrinkage: peakTemp.map((x, j) => 5 + 0.011 * (x - 1150) + ((j * 5) % 7) / 70 + (i % 97) / 10_000) } },
    response: 'shrinkage',
    candidates: [{ name: 'linear', terms: ['peakTemp'] }, { name: 'quadratic', terms: ['peakTemp', { kind: 'power', of: 'peakTemp', degree: 2 }] }],
  };
}
const demo = demoComparison();
const bodies: { name: string; body: (i: number) => unknown }[] = [
  { name: 'small (12 rows, 2 models)', body: smallBody },
  { name: 'demo (120 rows, 5 models)', body: () => demo },
];

async function rate(store: AuditStore, body: (i: number) => unknown, inFlight: number): Promise<number> {
  // Admission control (rate limit, load shedding) is not what is measured here.
  const config = defaultConfig({ rateLimitPerMinute: 1_000_000_000, eventLoopMaxDelayMs: 0 });
  const app = await buildApp({ config, store, logger: false });
  try {
    const post = async (i: number) => {
      const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: body(i) as Record<string, unknown> });
      if (res.statusCode !== 200) throw new Error(`POST answered ${res.statusCode}: ${res.body.slice(0, 300)}`);
    };
    for (let i = 0; i < 50; i++) await post(i); // warm up: JIT, statements, connections
    let next = 0;
    const start = process.hrtime.bigint();
    await Promise.all(Array.from({ length: inFlight }, async () => {
      while (next < N) await post(next++);
    }));
    return N / (Number(process.hrtime.bigint() - start) / 1e9);
  } finally {
    await app.close();
  }
}

type StoreKind = 'baseline' | 'sqlite' | 'postgres';
const kinds: StoreKind[] = ['baseline', 'sqlite', ...(PG_URL ? (['postgres'] as const) : [])];
const dir = mkdtempSync(join(tmpdir(), 'parsimetry-bench-cmp-'));
const schemas: string[] = [];
let files = 0;

async function open(kind: StoreKind): Promise<AuditStore> {
  if (kind === 'baseline') return nothingKeptBaseline();
  if (kind === 'sqlite') return openAuditStore(join(dir, `s${files++}.sqlite`));
  const schema = `bench_cmp_${randomBytes(4).toString('hex')}`;
  schemas.push(schema);
  return openAuditStore(PG_URL!, { schema });
}

const label: Record<StoreKind, string> = {
  baseline: 'no durable store (baseline)',
  sqlite: 'sqlite file, group commit',
  postgres: 'postgres, group commit',
};

interface Row { body: string; kind: StoreKind; inFlight: number; rate: number }
const rows: Row[] = [];
try {
  for (const { name, body } of bodies) {
    for (const inFlight of [1, 16]) {
      for (const kind of kinds) {
        const store = await open(kind);
        try {
          const r = await rate(store, body, inFlight);
          if (kind !== 'baseline') {
            const report = await store.verify();
            if (!report.ok || report.records !== N + 50) throw new Error(`chain wrong after bench: ${JSON.stringify(report)}`);
          }
          rows.push({ body: name, kind, inFlight, rate: r });
        } finally {
          await store.close();
        }
      }
    }
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
  await dropBenchSchemas(PG_URL, schemas);
}

console.log(`comparisons per second through POST /v1/comparisons (app.inject, ${N} per scenario, each durable chain verified afterwards)`);
const w1 = Math.max(...rows.map((r) => r.body.length));
const w2 = Math.max(...Object.values(label).map((l) => l.length));
console.log(`${'request'.padEnd(w1)}  ${'audit store'.padEnd(w2)}  in flight  comparisons/s  vs baseline`);
for (const r of rows) {
  const base = rows.find((b) => b.body === r.body && b.inFlight === r.inFlight && b.kind === 'baseline')!.rate;
  console.log(`${r.body.padEnd(w1)}  ${label[r.kind].padEnd(w2)}  ${String(r.inFlight).padStart(9)}  ${r.rate.toFixed(0).padStart(13)}  ${(r.rate / base).toFixed(2).padStart(10)}x`);
}
if (!PG_URL) console.log('(PostgreSQL skipped: set PARSIMETRY_TEST_PG_URL, e.g. from scripts/postgres.sh start)');
