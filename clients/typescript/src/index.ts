// The parsimetry client: one method per endpoint, typed from the service's OpenAPI document.
// Only what browsers and Node 20+ share (fetch, URL, web streams): no Node-only imports here.
import { refusal, streamedProblem, ParsimetryError, UnreadableRecordsError } from './problem.js';
import { serverEvents } from './event-stream.js';
import type {
  ComparisonListItem, ComparisonList, ComparisonRequest, ComparisonResult, ListFilter, PictureOptions,
  ReplayReport, SearchEvent, SearchRequest, SearchResult, StoredComparison, SummaryUploadResult, VerifyReport,
} from './types.js';

export { ParsimetryError, UnreadableRecordsError } from './problem.js';
export type * from './types.js';
export type { paths, components } from './openapi.js';

export interface ClientOptions {
  /** Where the service answers, e.g. http://127.0.0.1:8080 (a path prefix is kept). */
  baseUrl: string;
  /** An API key, sent as Authorization: Bearer <key>; omit for a service with no keys configured. */
  apiKey?: string;
  /** A fetch to use instead of the global one (a test double, a proxy-aware fetch). */
  fetch?: typeof fetch;
}

export interface SummariseOptions {
  /** The columns to summarise, response included, in the order the summary lists them. */
  columns: string[];
  /** A column of positive relative weights: the weighted summary. */
  weights?: string;
  /** How the body is written: CSV with a header row, or one JSON object per line. */
  format: 'csv' | 'ndjson';
}

export interface StreamOptions {
  /** Aborting closes the stream, and the service stops the search and records nothing. */
  signal?: AbortSignal;
}

type Query = Record<string, string | number | undefined>;

export interface ParsimetryClient {
  /** POST /v1/comparisons: fit and score the candidates, rank them, record the comparison. */
  compare(request: ComparisonRequest): Promise<ComparisonResult>;
  /** POST /v1/searches: every subset of a pool of terms, the best `top` refitted and recorded. */
  search(request: SearchRequest): Promise<SearchResult>;
  /** The same search as server-sent events: `progress` events, then the `result` (a refusal throws). */
  searchStream(request: SearchRequest, options?: StreamOptions): AsyncGenerator<SearchEvent>;
  /** GET /v1/comparisons/{id}: the stored record with its integrity check. */
  comparison(id: string): Promise<StoredComparison>;
  /**
   * GET /v1/comparisons, newest first, following the cursor page by page. Rows that no longer read
   * back as records (damaged in the database) are handed to `onUnreadable`; without it they raise
   * an UnreadableRecordsError, so a damaged audit trail is never skipped in silence.
   */
  list(filter?: ListFilter, options?: { onUnreadable?: (rows: ComparisonList['unreadable']) => void }): AsyncGenerator<ComparisonListItem>;
  /** One page of GET /v1/comparisons (for callers who keep the cursor themselves). */
  listPage(filter?: ListFilter & { cursor?: string }): Promise<ComparisonList>;
  /** GET /v1/audit/verify: re-hash the whole audit chain. */
  verify(): Promise<VerifyReport>;
  /** POST /v1/comparisons/{id}/replay: re-run a stored comparison with today's code, list what changed. */
  replay(id: string): Promise<ReplayReport>;
  /** GET /v1/comparisons/{id}/chart.svg as SVG text. */
  chartSvg(id: string, options?: PictureOptions): Promise<string>;
  /** GET /v1/comparisons/{id}/report as HTML text. */
  reportHtml(id: string, options?: PictureOptions): Promise<string>;
  /** POST /v1/summaries: fold CSV or NDJSON rows into a summary to send as `data`. */
  summarise(body: string | Blob | ReadableStream<Uint8Array>, options: SummariseOptions): Promise<SummaryUploadResult>;
}

export function createClient(options: ClientOptions): ParsimetryClient {
  const doFetch = options.fetch ?? globalThis.fetch.bind(globalThis);
  if (!/^https?:\/\/[^/]/i.test(options.baseUrl ?? '')) {
    throw new TypeError(`baseUrl: an absolute http(s) URL such as http://127.0.0.1:8080, not ${JSON.stringify(options.baseUrl)}`);
  }
  const base = options.baseUrl.replace(/\/+$/, '');

  const url = (path: string, query: Query = {}): string => {
    const params = new URLSearchParams();
    for (const [key, value] of Object.entries(query)) if (value !== undefined) params.set(key, String(value));
    const search = params.toString();
    return `${base}${path}${search ? `?${search}` : ''}`;
  };

  const headers = (extra: Record<string, string>): Record<string, string> =>
    options.apiKey === undefined ? extra : { ...extra, authorization: `Bearer ${options.apiKey}` };

  async function send(method: string, path: string, init: { query?: Query; body?: BodyInit; type?: string; accept: string; signal?: AbortSignal }): Promise<Response> {
    const response = await doFetch(url(path, init.query), {
      method,
      headers: headers({ accept: init.accept, ...(init.type ? { 'content-type': init.type } : {}) }),
      body: init.body,
      signal: init.signal,
      // A streamed upload (a ReadableStream body) needs half duplex in fetch.
      ...(typeof ReadableStream !== 'undefined' && init.body instanceof ReadableStream ? { duplex: 'half' } : {}),
    } as RequestInit);
    if (!response.ok) throw await refusal(response);
    return response;
  }

  const json = async <T>(method: string, path: string, body?: unknown, query?: Query): Promise<T> =>
    (await send(method, path, { query, accept: 'application/json', ...(body === undefined ? {} : { body: JSON.stringify(body), type: 'application/json' }) })).json() as Promise<T>;

  const text = async (path: string, accept: string, query?: Query): Promise<string> =>
    (await send('GET', path, { query, accept })).text();

  const record = (id: string) => `/v1/comparisons/${encodeURIComponent(id)}`;

  const listPage = (filter: ListFilter & { cursor?: string } = {}) => json<ComparisonList>('GET', '/v1/comparisons', undefined, filter);

  return {
    compare: (request) => json('POST', '/v1/comparisons', request),
    search: (request) => json('POST', '/v1/searches', request),

    async *searchStream(request, streamOptions = {}) {
      const response = await send('POST', '/v1/searches', {
        body: JSON.stringify(request), type: 'application/json', accept: 'text/event-stream', signal: streamOptions.signal,
      });
      // A search that cannot start is answered as plain JSON problem (raised above); a 200 that
      // is not a stream would be a proxy in the way.
      if (!response.body || !(response.headers.get('content-type') ?? '').startsWith('text/event-stream')) {
        throw new ParsimetryError({ type: 'about:blank', title: 'Not an event stream', status: 502, detail: `expected text/event-stream, got ${response.headers.get('content-type') ?? 'no content type'}` });
      }
      for await (const { event, data } of serverEvents(response.body)) {
        const parsed: unknown = JSON.parse(data);
        if (event === 'problem') throw streamedProblem(parsed);
        if (event === 'progress') yield { event, data: parsed as Extract<SearchEvent, { event: 'progress' }>['data'] };
        else if (event === 'result') {
          yield { event, data: parsed as SearchResult };
          return;
        }
      }
      throw new ParsimetryError({ type: 'about:blank', title: 'Stream ended early', status: 502, detail: 'the event stream closed before its result' });
    },

    comparison: (id) => json('GET', record(id)),

    async *list(filter = {}, listOptions = {}) {
      let cursor: string | undefined;
      do {
        const page = await listPage({ ...filter, cursor });
        yield* page.records;
        if (page.unreadable.length > 0) {
          if (!listOptions.onUnreadable) throw new UnreadableRecordsError(page.unreadable);
          listOptions.onUnreadable(page.unreadable);
        }
        cursor = page.nextCursor ?? undefined;
      } while (cursor !== undefined);
    },
    listPage,

    verify: () => json('GET', '/v1/audit/verify'),
    replay: (id) => json('POST', `${record(id)}/replay`),
    chartSvg: (id, query = {}) => text(`${record(id)}/chart.svg`, 'image/svg+xml', query),
    reportHtml: (id, query = {}) => text(`${record(id)}/report`, 'text/html', query),

    async summarise(body, { columns, weights, format }) {
      const response = await send('POST', '/v1/summaries', {
        query: { columns: columns.join(','), weights },
        body, type: format === 'csv' ? 'text/csv' : 'application/x-ndjson', accept: 'application/json',
      });
      return response.json() as Promise<SummaryUploadResult>;
    },
  };
}
