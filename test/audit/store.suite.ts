// One behavioural suite for every AuditStore. Each store runs it through a
// harness that can open the same database again and change it behind the
// store's back (a second raw connection), as someone with database access could.
import { createHash } from 'node:crypto';
import type { Test } from 'tap';
import { AuditCursorInvalid, AuditRecordCorrupt, AuditRecordInvalid, AuditUnavailable, LIST_LIMIT_MAX, requestDigest } from '../../src/audit/open.ts';
import type { AuditStore, AuditStoreOptions, NewRecord } from '../../src/audit/open.ts';
import { integrityOnReadSuite } from './integrity.suite.ts';

export interface StoreHarness {
  /** Opens (or reopens) the harness's one database. */
  open(options?: AuditStoreOptions): Promise<AuditStore>;
  /** Runs SQL on a separate raw connection to the same database. */
  exec(sql: string): Promise<void>;
  cleanup(): Promise<void>;
}

const GENESIS = '0'.repeat(64);

// Demo scenario data (invented): tile shrinkage against kiln settings.
export function comparisonRecord(n: number, over: Partial<NewRecord> = {}): NewRecord {
  const request = { response: 'shrinkage', candidates: [{ name: 'linear', terms: ['peakTemp'] }], n };
  return {
    kind: 'comparison',
    caller: 'key-east',
    label: `run ${n}`,
    serviceVersion: '0.1.0',
    conventionsVersion: '1',
    policy: null,
    datasetFingerprint: 'fp-tiles-a',
    requestDigest: requestDigest(request),
    request,
    result: { ranking: [{ name: 'linear', aic: 12.5 + n, weight: 0.25 }], rows: 40 },
    ...over,
  };
}

/** The documented chain formula, written out again with node:crypto rather than through chain.ts. */
function sortedJson(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(sortedJson).join(',')}]`;
  if (v !== null && typeof v === 'object') {
    return `{${Object.keys(v).sort().map((k) => `${JSON.stringify(k)}:${sortedJson((v as Record<string, unknown>)[k])}`).join(',')}}`;
  }
  return JSON.stringify(v);
}
function documentedHash(record: Record<string, unknown>): string {
  const { hash: _h, prevHash, ...body } = record;
  return createHash('sha256').update(String(prevHash) + sortedJson(body), 'utf8').digest('hex');
}

function steppingClock(startMs: number, stepMs: number) {
  let t = startMs - stepMs;
  return { now: () => (t += stepMs) };
}

export function auditStoreSuite(t: Test, makeHarness: () => Promise<StoreHarness>): void {
  const withStore = async (t: Test, options?: AuditStoreOptions) => {
    const harness = await makeHarness();
    const store = await harness.open(options);
    t.teardown(async () => {
      await store.close();
      await harness.cleanup();
    });
    return { harness, store };
  };

  t.test('append then get returns the record as chained', async (t) => {
    const { store } = await withStore(t, { clock: { now: () => Date.UTC(2026, 2, 14, 9, 30, 0, 125) } });
    const a = await store.append(comparisonRecord(1, { policy: { name: 'plant-default', hash: 'abc123' } }));
    const b = await store.append(comparisonRecord(2, { kind: 'search', label: null, datasetFingerprint: null }));
    t.equal(a.seq, 1);
    t.equal(a.prevHash, GENESIS, 'genesis prevHash is 64 zeros');
    t.equal(a.createdAt, '2026-03-14T09:30:00.125Z');
    t.match(a.id, /^019[0-9a-f]{5}-[0-9a-f]{4}-7[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/, 'UUIDv7 layout (RFC 9562)');
    t.equal(a.id.replace(/-/g, '').slice(0, 12), Date.UTC(2026, 2, 14, 9, 30, 0, 125).toString(16).padStart(12, '0'), 'time prefix');
    t.ok(b.id > a.id, 'ids made later sort later');
    t.equal(b.seq, 2);
    t.equal(b.prevHash, a.hash);
    t.equal(a.hash, documentedHash(a as unknown as Record<string, unknown>), 'hash follows the documented formula');
    t.equal(b.hash, documentedHash(b as unknown as Record<string, unknown>));
    t.same(await store.get(a.id), a);
    t.same(await store.get(b.id), b);
    t.equal(await store.get('01900000-0000-7000-8000-000000000000'), null);
  });

  t.test('list is newest first, paged, filtered and bounded', async (t) => {
    const { store } = await withStore(t, { clock: steppingClock(Date.UTC(2026, 0, 1), 60_000) });
    const made = [];
    for (let i = 1; i <= 7; i++) {
      made.push(await store.append(comparisonRecord(i, {
        caller: i % 2 ? 'key-east' : 'key-west',
        datasetFingerprint: i <= 3 ? 'fp-a' : 'fp-b',
        kind: i === 5 ? 'search' : 'comparison',
      })));
    }
    const p1 = await store.list({ limit: 3 });
    t.same(p1.records.map((r) => r.seq), [7, 6, 5]);
    t.type(p1.nextCursor, 'string');
    const p2 = await store.list({ limit: 3, cursor: p1.nextCursor! });
    t.same(p2.records.map((r) => r.seq), [4, 3, 2]);
    const p3 = await store.list({ limit: 3, cursor: p2.nextCursor! });
    t.same(p3.records.map((r) => r.seq), [1]);
    t.equal(p3.nextCursor, null);
    t.same((await store.list({ limit: 7 })).nextCursor, null, 'an exact last page has no next cursor');
    const { seq, id, createdAt, kind, caller, label, datasetFingerprint, hash } = made[6];
    t.same(p1.records[0], { seq, id, createdAt, kind, caller, label, datasetFingerprint, hash, best: null }, 'the envelope and chain position, no body');
    t.same((await store.list({ caller: 'key-west' })).records.map((r) => r.seq), [6, 4, 2]);
    t.same((await store.list({ fingerprint: 'fp-a' })).records.map((r) => r.seq), [3, 2, 1]);
    t.same((await store.list({ kind: 'search' })).records.map((r) => r.seq), [5]);
    t.same((await store.list({ label: 'run 4' })).records.map((r) => r.seq), [4]);
    t.same((await store.list({ label: 'un ' })).records.map((r) => r.seq), [7, 6, 5, 4, 3, 2, 1], 'label matches a substring');
    t.same((await store.list({ label: 'RUN' })).records, [], 'case as written');
    t.same((await store.list({ label: '%' })).records, [], 'no wildcard characters');
    t.same((await store.list({ caller: 'key-east', fingerprint: 'fp-b' })).records.map((r) => r.seq), [7, 5]);
    // createdAt steps a minute per record from 2026-01-01T00:00Z; from is inclusive, to exclusive.
    t.same((await store.list({ from: '2026-01-01T00:02:00Z', to: '2026-01-01T00:04:00.000Z' })).records.map((r) => r.seq), [4, 3]);
    t.same((await store.list({ from: '2026-01-02' })).records, []);
    await t.rejects(store.list({ cursor: 'not-a-cursor' }), AuditCursorInvalid);
    await t.rejects(store.list({ from: 'yesterday' }));
    await t.rejects(store.list({ limit: 0 }));

    await Promise.all(Array.from({ length: LIST_LIMIT_MAX + 5 }, (_, i) => store.append(comparisonRecord(100 + i))));
    const big = await store.list({ limit: 10_000 });
    t.equal(big.records.length, LIST_LIMIT_MAX, 'page size is capped');
    t.type(big.nextCursor, 'string');
  });

  t.test('the list never reads a request or result: damaged bodies still list, with the best model', async (t) => {
    const { harness, store } = await withStore(t);
    const chose = (name: string) => ({ verdict: { chosen: name }, models: [{ name }] });
    await store.append(comparisonRecord(1, { result: chose('linear') }));
    await store.append(comparisonRecord(2, { kind: 'search', result: { models: [{ name: 'peakTemp+moisture' }, { name: 'peakTemp' }] } }));
    await store.append(comparisonRecord(3, { result: chose('quadratic') }));
    await harness.exec(`UPDATE audit_records SET result = 'not JSON at all', request = '{' WHERE seq IN (1, 3)`);
    const page = await store.list();
    t.same(page.records.map((r) => [r.seq, r.best]), [[3, 'quadratic'], [2, 'peakTemp+moisture'], [1, 'linear']]);
    t.same(page.corrupt, []);
    t.equal((await store.verify()).firstBroken?.reason, 'unreadable', 'verify is where a damaged body shows');
  });

  t.test('records written before the listing table list with their best model once it is filled in', async (t) => {
    const harness = await makeHarness();
    t.teardown(() => harness.cleanup());
    const first = await harness.open();
    const a = await first.append(comparisonRecord(1, { result: { verdict: { chosen: 'linear' } } }));
    await first.append(comparisonRecord(2, { result: { verdict: { chosen: 42 } } }));
    await first.append(comparisonRecord(3, { result: { verdict: { chosen: 'cubic' } } }));
    await first.close();
    // As a file of the first schema version would be: no listing table, a damaged result.
    await harness.exec(`DROP TABLE audit_listing; DELETE FROM schema_migrations WHERE version = 2; UPDATE audit_records SET result = '{' WHERE seq = 3`);
    const second = await harness.open();
    t.teardown(() => second.close());
    const page = await second.list();
    t.same(page.records.map((r) => [r.seq, r.best]), [[3, null], [2, null], [1, 'linear']], 'filled from the results that read; a damaged one lists without');
    t.equal(page.records[2].hash, a.hash);
    t.equal((await second.append(comparisonRecord(4, { result: { verdict: { chosen: 'quartic' } } }))).seq, 4);
    t.equal((await second.list({ limit: 1 })).records[0].best, 'quartic');
  });

  t.test('a record appended without a listing row (an older replica) still lists', async (t) => {
    const { harness, store } = await withStore(t);
    const r = await store.append(comparisonRecord(1));
    await harness.exec('DELETE FROM audit_listing');
    const [listed] = (await store.list()).records;
    t.same([listed.seq, listed.hash, listed.best], [1, r.hash, null]);
  });

  t.test('verify reports an intact chain and its head', async (t) => {
    const { store } = await withStore(t);
    t.same(await store.verify(), { ok: true, records: 0, head: null, firstBroken: null });
    let last;
    for (let i = 1; i <= 5; i++) last = await store.append(comparisonRecord(i));
    t.same(await store.verify(), { ok: true, records: 5, head: { seq: 5, id: last!.id, hash: last!.hash }, firstBroken: null });
  });

  t.test('verify pages by size and checks large rows in a worker: records of a megabyte each', async (t) => {
    const { harness, store } = await withStore(t);
    // 12 records of ~1 MB of result: more than one page of 8 MiB, each row above the inline threshold.
    const residuals = Array.from({ length: 50_000 }, (_, i) => Math.round(Math.sin(i) * 1e6) / 1e6);
    const ids: string[] = [];
    for (let i = 1; i <= 12; i++) ids.push((await store.append(comparisonRecord(i, { result: { residuals, firing: i } }))).id);
    t.same(await store.verify(), { ok: true, records: 12, head: { seq: 12, id: ids[11], hash: (await store.get(ids[11]))!.hash }, firstBroken: null });
    await harness.exec(`UPDATE audit_records SET result = replace(result, '"firing":11', '"firing":111') WHERE seq = 11`);
    t.same((await store.verify()).firstBroken, { seq: 11, id: ids[10], reason: 'hash_mismatch' }, 'an edit on the second page, found by the worker');
  });

  t.test('digest-only requests keep the digest and not the request', async (t) => {
    const { store } = await withStore(t);
    const full = comparisonRecord(1);
    const r = await store.append({ ...full, request: null });
    t.equal(r.request, null);
    t.equal(r.requestDigest, full.requestDigest);
    t.same(await store.get(r.id), r);
    t.ok((await store.verify()).ok);
    await t.rejects(store.append({ ...full, requestDigest: 'f'.repeat(64) }), AuditRecordInvalid, 'a digest must match the request it claims');
    await t.rejects(store.append({ ...full, result: { x: 1n } as never }), AuditRecordInvalid);
  });

  t.test('texts the caller already wrote give the same record, hash and stored bytes as texts the store writes', async (t) => {
    const clock = () => ({ now: () => Date.UTC(2026, 2, 14, 9, 30, 0, 125) });
    const random = (n: number) => new Uint8Array(n).fill(7);
    const a = await withStore(t, { clock: clock(), random });
    const b = await withStore(t, { clock: clock(), random });
    const input = comparisonRecord(3);
    const plain = await a.store.append(input);
    const written = await b.store.append(input, {
      resultJson: JSON.stringify(input.result), resultCanonical: sortedJson(input.result), requestCanonical: sortedJson(input.request),
    });
    t.strictSame(written, plain, 'the same stored record');
    t.equal(written.hash, documentedHash(written as unknown as Record<string, unknown>), 'hash follows the documented formula');
    t.ok((await b.store.verify()).ok);
    await t.rejects(b.store.append({ ...input, requestDigest: 'f'.repeat(64) }, { requestCanonical: sortedJson(input.request) }), AuditRecordInvalid,
      'the digest is still checked against the given canonical text');
  });

  for (const groupCommit of [true, false]) {
    t.test(`200 concurrent appends make one unbroken chain (groupCommit ${groupCommit})`, async (t) => {
      const { store } = await withStore(t, { groupCommit });
      const stored = await Promise.all(Array.from({ length: 200 }, (_, i) => store.append(comparisonRecord(i))));
      t.same(stored.map((r) => r.seq).sort((a, b) => a - b), Array.from({ length: 200 }, (_, i) => i + 1));
      t.equal(new Set(stored.map((r) => r.id)).size, 200);
      const report = await store.verify();
      t.equal(report.ok, true);
      t.equal(report.records, 200);
      t.equal(report.head?.seq, 200);
    });
  }

  const tamperCases: { name: string; sql: string; expect: (ids: string[]) => { seq: number; id: string | null; reason: string } }[] = [
    { name: 'editing a stored result', sql: `UPDATE audit_records SET result = '{"ranking":[],"rows":40}' WHERE seq = 3`,
      expect: (ids) => ({ seq: 3, id: ids[2], reason: 'hash_mismatch' }) },
    { name: 'editing an indexed column', sql: `UPDATE audit_records SET caller = 'key-west' WHERE seq = 2`,
      expect: (ids) => ({ seq: 2, id: ids[1], reason: 'hash_mismatch' }) },
    { name: 'deleting a record', sql: 'DELETE FROM audit_records WHERE seq = 3',
      expect: (ids) => ({ seq: 4, id: ids[3], reason: 'sequence_gap' }) },
    { name: 'deleting the newest record', sql: 'DELETE FROM audit_records WHERE seq = 6',
      expect: (ids) => ({ seq: 6, id: ids[5], reason: 'head_mismatch' }) },
    { name: 'swapping two records',
      sql: 'UPDATE audit_records SET seq = -1 WHERE seq = 3; UPDATE audit_records SET seq = 3 WHERE seq = 4; UPDATE audit_records SET seq = 4 WHERE seq = -1',
      expect: (ids) => ({ seq: 3, id: ids[3], reason: 'prev_hash_mismatch' }) },
    { name: 'damaging a row', sql: `UPDATE audit_records SET result = '{"ranking":' WHERE seq = 5`,
      expect: (ids) => ({ seq: 5, id: ids[4], reason: 'unreadable' }) },
  ];
  for (const c of tamperCases) {
    t.test(`verify names the first broken record after ${c.name}`, async (t) => {
      const { harness, store } = await withStore(t);
      const ids: string[] = [];
      for (let i = 1; i <= 6; i++) ids.push((await store.append(comparisonRecord(i))).id);
      await harness.exec(c.sql);
      const report = await store.verify();
      t.equal(report.ok, false);
      t.same(report.firstBroken, c.expect(ids));
    });
  }

  t.test('a damaged row is reported by get and list, not crashed on', async (t) => {
    const { harness, store } = await withStore(t);
    const ids: string[] = [];
    for (let i = 1; i <= 3; i++) ids.push((await store.append(comparisonRecord(i))).id);
    await harness.exec(`UPDATE audit_records SET kind = 'guess' WHERE seq = 2`);
    await t.rejects(store.get(ids[1]), AuditRecordCorrupt);
    const page = await store.list();
    t.same(page.records.map((r) => r.seq), [3, 1]);
    t.same(page.corrupt.map((c) => [c.seq, c.id]), [[2, ids[1]]]);
  });

  t.test('records survive closing and reopening, and the chain continues', async (t) => {
    const harness = await makeHarness();
    t.teardown(() => harness.cleanup());
    const first = await harness.open();
    const written = await Promise.all(Array.from({ length: 50 }, (_, i) => first.append(comparisonRecord(i))));
    await first.close();
    t.equal(await first.ready(), false, 'a closed store is not ready');
    await t.rejects(first.append(comparisonRecord(99)), AuditUnavailable);
    const second = await harness.open();
    t.teardown(() => second.close());
    t.equal(await second.ready(), true);
    for (const r of written) t.same(await second.get(r.id), r);
    const next = await second.append(comparisonRecord(51));
    t.equal(next.seq, 51);
    t.equal(next.prevHash, written.find((r) => r.seq === 50)!.hash);
    t.same((await second.verify()).records, 51);
    t.ok((await second.verify()).ok);
  });

  t.test('opening twice applies each migration once', async (t) => {
    const harness = await makeHarness();
    t.teardown(() => harness.cleanup());
    const [a, b] = await Promise.all([harness.open(), harness.open()]);
    await a.append(comparisonRecord(1));
    await b.append(comparisonRecord(2));
    t.same((await a.verify()).records, 2);
    await a.close();
    await b.close();
  });

  integrityOnReadSuite(t, withStore);
}
