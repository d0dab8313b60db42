// buildApp for tests: a real SQLite audit file in a temporary directory, closed
// and removed on teardown.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Test } from 'tap';
import { defaultConfig, type Config } from '../src/config.ts';
import { openAuditStore } from '../src/audit/open.ts';
import { buildApp } from '../src/http/app.ts';
import type { KeyRing } from '../src/http/security/key-ring.ts';
import type { ComputePool } from '../src/compute/index.ts';
import type { ActivePolicy } from '../src/policy-file.ts';

/**
 * keys: API keys for the app (default none: open, as on loopback); policy: a team policy (default built in);
 * compute: a compute pool the test watches (default: the app's own, whose workers start on first use).
 */
export async function buildTestApp(t: Test, overrides: Partial<Config> = {}, options: { keys?: KeyRing; policy?: ActivePolicy; compute?: ComputePool } = {}) {
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-test-'));
  // Load shedding off unless a test turns it on: a test's own heavy computing in
  // the same process (brute-force references, parsers) must not read as overload.
  const config = defaultConfig({ auditDb: join(dir, 'audit.sqlite'), eventLoopMaxDelayMs: 0, ...overrides });
  const store = await openAuditStore(config.auditDb);
  const app = await buildApp({ config, store, logger: false, keys: options.keys, policy: options.policy, compute: options.compute });
  t.teardown(async () => {
    await app.close();
    await store.close();
    rmSync(dir, { recursive: true, force: true });
  });
  return { app, store, config };
}
