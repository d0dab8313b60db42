// A live service for the clients' tests: the service's own server entry (src/server.ts, run by
// tsx as `npm run dev` does) in a child process on a port the system picks (PORT=0), with a
// temporary SQLite audit file; its address is read from the "listening on" log line. Stopped,
// and its files removed, when the test ends.
import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Test } from 'tap';

const root = new URL('../../', import.meta.url);

export async function startLiveService(t: Test): Promise<string> {
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-client-'));
  // Open (no keys) and on the built-in policy, whatever the environment running the tests says.
  const env: NodeJS.ProcessEnv = { ...process.env, PORT: '0', HOST: '127.0.0.1', AUDIT_DB: join(dir, 'audit.sqlite'), LOG_LEVEL: 'info' };
  delete env.API_KEYS_FILE;
  delete env.POLICY_FILE;
  const child = spawn(process.execPath, ['--import', 'tsx', 'src/server.ts'], {
    cwd: root,
    env,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  t.teardown(async () => {
    if (child.exitCode === null) {
      const exited = new Promise((resolve) => child.once('exit', resolve));
      child.kill('SIGTERM');
      await exited;
    }
    rmSync(dir, { recursive: true, force: true });
  });
  let output = '';
  return new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`the service did not start within 60 s:\n${output}`)), 60_000);
    const read = (chunk: Buffer) => {
      output += chunk.toString('utf8');
      const listening = /listening on (http:\/\/[^\s"()]+)/.exec(output);
      if (listening) {
        clearTimeout(timer);
        resolve(listening[1]);
      }
    };
    child.stdout.on('data', read);
    child.stderr.on('data', read);
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`the service exited (${code}) before listening:\n${output}`));
    });
  });
}
