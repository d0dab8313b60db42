// server.ts refuses to start open beyond loopback, and on a bad keys file, with
// exit code 2 and a message naming the settings.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import t from 'tap';

const root = new URL('../../../', import.meta.url).pathname;
const dir = mkdtempSync(join(tmpdir(), 'parsimetry-startup-'));

function start(env: Record<string, string>) {
  const clean = Object.fromEntries(Object.entries(process.env).filter(([k]) => !/^(HOST|PORT|API_KEYS_FILE|AUDIT_DB)$/.test(k)));
  return spawnSync(process.execPath, ['--import', 'tsx', 'src/server.ts'], {
    cwd: root, env: { ...clean, AUDIT_DB: join(dir, 'a.sqlite'), PORT: '0', ...env }, encoding: 'utf8', timeout: 30_000,
  });
}

t.test('no keys and HOST=0.0.0.0: exit 2 naming HOST and API_KEYS_FILE', async (t) => {
  const r = start({ HOST: '0.0.0.0' });
  t.equal(r.status, 2);
  t.match(r.stderr, /HOST=0\.0\.0\.0 is not a loopback address/);
  t.match(r.stderr, /API_KEYS_FILE/);
});

t.test('a keys file that is not in the fixed form: exit 2 naming the problem', async (t) => {
  const file = join(dir, 'keys.json');
  writeFileSync(file, JSON.stringify({ keys: [{ id: 'dashboard', sha256: 'not-hex', roles: ['read'] }] }));
  const r = start({ HOST: '0.0.0.0', API_KEYS_FILE: file });
  t.equal(r.status, 2);
  t.match(r.stderr, /API_KEYS_FILE .*keys\.json.*keys\/0\/sha256/);
});
