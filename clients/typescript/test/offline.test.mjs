// What needs no service: the request the client builds (through a fetch double), problems that
// are not problem+json, the event-stream reader, and a main entry free of Node-only imports.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync, readdirSync } from 'node:fs';
import { createClient, ParsimetryError, UnreadableRecordsError } from '../dist/index.js';
import { serverEvents } from '../dist/event-stream.js';

function recordingFetch(answer) {
  const calls = [];
  const fetch = async (url, init) => { calls.push({ url, init }); return answer(); };
  return { calls, fetch };
}

test('the key travels as a bearer token, the base path is kept, the query is encoded', async () => {
  const { calls, fetch } = recordingFetch(() => Response.json({ records: [], unreadable: [], nextCursor: null }));
  const client = createClient({ baseUrl: 'https://models.example/api/', apiKey: 'k-123', fetch });
  const page = await client.listPage({ label: 'kiln & press', limit: 5 });
  assert.deepEqual(page.records, []);
  assert.equal(calls[0].url, 'https://models.example/api/v1/comparisons?label=kiln+%26+press&limit=5');
  assert.equal(calls[0].init.headers.authorization, 'Bearer k-123');
  assert.equal(calls[0].init.method, 'GET');
});

test('without a key no authorization header is sent', async () => {
  const { calls, fetch } = recordingFetch(() => Response.json({ ok: true, records: 0, head: null, firstBroken: null }));
  await createClient({ baseUrl: 'http://127.0.0.1:1', fetch }).verify();
  assert.equal('authorization' in calls[0].init.headers, false);
});

test('an answer that is not problem+json still raises with its status', async () => {
  const { fetch } = recordingFetch(() => new Response('<html>bad gateway</html>', { status: 502, statusText: 'Bad Gateway', headers: { 'content-type': 'text/html' } }));
  await assert.rejects(createClient({ baseUrl: 'http://x', fetch }).verify(), (error) => {
    assert.ok(error instanceof ParsimetryError);
    assert.equal(error.status, 502);
    assert.equal(error.title, 'Bad Gateway');
    assert.match(error.detail, /bad gateway/);
    return true;
  });
});

test('a problem event ends a stream as an error', async () => {
  const body = 'event: progress\ndata: {"covered":1,"total":4,"nodes":0,"bound":null}\n\n' +
    'event: problem\ndata: {"type":"urn:x","title":"Work limit","status":422,"detail":"too big","errors":[{"path":"pool","message":"narrower"}]}\n\n';
  const { fetch } = recordingFetch(() => new Response(body, { headers: { 'content-type': 'text/event-stream; charset=utf-8' } }));
  const seen = [];
  await assert.rejects(async () => {
    for await (const event of createClient({ baseUrl: 'http://x', fetch }).searchStream({ data: { columns: {} }, response: 'y', pool: [] })) seen.push(event.event);
  }, (error) => error instanceof ParsimetryError && error.status === 422 && error.errors[0].path === 'pool');
  assert.deepEqual(seen, ['progress']);
});

test('the event-stream reader: events split across chunks, CR LF, comments, several data lines', async () => {
  const text = ': a comment\r\nevent: one\r\ndata: {"a":\r\ndata: 1}\r\n\r\nevent: two\ndata: "é"\n\ndata: plain\n\n';
  const bytes = new TextEncoder().encode(text);
  // One byte per chunk: every boundary, including inside CR LF and inside the two-byte é.
  const stream = new ReadableStream({ start(c) { for (const b of bytes) c.enqueue(new Uint8Array([b])); c.close(); } });
  const events = [];
  for await (const e of serverEvents(stream)) events.push(e);
  assert.deepEqual(events, [
    { event: 'one', data: '{"a":\n1}' },
    { event: 'two', data: '"é"' },
    { event: 'message', data: 'plain' },
  ]);
});

test('the main entry imports nothing Node-only (it must run in browsers)', () => {
  const dist = new URL('../dist/', import.meta.url);
  for (const file of readdirSync(dist).filter((f) => f.endsWith('.js'))) {
    const source = readFileSync(new URL(file, dist), 'utf8');
    const imports = [...source.matchAll(/(?:from|import)\s*\(?\s*['"]([^'"]+)['"]/g)].map((m) => m[1]);
    for (const spec of imports) assert.ok(spec.startsWith('./'), `${file} imports ${spec}`);
    assert.doesNotMatch(source, /\brequire\(|\bprocess\.|\bBuffer\b/, file);
  }
});

test('a base URL that is not absolute http(s) is refused at once, by name', () => {
  for (const baseUrl of ['', '/v1', 'ftp://x', 'http://']) {
    assert.throws(() => createClient({ baseUrl }), /^TypeError: baseUrl: an absolute http\(s\) URL/);
  }
});

test('list raises on rows that no longer read back, unless the caller takes them', async () => {
  const item = { id: 'a', createdAt: '2026-01-01T00:00:00Z', kind: 'comparison', caller: 'open', label: null, datasetFingerprint: null, best: null, seq: 7, hash: '0'.repeat(64) };
  const { fetch } = recordingFetch(() => Response.json({ records: [item], unreadable: [{ seq: 6, id: null }], nextCursor: null }));
  const client = createClient({ baseUrl: 'http://x', fetch });
  const seen = [];
  await assert.rejects(async () => { for await (const r of client.list()) seen.push(r.id); }, (error) => error instanceof UnreadableRecordsError && /6/.test(error.message));
  assert.deepEqual(seen, ['a'], 'the readable records of the page come first');
  const taken = [];
  for await (const r of client.list({}, { onUnreadable: (rows) => taken.push(...rows) })) seen.push(r.id);
  assert.deepEqual(taken, [{ seq: 6, id: null }]);
});
