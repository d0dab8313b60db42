// Canonical JSON, SHA-256, the chain formula and the verification walk, checked
// against outside references where one exists.
import { createHash } from 'node:crypto';
import t from 'tap';
import { canonicalJson, ChainWalk, GENESIS_HASH, hashOfRecord, NotCanonicalisable, recordHash, requestDigest, requestDigestOfParsed, sha256Hex } from '../../src/audit/chain.ts';
import { recordIdSource } from '../../src/audit/ids.ts';

t.test('SHA-256 test vectors', async (t) => {
  // FIPS 180-2, Appendix B.1 and B.2 (one- and two-block messages).
  t.equal(sha256Hex('abc'), 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  t.equal(sha256Hex('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq'), '248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1');
});

t.test('canonical JSON', async (t) => {
  // RFC 8785 §3.2.3 sample (JSON Canonicalization Scheme); input and output quoted from memory of the RFC.
  const input = JSON.parse('{"numbers":[333333333.33333329,1E30,4.50,2e-3,0.000000000000000000000000001],"string":"\\u20ac$\\u000F\\u000aA\'\\u0042\\u0022\\u005c\\\\\\"\\/","literals":[null,true,false]}');
  t.equal(canonicalJson(input), '{"literals":[null,true,false],"numbers":[333333333.3333333,1e+30,4.5,0.002,1e-27],"string":"€$\\u000f\\nA\'B\\"\\\\\\\\\\"/"}');
  // Key order is by UTF-16 code units (RFC 8785 §3.2.3): uppercase before lowercase, "10" before "9".
  t.equal(canonicalJson({ b: 1, a: { d: [3, { z: 0, y: -0 }], c: 'x' }, B: null, 10: 1, 9: 2 }), '{"10":1,"9":2,"B":null,"a":{"c":"x","d":[3,{"y":0,"z":0}]},"b":1}');
  t.throws(() => canonicalJson({ x: NaN }), NotCanonicalisable);
  t.throws(() => canonicalJson({ x: undefined }), NotCanonicalisable);
  t.throws(() => canonicalJson(new Date(0)), NotCanonicalisable);
  // The refusal still names the place, though the fast walk keeps no path.
  const refusal = (value: unknown) => {
    try {
      canonicalJson(value);
    } catch (err) {
      return err instanceof NotCanonicalisable ? { path: err.path, found: err.found } : err;
    }
    return null;
  };
  t.strictSame(refusal({ a: [1, { b: Infinity }] }), { path: '/a/1/b', found: 'Infinity' });
  t.strictSame(refusal({ a: [0, new Map()] }), { path: '/a/1', found: 'object of type Map' });
  // A sparse array is written as before (the fast walk defers to the slow one).
  t.equal(canonicalJson([1, , 3]), '[1,,3]'); // eslint-disable-line no-sparse-arrays
  // Texts already written canonically are reused by identity, with the same output as writing them again.
  const part = { z: [1.5, -0, 'é'], a: { y: null } };
  const whole = { result: part, request: { q: 1 }, seq: 3 };
  t.equal(canonicalJson(whole, new Map([[part, canonicalJson(part)]])), canonicalJson(whole));
  t.equal(requestDigest({ b: 2, a: 1 }), createHash('sha256').update('{"a":1,"b":2}').digest('hex'));
  // A parsed body needs no round trip: the same digest, -0, escapes and "__proto__" keys included
  // (U+2028 is written as itself: JSON.stringify leaves it unescaped, RFC 8785 §3.2.2.2).
  const sent = JSON.parse('{"b":[-0,1e-7,"\\u2028"],"__proto__":{"x":1},"a":{"c":null,"B":true}}');
  t.equal(requestDigestOfParsed(sent), requestDigest(sent));
  t.equal(requestDigestOfParsed(sent), createHash('sha256').update('{"__proto__":{"x":1},"a":{"B":true,"c":null},"b":[0,1e-7,"\u2028"]}', 'utf8').digest('hex'));
});

t.test('chain formula', async (t) => {
  t.equal(GENESIS_HASH, '0'.repeat(64));
  t.equal(recordHash(GENESIS_HASH, '{}'), createHash('sha256').update('0'.repeat(64) + '{}').digest('hex'));
});

function chain(n: number) {
  const records = [];
  let prev = GENESIS_HASH;
  for (let seq = 1; seq <= n; seq++) {
    const r = { seq, id: `id-${seq}`, payload: seq * 10, prevHash: prev, hash: '' };
    r.hash = hashOfRecord(r);
    prev = r.hash;
    records.push(r);
  }
  return records;
}

t.test('the walk accepts an intact chain and names the first break', async (t) => {
  const intact = chain(4);
  const walk = (rs: typeof intact, head = { seq: 4, id: 'id-4', hash: intact[3].hash }) => {
    const w = new ChainWalk();
    for (const record of rs) w.push({ record });
    return w.finish(head);
  };
  t.same(walk(intact), { ok: true, records: 4, head: { seq: 4, id: 'id-4', hash: intact[3].hash }, firstBroken: null });
  const edited = intact.map((r) => ({ ...r }));
  edited[1].payload = 21;
  t.same(walk(edited).firstBroken, { seq: 2, id: 'id-2', reason: 'hash_mismatch' });
  t.same(walk([intact[0], intact[2], intact[3]]).firstBroken, { seq: 3, id: 'id-3', reason: 'sequence_gap' });
  const relinked = intact.map((r) => ({ ...r }));
  relinked[2].prevHash = relinked[0].hash;
  t.same(walk(relinked).firstBroken, { seq: 3, id: 'id-3', reason: 'prev_hash_mismatch' });
  t.same(walk(intact.slice(0, 3)).firstBroken, { seq: 4, id: 'id-4', reason: 'head_mismatch' });
  t.same(walk(intact, { seq: 3, id: 'id-3', hash: intact[2].hash }).firstBroken, { seq: 4, id: null, reason: 'head_mismatch' });
  const w = new ChainWalk();
  w.push({ record: intact[0] });
  w.push({ unreadable: { seq: 2, id: 'id-2' } });
  t.same(w.finish(null).firstBroken, { seq: 2, id: 'id-2', reason: 'unreadable' });
});

t.test('record ids: UUIDv7 layout, ordered within one millisecond', async (t) => {
  let byte = 0;
  const ids = recordIdSource({ now: () => 1_700_000_000_000 }, (n) => Uint8Array.from({ length: n }, () => (byte = (byte * 31 + 7) & 0xff)));
  const made = Array.from({ length: 3000 }, () => ids.next());
  // RFC 9562 §5.7: version nibble 7, variant bits 10.
  for (const { id } of made.slice(0, 20)) t.match(id, /^[0-9a-f]{8}-[0-9a-f]{4}-7[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
  t.equal(made[0].id.slice(0, 13).replace('-', ''), (1_700_000_000_000).toString(16).padStart(12, '0'));
  t.equal(made[0].createdAt, '2023-11-14T22:13:20.000Z');
  const sorted = made.map((m) => m.id).slice().sort();
  t.same(sorted, made.map((m) => m.id), 'ids sort in the order they were made, even past the 12-bit counter');
  t.equal(new Set(sorted).size, made.length);
});
