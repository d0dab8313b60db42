// A real browser opens the report from a running service: Debian's Chromium
// (/usr/bin/chromium) driven by playwright-core. Locally the test is skipped
// when Chromium is absent; in CI (CI=true) its absence is a failure.
import t from 'tap';
import { existsSync, mkdirSync, mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { hostileModelName, startServiceForBrowserTest } from './service.ts';

const chromiumPath = '/usr/bin/chromium';
/** Screenshots and the printed PDF land here (git-ignored: out/). */
export const browserOutputDir = resolve(import.meta.dirname, '../../out/test');

if (!existsSync(chromiumPath)) {
  if (process.env.CI === 'true') {
    t.fail(`${chromiumPath} is missing: install Debian's chromium (apt-get install -y chromium) on the CI image`);
  } else {
    t.plan(0, `${chromiumPath} not installed; the browser test is skipped locally (it fails under CI=true)`);
  }
} else {
  const { chromium } = await import('playwright-core');
  const userDataDir = mkdtempSync(join(tmpdir(), 'parsimetry-chromium-'));
  const service = await startServiceForBrowserTest();
  const context = await chromium.launchPersistentContext(userDataDir, {
    executablePath: chromiumPath,
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    viewport: { width: 1100, height: 900 },
  });
  t.teardown(async () => {
    await context.close();
    await service.close();
    rmSync(userDataDir, { recursive: true, force: true });
  });

  t.test('the report opens cleanly and shows every model as text', async (t) => {
    const page = await context.newPage();
    const problems: string[] = [];
    page.on('console', (m) => { if (m.type() === 'error' || m.type() === 'warning') problems.push(`console ${m.type()}: ${m.text()}`); });
    page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
    page.on('requestfailed', (r) => problems.push(`request failed: ${r.url()} ${r.failure()?.errorText}`));
    page.on('response', (r) => { if (r.status() >= 400) problems.push(`HTTP ${r.status()}: ${r.url()}`); });
    page.on('dialog', (d) => { problems.push(`dialog: ${d.message()}`); void d.dismiss(); });
    const requested: string[] = [];
    page.on('request', (r) => requested.push(r.url()));

    const response = await page.goto(service.reportUrl, { waitUntil: 'load' });
    t.equal(response?.status(), 200);
    t.match(response?.headers()['content-type'] ?? '', /^text\/html/);

    const rows = await page.$$eval('#models tbody tr[data-model]', (trs) =>
      trs.map((tr) => ({ model: tr.getAttribute('data-model'), first: tr.querySelector('td')?.textContent ?? null })),
    );
    t.same(rows.map((r) => r.model), service.modelNames, 'one row per model, found by data-model');
    t.same(rows.map((r) => r.first), service.modelNames, 'each name shown as its own text');

    const dom = await page.evaluate(() => ({
      scripts: document.querySelectorAll('script').length,
      images: document.querySelectorAll('img, image').length,
      bold: document.querySelectorAll('h1 b').length,
      title: document.title,
      bars: document.querySelectorAll('svg .delta-bar').length,
    }));
    t.equal(dom.scripts, 0, 'no script element');
    t.equal(dom.images, 0, `no image element, though a model is called ${hostileModelName}`);
    t.equal(dom.bold, 0, 'markup in the label is not applied');
    t.notMatch(dom.title, /pwned/);
    t.equal(dom.bars, service.modelNames.length, 'the inlined chart has one bar per model');

    // At a desktop width every ranking table fits its column: no sideways scrolling to read a weight.
    const overflowing = await page.$$eval('table[data-ranking]', (tables) =>
      tables.filter((table) => table.parentElement!.scrollWidth > table.parentElement!.clientWidth).map((table) => table.getAttribute('data-ranking')),
    );
    t.same(overflowing, [], 'no ranking table wider than the page column at 1100 px');

    mkdirSync(browserOutputDir, { recursive: true });
    const screenshot = join(browserOutputDir, 'report-screenshot.png');
    await page.screenshot({ path: screenshot, fullPage: true });
    t.ok(statSync(screenshot).size > 10_000, `screenshot saved at ${screenshot}`);

    // Paper: print media, then a PDF as a printer would receive it.
    await page.emulateMedia({ media: 'print' });
    const printBackground = await page.evaluate(() => getComputedStyle(document.body).backgroundColor);
    t.equal(printBackground, 'rgb(255, 255, 255)', 'print rules take the page to white');
    // A4 less 14 mm margins each side is 182 mm, about 688 px at 96 px per inch: paper cannot scroll.
    await page.setViewportSize({ width: 680, height: 900 });
    const cut = await page.$$eval('table', (tables) => tables.filter((table) => table.getBoundingClientRect().width > 681).map((table) => table.id || table.getAttribute('data-ranking') || table.getAttribute('data-section')));
    t.same(cut, [], 'printed at A4 text width, no table is cut off');
    await page.setViewportSize({ width: 1100, height: 900 });
    const pdf = join(browserOutputDir, 'report-print.pdf');
    await page.pdf({ path: pdf, format: 'A4', printBackground: true });
    t.ok(statSync(pdf).size > 10_000, `printed to ${pdf}`);

    t.same(problems, [], 'no console errors, failed requests or dialogs');
    t.same(requested.filter((u) => u !== service.reportUrl && !u.startsWith('data:')), [], 'the page fetched nothing else');
    await page.close();
  });

  t.test('the chart opens on its own as SVG', async (t) => {
    const page = await context.newPage();
    const problems: string[] = [];
    page.on('console', (m) => { if (m.type() === 'error') problems.push(m.text()); });
    const response = await page.goto(service.chartUrl);
    t.equal(response?.status(), 200);
    t.match(response?.headers()['content-type'] ?? '', /^image\/svg\+xml/);
    const facts = await page.evaluate(() => ({
      root: document.documentElement.localName,
      title: document.querySelector('svg > title')?.textContent ?? null,
      bars: document.querySelectorAll('.delta-bar').length,
    }));
    t.equal(facts.root, 'svg');
    t.match(facts.title, /^Ranking by AICc/);
    t.equal(facts.bars, service.modelNames.length);
    await page.screenshot({ path: join(browserOutputDir, 'chart-screenshot.png') });
    t.same(problems, []);
    await page.close();
  });
}
