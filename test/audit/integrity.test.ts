// Integrity on read (src/audit/integrity.ts), check by check, on records
// chained here by the documented rule (src/audit/README.md) written out again
// with node:crypto, so the check is compared with the rule, not with itself.
import { createHash } from 'node:crypto';
import t from 'tap';
import { recordIntegrity, type ChainLinks } from '../../src/audit/integrity.ts';

const GENESIS = '0'.repeat(64);

function sortedJson(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(sortedJson).join(',')}]`;
  if (v !== null && typeof v === 'object') {
    return `{${Object.keys(v).sort().map((k) => `${JSON.stringify(k)}:${sortedJson((v as Record<string, unknown>)[k])}`).join(',')}}`;
  }
  return JSON.stringify(v);
}

interface Row { seq: number; id: string; label: string; prevHash: string; hash: string }

/** Three records chained from the genesis hash (demo scenario labels, invented). */
function chain(): Row[] {
  const rows: Row[] = [];
  let prevHash = GENESIS;
  for (const [i, label] of ['spring firing', 'summer firing', 'autumn firing'].entries()) {
    const body = { seq: i + 1, id: `rec-${i + 1}`, label };
    const hash = createHash('sha256').update(prevHash + sortedJson(body), 'utf8').digest('hex');
    rows.push({ ...body, prevHash, hash });
    prevHash = hash;
  }
  return rows;
}

/** What a store would answer around row `index` of these rows, with the head at the last row. */
function linksOf(rows: Row[], seq: number, head = rows[rows.length - 1]): ChainLinks {
  const previous = rows.find((r) => r.seq === seq - 1);
  const next = rows.find((r) => r.seq === seq + 1);
  return {
    previous: previous ? { seq: previous.seq, hash: previous.hash } : null,
    next: next ? { seq: next.seq, prevHash: next.prevHash } : null,
    head: head ? { seq: head.seq, hash: head.hash } : null,
  };
}

t.test('an intact chain: every record passes, and says what was checked', async (t) => {
  const rows = chain();
  const results = rows.map((r) => recordIntegrity(r, linksOf(rows, r.seq)));
  t.same(results.map((r) => [r.ok, r.reason]), [[true, null], [true, null], [true, null]]);
  t.match(results[0].detail, /Record 1 hashes to its stored hash, it is the first record, and record 2 names its hash\./);
  t.match(results[1].detail, /it names the hash of record 1, and record 3 names its hash/);
  t.match(results[2].detail, /it is the newest record, as the store's head says/);
  t.match(results[2].detail, /GET \/v1\/audit\/verify checks the whole chain/);
});

t.test('content edited: hash_mismatch, and the neighbours still pass', async (t) => {
  const rows = chain();
  rows[1] = { ...rows[1], label: 'summer firing (corrected)' };
  const middle = recordIntegrity(rows[1], linksOf(rows, 2));
  t.same([middle.ok, middle.reason], [false, 'hash_mismatch']);
  t.match(middle.detail, /Record 2 no longer hashes to its stored hash/);
  t.match(middle.detail, /Do not rely on this record/);
  t.equal(recordIntegrity(rows[0], linksOf(rows, 1)).ok, true, 'record 1 is untouched');
  t.equal(recordIntegrity(rows[2], linksOf(rows, 3)).ok, true, 'record 3 still names the stored hash of record 2');
});

t.test('content edited and re-hashed: the next record\'s link gives it away', async (t) => {
  const rows = chain();
  const edited = { seq: 2, id: 'rec-2', label: 'summer firing (corrected)' };
  rows[1] = { ...edited, prevHash: rows[1].prevHash, hash: createHash('sha256').update(rows[1].prevHash + sortedJson(edited), 'utf8').digest('hex') };
  t.same(Object.values(recordIntegrity(rows[1], linksOf(rows, 2))).slice(0, 2), [false, 'next_link_mismatch']);
  t.same(Object.values(recordIntegrity(rows[2], linksOf(rows, 3))).slice(0, 2), [false, 'prev_hash_mismatch']);
});

t.test('a record removed: its neighbours report the gap', async (t) => {
  const rows = chain();
  const gapped = [rows[0], rows[2]];
  const before = recordIntegrity(rows[0], linksOf(gapped, 1, rows[2]));
  t.same([before.ok, before.reason], [false, 'sequence_gap']);
  t.match(before.detail, /Record 2, the one after record 1, is missing, though the chain's head is record 3/);
  const after = recordIntegrity(rows[2], linksOf(gapped, 3, rows[2]));
  t.same([after.ok, after.reason], [false, 'sequence_gap']);
  t.match(after.detail, /Record 2, the one before record 3, is missing/);
});

t.test('the first record must follow 64 zeros; the newest must be the committed head', async (t) => {
  const rows = chain();
  t.equal(recordIntegrity({ ...rows[0], prevHash: 'f'.repeat(64) }, linksOf(rows, 1)).reason, 'hash_mismatch', 'prevHash is hashed too');
  const head = recordIntegrity(rows[2], { ...linksOf(rows, 3), head: { seq: 3, hash: 'e'.repeat(64) } });
  t.same([head.ok, head.reason], [false, 'head_mismatch']);
  const beyond = recordIntegrity(rows[2], { ...linksOf(rows, 3), head: { seq: 2, hash: rows[1].hash } });
  t.same([beyond.ok, beyond.reason], [false, 'head_mismatch'], 'a row beyond the committed head');
  t.match(beyond.detail, /names record 2/);
  t.equal(recordIntegrity(rows[2], { ...linksOf(rows, 3), head: null }).ok, true, 'a store without a head: nothing to compare');
});
