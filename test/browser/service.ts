// The one place the browser test gets its service from. For now it serves the
// renderers' output from a fixture record with node:http; when the HTTP
// routes exist, replace the body of startServiceForBrowserTest with:
//   build the fastify app (temporary audit store), listen on 127.0.0.1:0,
//   POST /v1/comparisons with the same candidates, and return
//   `${base}/v1/comparisons/${id}/report` and `.../chart.svg`.
// The test itself needs nothing else changed.
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { parseChartOptions } from '../../src/render/chart-options.ts';
import { renderChartSvg } from '../../src/render/chart-svg.ts';
import { renderReportHtml, reportContentSecurityPolicy } from '../../src/render/report-html.ts';
import { fixtureRecord } from '../render/fixture-record.ts';

export interface BrowserTestService {
  reportUrl: string;
  chartUrl: string;
  /** Every model the report must show, including one whose name carries markup. */
  modelNames: string[];
  close(): Promise<void>;
}

/** A name that would run script if it were ever inserted as markup. */
export const hostileModelName = '<img src=x onerror="document.title=\'pwned\'">';

export async function startServiceForBrowserTest(): Promise<BrowserTestService> {
  const record = fixtureRecord(
    [
      { name: 'linear', rss: 4.1, parameters: 3, terms: ['peakTemp'] },
      { name: 'quadratic', rss: 3.55, parameters: 4, terms: ['peakTemp', 'peakTemp^2'] },
      { name: 'by-kiln', rss: 3.2, parameters: 6, terms: ['peakTemp', 'kiln[west]', 'peakTemp:kiln[west]', 'holdMinutes'] },
      { name: hostileModelName, rss: 3.9, parameters: 4, terms: ['moisture'] },
    ],
    { id: 'cmp_browser', label: 'browser check <b>not bold</b>' },
  );
  const id = record.id;
  const options = parseChartOptions({}, record);
  if (!options.ok) throw new Error('fixture record cannot be drawn');
  const chart = renderChartSvg(record, options.options);
  const report = renderReportHtml(record, { chartSvg: chart });

  const server = createServer((request, response) => {
    if (request.method === 'GET' && request.url === `/v1/comparisons/${id}/report`) {
      response.writeHead(200, { 'content-type': 'text/html; charset=utf-8', 'content-security-policy': reportContentSecurityPolicy });
      response.end(report);
    } else if (request.method === 'GET' && request.url === `/v1/comparisons/${id}/chart.svg`) {
      response.writeHead(200, { 'content-type': 'image/svg+xml; charset=utf-8', 'content-security-policy': "default-src 'none'; style-src 'unsafe-inline'" });
      response.end(chart);
    } else {
      response.writeHead(404, { 'content-type': 'text/plain' });
      response.end('not found');
    }
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  const base = `http://127.0.0.1:${port}`;
  return {
    reportUrl: `${base}/v1/comparisons/${id}/report`,
    chartUrl: `${base}/v1/comparisons/${id}/chart.svg`,
    modelNames: record.result.models.map((m) => m.name),
    close: () => new Promise<void>((resolve, reject) => server.close((e) => (e ? reject(e) : resolve()))),
  };
}
