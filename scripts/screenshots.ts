// npx tsx scripts/screenshots.ts: the demo comparison's pictures as a reader
// sees them. Starts the service in-process with a throwaway audit file, posts
// the demo comparison, and saves with Debian's Chromium (playwright-core):
// the chart at every named size and for every criterion at the default size,
// the report at 1280 px wide, a demo search's chart and report, and /docs. The PNGs land in out/screenshots/
// (git-ignored) for a person to look at; nothing is asserted here
// (test/browser/report.test.ts asserts).
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { chromium } from 'playwright-core';
import { defaultConfig } from '../src/config.ts';
import { openAuditStore } from '../src/audit/open.ts';
import { buildApp } from '../src/http/app.ts';
import { sizePresets } from '../src/render/index.ts';
import { demoColumns, demoComparison } from './demo-data.ts';

/** The demo scenario as a search: every hierarchical subset of six kiln terms, log shrinkage. */
const demoSearch = () => ({
  data: { columns: demoColumns() }, response: 'shrinkage', label: 'tile shrinkage: which kiln settings matter', hierarchy: true, top: 8,
  responseTransform: { fn: 'log' },
  pool: ['peakTemp', 'holdMinutes', 'moisture', { kind: 'factor', of: 'kiln' }, { kind: 'power', of: 'peakTemp', degree: 2 }, { kind: 'product', of: ['peakTemp', 'moisture'] }],
});

const outDir = resolve(import.meta.dirname, '../out/screenshots');
mkdirSync(outDir, { recursive: true });
const dir = mkdtempSync(join(tmpdir(), 'parsimetry-shots-'));
const config = defaultConfig({ auditDb: join(dir, 'audit.sqlite'), port: 0 });
const store = await openAuditStore(config.auditDb);
const app = await buildApp({ config, store, logger: false });
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', headless: true, args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'] });
try {
  const base = await app.listen({ host: '127.0.0.1', port: 0 });
  const response = await fetch(`${base}/v1/comparisons`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify(demoComparison()),
  });
  const body = (await response.json()) as { id: string };
  if (!response.ok) throw new Error(`the service refused the demo: ${response.status} ${JSON.stringify(body)}`);
  const at = `/v1/comparisons/${body.id}`;
  const shots: [string, string, number][] = [];
  for (const [size, preset] of Object.entries(sizePresets)) shots.push([`chart-${size}.png`, `${at}/chart.svg?size=${size}`, preset.width]);
  for (const criterion of ['aic', 'bic', 'hqc', 'adjustedR2', 'loo']) shots.push([`chart-${criterion}.png`, `${at}/chart.svg?criterion=${criterion}`, 720]);
  shots.push(['chart-240.png', `${at}/chart.svg?width=240`, 240]);
  shots.push(['report-1280.png', `${at}/report`, 1280]);
  // A demo search over the same data: its own chart and report.
  const searched = await fetch(`${base}/v1/searches`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(demoSearch()) });
  const search = (await searched.json()) as { id: string };
  if (!searched.ok) throw new Error(`the service refused the demo search: ${searched.status} ${JSON.stringify(search)}`);
  shots.push(['search-chart-panel.png', `/v1/searches/${search.id}/chart.svg`, 720], ['search-chart-tile.png', `/v1/searches/${search.id}/chart.svg?size=tile`, 420]);
  shots.push(['search-report-1280.png', `/v1/searches/${search.id}/report`, 1280]);
  for (const [file, path, width] of shots) {
    const page = await browser.newPage({ viewport: { width, height: 700 } });
    await page.goto(`${base}${path}`);
    // A bare SVG document has no scrolling element for a full-page shot: size the viewport to it instead.
    const svgHeight = await page.evaluate(() => (document.documentElement.localName === 'svg' ? document.documentElement.getBoundingClientRect().height : null));
    if (svgHeight !== null) await page.setViewportSize({ width, height: Math.ceil(svgHeight) });
    await page.screenshot({ path: join(outDir, file), fullPage: svgHeight === null });
    await page.close();
    process.stdout.write(`${join('out/screenshots', file)}\n`);
  }
  const docs = await browser.newPage({ viewport: { width: 1280, height: 900 } });
  await docs.goto(`${base}/docs`);
  await docs.waitForSelector('.opblock', { timeout: 60_000 });
  await docs.screenshot({ path: join(outDir, 'docs.png') });
  process.stdout.write('out/screenshots/docs.png\n');
} finally {
  await browser.close();
  await app.close();
  await store.close();
  rmSync(dir, { recursive: true, force: true });
}
