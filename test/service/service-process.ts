// The service as an operator runs it: a child process on a loopback port it
// picks itself (PORT=0) — from sources (`node --import tsx src/server.ts`) or,
// with `compiled`, the production build (`node dist/server.js`, no TypeScript
// loader anywhere) — and a load driver that fires comparisons at it with a
// bounded number in flight.
import { spawn, type ChildProcess } from 'node:child_process';
import { fileURLToPath } from 'node:url';

const REPO = fileURLToPath(new URL('../../', import.meta.url));
const EXIT_WITH_PARENT = new URL('./exit-with-parent.mjs', import.meta.url).href;

export interface ServiceProcess {
  child: ChildProcess;
  base: string;
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
  output(): string;
}

/**
 * Starts the service and resolves once it listens (fastify logs "Server listening at <url>" as JSON)
 * and its compute workers are up (/readyz no longer says `computeWorkers: "starting"`), as a balancer
 * would wait before sending it work.
 */
export async function startService(env: Record<string, string>, startupMs = 30_000, compiled = false): Promise<ServiceProcess> {
  const deadline = Date.now() + startupMs;
  const service = await listening(env, startupMs, compiled);
  while (Date.now() < deadline) {
    const body = await fetch(`${service.base}/readyz`).then((r) => r.json() as Promise<{ computeWorkers?: string }>, () => ({ computeWorkers: 'starting' }));
    if (body.computeWorkers !== 'starting') return service;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  service.child.kill('SIGKILL');
  throw new Error(`the service's compute workers did not start within ${startupMs} ms:\n${service.output().slice(-3000)}`);
}

function listening(env: Record<string, string>, startupMs = 30_000, compiled = false): Promise<ServiceProcess> {
  // exit-with-parent: a test that dies half-way must not leave a service listening.
  const entry = compiled ? ['--import', EXIT_WITH_PARENT, 'dist/server.js'] : ['--import', 'tsx', '--import', EXIT_WITH_PARENT, 'src/server.ts'];
  const child = spawn(process.execPath, entry, {
    cwd: REPO,
    env: {
      ...process.env,
      PORT: '0',
      HOST: '127.0.0.1',
      LOG_LEVEL: 'info',
      // These tests measure durability, not admission control: keep the rate
      // limiter (when present) out of the way of a few hundred requests a second,
      // and load shedding too (on a busy shared machine two replicas at 16 in
      // flight lag past EVENT_LOOP_MAX_DELAY_MS and were answered 503).
      RATE_LIMIT_PER_MINUTE: '1000000',
      EVENT_LOOP_MAX_DELAY_MS: '0',
      ...env,
    },
    stdio: ['pipe', 'pipe', 'pipe'],
  });
  let out = '';
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
    child.on('exit', (code, signal) => resolve({ code, signal })),
  );
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => {
      child.kill('SIGKILL');
      reject(new Error(`service did not start within ${startupMs} ms:\n${out.slice(-3000)}`));
    }, startupMs);
    let buffered = '';
    let started = false;
    child.stdout!.setEncoding('utf8').on('data', (chunk: string) => {
      out += chunk;
      if (out.length > 200_000) out = out.slice(-100_000); // keep the tail for error messages only
      buffered += chunk;
      const lines = buffered.split('\n');
      buffered = lines.pop()!;
      for (const line of lines) {
        if (started) break;
        let entry: { msg?: unknown };
        try {
          entry = JSON.parse(line);
        } catch {
          continue;
        }
        const m = typeof entry.msg === 'string' ? /Server listening at (http:\/\/127\.0\.0\.1:\d+)/.exec(entry.msg) : null;
        if (m) {
          started = true;
          clearTimeout(timer);
          resolve({ child, base: m[1], exited, output: () => out });
        }
      }
    });
    child.stderr!.setEncoding('utf8').on('data', (chunk: string) => (out += chunk));
    void exited.then((e) => {
      if (started) return;
      clearTimeout(timer);
      reject(new Error(`service exited before listening (${e.code ?? e.signal}):\n${out.slice(-3000)}`));
    });
  });
}

// Demo scenario (invented): tile shrinkage against peak kiln temperature and
// clay moisture, a little different for every request so each id has its own result.
export function loadComparison(i: number) {
  const peakTemp = [1150, 1160, 1172, 1185, 1196, 1204, 1213, 1228, 1236, 1249, 1252, 1240];
  const moisture = [5.1, 6.2, 4.8, 5.5, 7.0, 6.1, 5.9, 4.4, 6.8, 5.2, 6.0, 7.2];
  const shrinkage = peakTemp.map((x, j) => 5 + 0.011 * (x - 1150) + 0.3 * (moisture[j] - 6) + ((j * 5) % 7) / 70 + (i % 997) / 10_000);
  return {
    data: { columns: { shrinkage, peakTemp, moisture } },
    response: 'shrinkage',
    candidates: [
      { name: 'temperature', terms: ['peakTemp'] },
      { name: 'temperature+moisture', terms: ['peakTemp', 'moisture'] },
    ],
    label: `load ${i}`,
  };
}

export interface Acknowledged {
  id: string;
  body: Record<string, unknown>;
}

export interface LoadRun {
  acked: Acknowledged[];
  /** Requests that got an answer other than 200, or none (refused, reset). */
  failed: number;
  /** Requests that had been sent when the run was stopped. */
  sent: number;
}

/**
 * POSTs `total` comparisons (request i uses loadComparison(offset + i)) with
 * `inFlight` at a time; `shouldStop` is asked before each request, so a run cut
 * short ends by itself.
 */
export async function driveLoad(base: string, total: number, inFlight: number, options: {
  offset?: number;
  shouldStop?: () => boolean;
  /** Called after each acknowledgement with the run so far. */
  onAck?: (run: LoadRun) => void;
  requestTimeoutMs?: number;
} = {}): Promise<LoadRun> {
  const run: LoadRun = { acked: [], failed: 0, sent: 0 };
  let next = 0;
  const worker = async () => {
    while (next < total && !options.shouldStop?.()) {
      const i = next++;
      run.sent += 1;
      try {
        const res = await fetch(`${base}/v1/comparisons`, {
          method: 'POST',
          headers: { 'content-type': 'application/json' },
          body: JSON.stringify(loadComparison((options.offset ?? 0) + i)),
          signal: AbortSignal.timeout(options.requestTimeoutMs ?? 30_000),
        });
        const text = await res.text();
        if (res.status === 200) {
          const body = JSON.parse(text) as Record<string, unknown>;
          run.acked.push({ id: body.id as string, body });
          options.onAck?.(run);
        } else run.failed += 1;
      } catch {
        run.failed += 1;
      }
    }
  };
  await Promise.all(Array.from({ length: inFlight }, worker));
  return run;
}

export async function getJson(url: string): Promise<{ status: number; body: any }> {
  const res = await fetch(url, { signal: AbortSignal.timeout(30_000) });
  return { status: res.status, body: await res.json() };
}

/** SIGTERM, then SIGKILL if it has not gone within graceMs. */
export async function stopService(service: ServiceProcess, graceMs = 10_000): Promise<void> {
  if (service.child.exitCode !== null || service.child.signalCode !== null) return;
  service.child.kill('SIGTERM');
  const timer = setTimeout(() => service.child.kill('SIGKILL'), graceMs);
  await service.exited;
  clearTimeout(timer);
}

function sortKeys(v: unknown): unknown {
  if (Array.isArray(v)) return v.map(sortKeys);
  if (v !== null && typeof v === 'object') {
    return Object.fromEntries(Object.keys(v).sort().map((k) => [k, sortKeys((v as Record<string, unknown>)[k])]));
  }
  return v;
}

/** Deep equality of two JSON values, key order aside (cheap enough for hundreds of results). */
export function sameJson(a: unknown, b: unknown): boolean {
  return JSON.stringify(sortKeys(a)) === JSON.stringify(sortKeys(b));
}
