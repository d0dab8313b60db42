// npm run demo: start the service in-process on a free port with a throwaway
// audit file, post the demo comparison over real HTTP, print the ranking as an
// aligned table, fetch the comparison's chart and report as a user would and
// write them to out/, and stop.
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative, resolve } from 'node:path';
import { defaultConfig } from '../src/config.ts';
import { openAuditStore } from '../src/audit/open.ts';
import { buildApp } from '../src/http/app.ts';
import { demoComparison } from './demo-data.ts';
import { formatRankingTable } from './ranking-table.ts';

const dir = mkdtempSync(join(tmpdir(), 'parsimetry-demo-'));
const config = defaultConfig({ auditDb: join(dir, 'audit.sqlite'), port: 0 });
const store = await openAuditStore(config.auditDb);
const app = await buildApp({ config, store, logger: false });
try {
  const address = await app.listen({ host: '127.0.0.1', port: 0 });
  const response = await fetch(`${address}/v1/comparisons`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify(demoComparison()),
  });
  const body = await response.json();
  if (!response.ok) {
    process.stderr.write(`demo: the service answered ${response.status}: ${JSON.stringify(body, null, 2)}\n`);
    process.exitCode = 1;
  } else {
    process.stdout.write(formatRankingTable(body));
    const outDir = resolve(import.meta.dirname, '../out');
    mkdirSync(outDir, { recursive: true });
    for (const [path, file] of [['chart.svg', 'demo-chart.svg'], ['report', 'demo-report.html']]) {
      const picture = await fetch(`${address}/v1/comparisons/${body.id}/${path}`);
      const text = await picture.text();
      if (!picture.ok) {
        process.stderr.write(`demo: GET ${path} answered ${picture.status}: ${text}\n`);
        process.exitCode = 1;
        continue;
      }
      const target = join(outDir, file);
      writeFileSync(target, text);
      process.stdout.write(`${(path === 'report' ? 'report:' : 'chart:').padEnd(8)}${relative(process.cwd(), target) || target}\n`);
    }
  }
} finally {
  await app.close();
  await store.close();
  rmSync(dir, { recursive: true, force: true });
}
