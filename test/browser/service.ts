// The one place the browser test gets its service from: the real fastify app
// over a temporary SQLite audit file, listening on a loopback port. The
// comparison is posted over HTTP like any client would, with one candidate
// whose name is markup, and the test opens the stored record's report.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { defaultConfig } from '../../src/config.ts';
import { openAuditStore } from '../../src/audit/open.ts';
import { buildApp } from '../../src/http/app.ts';
import { demoComparison } from '../../scripts/demo-data.ts';

export interface BrowserTestService {
  base: string;
  reportUrl: string;
  chartUrl: string;
  /** Every model the report must show, including one whose name carries markup. */
  modelNames: string[];
  close(): Promise<void>;
}

/** A name that would run script if it were ever inserted as markup. */
export const hostileModelName = '<img src=x onerror="document.title=\'pwned\'">';

export async function startServiceForBrowserTest(): Promise<BrowserTestService> {
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-browser-'));
  const config = defaultConfig({ auditDb: join(dir, 'audit.sqlite'), port: 0 });
  const store = await openAuditStore(config.auditDb);
  const app = await buildApp({ config, store, logger: false });
  const close = async () => {
    await app.close();
    await store.close();
    rmSync(dir, { recursive: true, force: true });
  };
  try {
    const base = await app.listen({ host: '127.0.0.1', port: 0 });
    const request = demoComparison();
    request.candidates.push({ name: hostileModelName, terms: ['peakTemp', 'holdMinutes'] } as (typeof request.candidates)[number]);
    request.label = 'browser check <b>not bold</b>';
    const response = await fetch(`${base}/v1/comparisons`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify(request),
    });
    const body = await response.json();
    if (!response.ok) throw new Error(`the service refused the comparison: ${response.status} ${JSON.stringify(body)}`);
    return {
      base,
      reportUrl: `${base}/v1/comparisons/${body.id}/report`,
      chartUrl: `${base}/v1/comparisons/${body.id}/chart.svg`,
      modelNames: (body.models as { name: string }[]).map((m) => m.name),
      close,
    };
  } catch (error) {
    await close();
    throw error;
  }
}
