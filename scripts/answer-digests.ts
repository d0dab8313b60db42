// SHA-256 of every byte a comparison produces, for a before/after check of a
// change that must not move any number: the answer (without its id and time),
// and the request and result texts as the SQLite audit row stores them, each
// computed on the main thread and on a worker of the pool. Run it on both
// commits and diff the output.
//   npx tsx scripts/answer-digests.ts
import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { defaultConfig } from '../src/config.ts';
import { openAuditStore } from '../src/audit/open.ts';
import { buildApp } from '../src/http/app.ts';
import { demoComparison } from './demo-data.ts';

const sha = (text: string) => createHash('sha256').update(text).digest('hex').slice(0, 20);

function bodies(): [string, object][] {
  const demo = demoComparison();
  const cols = demo.data.columns as Record<string, (number | string)[]>;
  const n = cols.shrinkage.length;
  const w = Array.from({ length: n }, (_, i) => 0.5 + (i % 7) / 4);
  return [
    ['demo', demo],
    ['demo 300 rows', demoComparison(300)],
    ['demo 40 rows', demoComparison(40)],
    ['demo, predictions and confidence-set averaging', {
      ...demo,
      options: { average: 'confidenceSet', predict: { columns: { peakTemp: [1190, 1230], moisture: [5.5, 6.5], kiln: ['east', 'west'], holdMinutes: [30, 45] } } },
    }],
    ['demo, weighted', { ...demo, data: { columns: { ...cols, w } }, weights: 'w', options: { rankBy: 'bic' } }],
    ['demo, glm and nonlinear beside least squares', {
      ...demo,
      candidates: [
        ...demo.candidates.slice(0, 2),
        { name: 'gamma-log', terms: ['peakTemp', 'moisture'], family: 'gamma', link: 'log' },
        { name: 'saturating', expression: 'a + b*exp(-c*(peakTemp - 1150)/100)', start: { a: 5, b: 1, c: 1 } },
      ],
    }],
    ['demo, life distributions', {
      ...demo,
      candidates: [{ name: 'weibull', distribution: 'weibull', terms: ['peakTemp'] }, { name: 'lognormal', distribution: 'lognormal', terms: ['peakTemp'] }],
    }],
  ];
}

async function run(where: string, inlineWork: number) {
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-digests-'));
  const config = defaultConfig({ auditDb: join(dir, 'audit.sqlite'), rateLimitPerMinute: 1e9, eventLoopMaxDelayMs: 0, computeInlineWork: inlineWork });
  const store = await openAuditStore(config.auditDb);
  const app = await buildApp({ config, store, logger: false });
  const ids: [string, string][] = [];
  for (const [name, payload] of bodies()) {
    const r = await app.inject({ method: 'POST', url: '/v1/comparisons', payload });
    if (r.statusCode !== 200) {
      console.log(`${where.padEnd(7)} ${name.padEnd(48)} status ${r.statusCode} ${sha(r.body)}`);
      continue;
    }
    const { id, createdAt: _t, ...rest } = r.json() as Record<string, unknown>;
    const answer = r.body.replace(`"id":"${id}"`, '').replace(/"createdAt":"[^"]*"/, '');
    ids.push([name, id as string]);
    console.log(`${where.padEnd(7)} ${name.padEnd(48)} answer ${sha(answer)} parsed ${sha(JSON.stringify(rest))}`);
  }
  await app.close();
  await store.close();
  const db = new Database(config.auditDb, { readonly: true });
  const row = db.prepare('SELECT request, result, request_digest FROM audit_records WHERE id = ?');
  for (const [name, id] of ids) {
    const { request, result, request_digest } = row.get(id) as { request: string; result: string; request_digest: string };
    console.log(`${where.padEnd(7)} ${name.padEnd(48)} stored request ${sha(request)} result ${sha(result)} digest ${request_digest.slice(0, 20)}`);
  }
  db.close();
  rmSync(dir, { recursive: true, force: true });
}

await run('inline', 1e12);
await run('pooled', 0);
