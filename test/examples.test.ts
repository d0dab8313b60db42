// The README's client examples run against a live service (curl here; the Python and TypeScript
// examples, which use the clients, in test/clients/; the R example is checked by reading), and the
// README shows them verbatim.
import { execFile } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { promisify } from 'node:util';
import t from 'tap';
import { buildTestApp } from './helper.ts';
import { requirePgUrl } from './audit/pg-url.ts';

const run = promisify(execFile);
const readme = readFileSync(new URL('../README.md', import.meta.url), 'utf8');
const example = (name: string) => readFileSync(new URL(`../examples/${name}`, import.meta.url), 'utf8');

t.test('the curl (with awk) example scores models fitted elsewhere on a live server', async (t) => {
  const { app } = await buildTestApp(t);
  const address = await app.listen({ host: '127.0.0.1', port: 0 });
  const env = { ...process.env, PARSIMETRY_URL: address };

  const shell = await run('bash', ['examples/fitted-elsewhere.sh'], { env });
  const body = JSON.parse(shell.stdout);
  t.equal(body.models.length, 3);
  const awk = body.models.find((m: { name: string }) => m.name === 'line-from-awk');
  t.equal(awk.source, 'rss');
  t.equal(awk.observations, body.dataset.observations, 'the awk count matches the rows used');
});

t.test('the README shows the examples exactly as they are tested', async (t) => {
  for (const name of ['fitted-elsewhere.sh', 'fitted_elsewhere.py', 'fitted-elsewhere.ts', 'fitted_elsewhere.R', 'warehouse-summary.sh']) {
    t.ok(readme.includes(example(name).trim()), `README includes examples/${name}`);
  }
});

t.test('the warehouse example: a PostgreSQL table reduced by the generated SQL, posted as data.summary', async (t) => {
  const pg = requirePgUrl(t);
  if (!pg) return;
  const { app } = await buildTestApp(t);
  const address = await app.listen({ host: '127.0.0.1', port: 0 });
  const { stdout } = await run('bash', ['examples/warehouse-summary.sh'], { env: { ...process.env, PARSIMETRY_URL: address, DATABASE_URL: pg } });
  const bySummary = JSON.parse(stdout);
  t.equal(bySummary.dataset.observations, 39, 'every row of examples/tiles.csv');

  // The same comparison from the CSV rows, posted as columns: the same criteria (to 1e-9).
  const lines = readFileSync(new URL('../examples/tiles.csv', import.meta.url), 'utf8').trim().split('\n').slice(1).map((l) => l.split(','));
  const columns = { peakTemp: lines.map((l) => Number(l[0])), moisture: lines.map((l) => Number(l[2])), shrinkage: lines.map((l) => Number(l[4])) };
  const byRows = (await app.inject({
    method: 'POST', url: '/v1/comparisons',
    payload: { data: { columns }, response: 'shrinkage', candidates: [{ name: 'temperature', terms: ['peakTemp'] }, { name: 'temperature-and-moisture', terms: ['peakTemp', 'moisture'] }] },
  })).json();
  for (const m of byRows.models) {
    const s = bySummary.models.find((x: { name: string }) => x.name === m.name);
    for (const key of ['aic', 'aicc', 'bic', 'hqc', 'r2']) t.ok(Math.abs(s[key] - m[key]) <= 1e-9 * Math.max(1, Math.abs(m[key])), `${m.name}.${key}`);
  }
});
