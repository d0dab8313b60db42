// Spawns fixtures/append-load.ts and collects what it acknowledged.
import { spawn, type ChildProcess } from 'node:child_process';
import { fileURLToPath } from 'node:url';

const FIXTURE = fileURLToPath(new URL('./fixtures/append-load.ts', import.meta.url));

export interface Appender {
  child: ChildProcess;
  acked: { seq: number; id: string }[];
  /** Resolves with the exit code (or signal) once the child has gone. */
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null; stderr: string }>;
  /** Resolves once at least n appends were acknowledged. */
  ackedAtLeast(n: number): Promise<void>;
}

export function spawnAppender(url: string, count: number, concurrency: number, schema?: string): Appender {
  const args = ['--import', 'tsx', FIXTURE, url, String(count), String(concurrency), ...(schema ? [schema] : [])];
  const child = spawn(process.execPath, args, { stdio: ['ignore', 'pipe', 'pipe'] });
  const acked: { seq: number; id: string }[] = [];
  const waiters: { n: number; resolve: () => void }[] = [];
  let buffered = '';
  let stderr = '';
  child.stdout!.setEncoding('utf8').on('data', (chunk: string) => {
    buffered += chunk;
    const lines = buffered.split('\n');
    buffered = lines.pop()!;
    for (const line of lines) {
      const m = /^ack (\d+) (\S+)$/.exec(line);
      if (m) acked.push({ seq: Number(m[1]), id: m[2] });
    }
    for (const w of waiters.splice(0)) {
      if (acked.length >= w.n) w.resolve();
      else waiters.push(w);
    }
  });
  child.stderr!.setEncoding('utf8').on('data', (chunk: string) => (stderr += chunk));
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null; stderr: string }>((resolve) =>
    child.on('exit', (code, signal) => resolve({ code, signal, stderr })),
  );
  return {
    child,
    acked,
    exited,
    ackedAtLeast: (n) =>
      new Promise((resolve, reject) => {
        if (acked.length >= n) return resolve();
        waiters.push({ n, resolve });
        void exited.then((e) => reject(new Error(`appender exited early (${e.code ?? e.signal}): ${e.stderr}`)));
      }),
  };
}
