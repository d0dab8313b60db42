// The production build as `npm start` and the Docker image run it: src/ compiled
// by `npm run build` (tsconfig.build.json) to dist/, started as `node
// dist/server.js` with no TypeScript loader in the process. A comparison must
// give the same numbers as the sources give in-process, a search large enough
// for worker threads must run (the workers load compiled modules too), and the
// interactive docs must serve their static files.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import t from 'tap';
import { demoColumns } from '../../scripts/demo-data.ts';
import { buildTestApp } from '../helper.ts';
import { loadComparison, startService } from './service-process.ts';

const REPO = fileURLToPath(new URL('../../', import.meta.url));

/** Every compiled module under dir, recursively. */
function compiledFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return compiledFiles(path);
    return /\.m?js$/.test(name) ? [path] : [];
  });
}

t.test('npm run build compiles src/ to dist/ with .js imports only', async (t) => {
  execFileSync(process.execPath, [join(REPO, 'node_modules/typescript/bin/tsc'), '-p', 'tsconfig.build.json'], { cwd: REPO, stdio: 'pipe' });
  const files = compiledFiles(join(REPO, 'dist'));
  t.ok(files.some((f) => f.endsWith(join('dist', 'server.js'))), 'dist/server.js exists');
  const tsImports = files.filter((f) => /from\s+["']\.{1,2}\/[^"']*\.ts["']/.test(readFileSync(f, 'utf8')));
  t.same(tsImports, [], 'no compiled module imports a .ts file');
});

t.test('node dist/server.js: same numbers as the sources, workers on compiled code, docs served', async (t) => {
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-compiled-'));
  t.teardown(() => rmSync(dir, { recursive: true, force: true }));
  const service = await startService({ AUDIT_DB: join(dir, 'audit.sqlite'), EVENT_LOOP_MAX_DELAY_MS: '0' }, 60_000, true);
  t.teardown(() => {
    service.child.kill('SIGKILL');
  });

  const request = loadComparison(7);
  const served = await fetch(`${service.base}/v1/comparisons`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(request) });
  t.equal(served.status, 200, 'a comparison is answered');
  const { app } = await buildTestApp(t);
  const inProcess = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: request });
  const compiledBody = (await served.json()) as Record<string, unknown>;
  const sourceBody = inProcess.json() as Record<string, unknown>;
  for (const field of ['models', 'rankings', 'verdict', 'conventions']) {
    t.same(compiledBody[field], sourceBody[field], `${field}: identical from dist/ and from src/`);
  }

  // 2^16 subsets: beyond what a search does on the calling thread, so it runs in worker threads.
  const pool = ['peakTemp', 'moisture', 'holdMinutes', { kind: 'power', of: 'peakTemp', degree: 2 }];
  const columns = demoColumns() as Record<string, unknown[]>;
  const rows = (columns.shrinkage as number[]).length;
  for (let j = 0; j < 12; j++) {
    columns[`noise${j}`] = Array.from({ length: rows }, (_, i) => Math.sin((i + 1) * (j + 1.5)));
    pool.push(`noise${j}`);
  }
  const search = await fetch(`${service.base}/v1/searches`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ data: { columns }, response: 'shrinkage', pool, top: 5 }),
  });
  const searchBody = (await search.json()) as { subsets?: number; models?: unknown[] };
  t.equal(search.status, 200, `a search in worker threads is answered: ${JSON.stringify(searchBody).slice(0, 300)}`);
  t.equal(searchBody.subsets, 2 ** 16, 'every subset scored');
  t.equal(searchBody.models?.length, 5, 'the top five');

  const docs = await fetch(`${service.base}/docs/static/index.html`);
  t.equal(docs.status, 200, 'the interactive docs serve their static files');
  t.match(await docs.text(), /<html/i);
});
