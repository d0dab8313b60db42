// The TypeScript client (clients/typescript): its types are what the generator makes of today's
// openapi/openapi.json, it builds, and its own tests pass against a live service.
import { execFile } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import t from 'tap';
import { startLiveService } from './live-service.ts';

const run = promisify(execFile);
const repositoryRoot = fileURLToPath(new URL('../../', import.meta.url));
const client = join(repositoryRoot, 'clients', 'typescript');
const npm = process.platform === 'win32' ? 'npm.cmd' : 'npm';

t.before(async () => {
  // The client has its own dependencies (the type generator, TypeScript); a fresh clone has none yet.
  if (!existsSync(join(client, 'node_modules', '.bin', 'openapi-typescript'))) {
    await run(npm, ['ci', '--no-audit', '--no-fund'], { cwd: client });
  }
});

t.test('the generated types match openapi/openapi.json', async (t) => {
  const check = await run(npm, ['run', '--silent', 'types:check'], { cwd: client }).catch((error: { stdout?: string; stderr?: string }) => error);
  const stale = 'code' in check;
  t.notOk(stale, stale ? `${check.stderr ?? ''}`.trim() || 'the types check failed' : 'clients/typescript/src/openapi.ts is up to date');
  t.match(check.stdout ?? '', /matches openapi\/openapi\.json/);
});

t.test("the client's own tests pass against a live service", async (t) => {
  const url = await startLiveService(t);
  const result = await run(npm, ['test'], { cwd: client, env: { ...process.env, PARSIMETRY_URL: url }, maxBuffer: 16 * 1024 * 1024 })
    .catch((error: { stdout?: string; stderr?: string; code?: number }) => error);
  const out = `${result.stdout ?? ''}${result.stderr ?? ''}`;
  const failed = 'code' in result && Boolean(result.code);
  t.notOk(failed, failed ? `npm test in clients/typescript failed:\n${out}` : "the client's tests passed");
  t.match(out, /# fail 0/);
  const passed = /# pass (\d+)/.exec(out);
  t.ok(passed && Number(passed[1]) >= 14, `every client test ran (${passed?.[1]} passed)`);

  // The README's TypeScript example, from the repository root as documented (tsx resolves
  // @parsimetry/client through tsconfig.json's paths).
  const example = await run(process.execPath, ['--import', 'tsx', 'examples/fitted-elsewhere.ts'], { cwd: repositoryRoot, env: { ...process.env, PARSIMETRY_URL: url } });
  t.match(example.stdout, /line-from-typescript +delta=/, 'the example ranks the line fitted in TypeScript');
  t.match(example.stdout, /record [0-9a-f-]{36} intact/);
});
