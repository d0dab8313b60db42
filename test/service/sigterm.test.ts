// SIGTERM under concurrent load (issue 7): new requests are refused, requests in
// flight finish, and every comparison acknowledged with an id is in the audit
// store afterwards, read back straight from the SQLite file. The process exits 0.
import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import t from 'tap';
import { openAuditStore } from '../../src/audit/open.ts';
import { demoComparison } from '../../scripts/demo-data.ts';

const root = new URL('../../', import.meta.url).pathname;

/** The service as deployed: no keys (loopback), and none of tap's loader hooks (NODE_OPTIONS, TAP_*). */
function withoutKeys(env: NodeJS.ProcessEnv): NodeJS.ProcessEnv {
  return Object.fromEntries(Object.entries(env).filter(([k]) => !/^(API_KEYS_FILE|NODE_OPTIONS|TAP.*|_TAPJS.*)$/.test(k)));
}

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

t.test('SIGTERM mid-load: every acknowledged comparison is stored; exit code 0', async (t) => {
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-sigterm-'));
  t.teardown(() => rmSync(dir, { recursive: true, force: true }));
  const auditDb = join(dir, 'audit.sqlite');
  const port = await freePort();
  const child = spawn(process.execPath, ['--import', 'tsx', 'src/server.ts'], {
    cwd: root,
    env: { ...withoutKeys(process.env), HOST: '127.0.0.1', PORT: String(port), AUDIT_DB: auditDb, LOG_LEVEL: 'info', RATE_LIMIT_PER_MINUTE: '1000000', EVENT_LOOP_MAX_DELAY_MS: '0' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let stderr = '';
  child.stderr.on('data', (d) => { stderr += d; });
  let stdout = '';
  child.stdout.on('data', (d) => { stdout += d; });
  const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
  const base = `http://127.0.0.1:${port}`;
  for (let i = 0; i < 200; i++) {
    if (await fetch(`${base}/healthz`).then((r) => r.ok, () => false)) break;
    await sleep(100);
  }

  const body = JSON.stringify(demoComparison());
  const acknowledged: string[] = [];
  const refused: number[] = [];
  let stopped = false;
  const worker = async () => {
    while (!stopped) {
      try {
        const res = await fetch(`${base}/v1/comparisons`, { method: 'POST', body, headers: { 'content-type': 'application/json' } });
        const json = await res.json();
        if (res.status === 200) acknowledged.push(json.id);
        else refused.push(res.status);
      } catch {
        stopped = true; // the listener is gone
      }
    }
  };
  const workers = Array.from({ length: 16 }, worker);
  const deadline = Date.now() + 60_000;
  while (acknowledged.length < 60 && !stopped && Date.now() < deadline) await sleep(10);
  t.ok(acknowledged.length >= 60, `load was running before SIGTERM (${acknowledged.length} acknowledged; stderr: ${stderr.slice(0, 300)})`);
  child.kill('SIGTERM');
  const code = await Promise.race([exited, sleep(30_000).then(() => 'timeout' as const)]);
  stopped = true;
  await Promise.all(workers);

  t.equal(code, 0, `exit code 0 (got ${code}; stderr: ${stderr.slice(0, 500)}; log: ${stdout.split('\n').filter((l) => /shutting|stopped|error/.test(l)).join(' ')})`);
  t.ok(refused.every((s) => s === 503), `refusals during shutdown are 503s (${refused.length})`);
  const store = await openAuditStore(auditDb);
  t.teardown(() => store.close());
  let missing = 0;
  for (const id of acknowledged) if (!(await store.get(id))) missing++;
  t.equal(missing, 0, `all ${acknowledged.length} acknowledged comparisons are in the store`);
  t.ok((await store.verify()).ok, 'the chain is intact');
});
