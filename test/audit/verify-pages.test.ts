// The verification walk's paging (src/audit/verify-pages.ts): pages end at a
// row count or once their bodies pass a byte limit, one row at least; the walk
// reads the next page after the last row it checked and stops at a complete one.
import t from 'tap';
import { canonicalJson, recordHash, GENESIS_HASH } from '../../src/audit/chain.ts';
import { RECORD_COLUMNS, type RecordRow } from '../../src/audit/rows.ts';
import { rowsThatFit, verifyByPages, type VerifyPageLimits } from '../../src/audit/verify-pages.ts';
import { OFF_THREAD_LENGTH } from '../../src/audit/row-checker.ts';

t.test('rowsThatFit: at least one row, then while under both limits; the row that passes the byte limit ends the page', async (t) => {
  const limits: VerifyPageLimits = { rows: 3, bytes: 100 };
  t.equal(rowsThatFit([], limits), 0);
  t.equal(rowsThatFit([500, 1], limits), 1, 'one row larger than the page');
  t.equal(rowsThatFit([60, 60, 1], limits), 2, 'the second row passes 100 and ends the page');
  t.equal(rowsThatFit([10, 10, 10, 10], limits), 3, 'the row count');
  t.equal(rowsThatFit([99, 1, 1], limits), 2);
});

/** A chain of rows as a store would hold them (demo scenario, invented). */
function chainRows(lengths: number[]): RecordRow[] {
  let prevHash = GENESIS_HASH;
  return lengths.map((length, i) => {
    const seq = i + 1;
    const request = { response: 'thickness', note: 'x'.repeat(length) };
    const body = {
      kind: 'comparison', caller: 'kiln-planning', label: null, serviceVersion: '0.1.0', conventionsVersion: '1', policy: null,
      datasetFingerprint: null, requestDigest: 'a'.repeat(64), request, result: { firing: seq },
      id: `01900000-0000-7000-8000-${String(seq).padStart(12, '0')}`, createdAt: '2026-03-01T08:00:00.000Z', seq,
    };
    const hash = recordHash(prevHash, canonicalJson(body));
    const row = Object.fromEntries(RECORD_COLUMNS.map((c) => [c, null])) as RecordRow;
    Object.assign(row, {
      seq, id: body.id, created_at: body.createdAt, kind: body.kind, caller: body.caller, label: null, service_version: '0.1.0',
      conventions_version: '1', dataset_fingerprint: null, request_digest: body.requestDigest, request: JSON.stringify(request),
      result: JSON.stringify(body.result), prev_hash: prevHash, hash,
    });
    prevHash = hash;
    return row;
  });
}

t.test('the walk follows pages to a complete one, inline and in a worker alike', async (t) => {
  const rows = chainRows([10, 10, OFF_THREAD_LENGTH + 10, 10, 10, OFF_THREAD_LENGTH * 2, 10]);
  const last = rows[rows.length - 1];
  const asked: number[] = [];
  const report = await verifyByPages(async (afterSeq, limits) => {
    asked.push(afterSeq);
    const rest = rows.filter((r) => Number(r.seq) > afterSeq);
    const count = rowsThatFit(rest.map((r) => String(r.request).length), limits);
    return { rows: rest.slice(0, count), head: { seq: 7, id: String(last.id), hash: String(last.hash) }, complete: count === rest.length };
  }, { rows: 2, bytes: OFF_THREAD_LENGTH });
  t.same(report, { ok: true, records: 7, head: { seq: 7, id: last.id, hash: last.hash }, firstBroken: null });
  t.same(asked, [0, 2, 3, 5, 6], 'pages after the last row checked: two small rows, a large one alone, then by count and size');
});

t.test('an edited large row is found by the worker, an unreadable one is named', async (t) => {
  const rows = chainRows([OFF_THREAD_LENGTH + 1, OFF_THREAD_LENGTH + 1, 10]);
  const read = (list: RecordRow[]) => verifyByPages(async (afterSeq) => {
    const rest = list.filter((r) => Number(r.seq) > afterSeq);
    return { rows: rest, head: { seq: 3, id: String(rows[2].id), hash: String(rows[2].hash) }, complete: true };
  });
  const edited = rows.map((r) => ({ ...r }));
  edited[1].request = String(edited[1].request).replace('"thickness"', '"thinness"');
  t.same((await read(edited)).firstBroken, { seq: 2, id: rows[1].id, reason: 'hash_mismatch' });
  const damaged = rows.map((r) => ({ ...r }));
  damaged[0].result = '{"firing":';
  damaged[0].request = String(damaged[0].request);
  t.same((await read(damaged)).firstBroken, { seq: 1, id: rows[0].id, reason: 'unreadable' });
});
