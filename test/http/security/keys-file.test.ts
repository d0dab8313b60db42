// API_KEYS_FILE parsing and the key ring; loopback detection.
import t from 'tap';
import { parseKeysFile, loadKeysFile, KeysFileError } from '../../../src/http/security/keys-file.ts';
import { sha256OfKey } from '../../../src/http/security/key-ring.ts';
import { isLoopbackHost } from '../../../src/http/security/loopback.ts';
import { sha256Hex } from './test-keys.ts';

t.test('SHA-256 of a key: FIPS 180-2 appendix B.1 example ("abc")', async (t) => {
  t.equal(sha256OfKey('abc').toString('hex'), 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
});

t.test('a valid file identifies its keys and nothing else', async (t) => {
  const ring = parseKeysFile(JSON.stringify({ keys: [
    { id: 'dashboard', sha256: sha256Hex('key-one'), roles: ['score', 'read'] },
    { id: 'ops', sha256: sha256Hex('key-two').toUpperCase(), roles: ['admin'] },
  ] }), 'k.json');
  t.equal(ring.size, 2);
  t.notOk(ring.open);
  t.same(ring.identify('key-one')?.id, 'dashboard');
  t.same([...ring.identify('key-one')!.roles], ['score', 'read']);
  t.same(ring.identify('key-two')?.id, 'ops', 'upper-case hex is accepted');
  t.equal(ring.identify('key-three'), null);
  t.equal(ring.identify(''), null);
  t.equal(ring.identify(sha256Hex('key-one')), null, 'the digest itself is not a key');
});

t.test('a bad file is refused with a message naming the problem, never a key', async (t) => {
  const digest = sha256Hex('x');
  const cases: [string, unknown, RegExp][] = [
    ['not JSON', '{keys:', /not JSON/],
    ['no keys', { keys: [] }, /lists no keys/],
    ['a clear key instead of a digest', { keys: [{ id: 'a', sha256: 'hunter2', roles: ['read'] }] }, /keys\/0\/sha256: sha256 is the 64 hex/],
    ['an unknown role', { keys: [{ id: 'a', sha256: digest, roles: ['write'] }] }, /keys\/0\/roles\/0/],
    ['no roles', { keys: [{ id: 'a', sha256: digest, roles: [] }] }, /at least one role/],
    ['a typo in a field name', { keys: [{ id: 'a', sha256: digest, role: ['read'] }] }, /keys\/0/],
    ['a duplicate id', { keys: [{ id: 'a', sha256: digest, roles: ['read'] }, { id: 'a', sha256: sha256Hex('y'), roles: ['read'] }] }, /keys\/1\/id: id "a" is also used by keys\/0/],
    ['a duplicate digest', { keys: [{ id: 'a', sha256: digest, roles: ['read'] }, { id: 'b', sha256: digest, roles: ['admin'] }] }, /keys\/1\/sha256/],
    ['the reserved id', { keys: [{ id: 'anonymous', sha256: digest, roles: ['read'] }] }, /anonymous/],
    ['an id with spaces', { keys: [{ id: 'my key', sha256: digest, roles: ['read'] }] }, /keys\/0\/id/],
  ];
  for (const [label, content, message] of cases) {
    const text = typeof content === 'string' ? content : JSON.stringify(content);
    t.throws(() => parseKeysFile(text, '/etc/k.json'), { constructor: KeysFileError, message }, label);
    try { parseKeysFile(text, '/etc/k.json'); } catch (e) { t.match((e as Error).message, /API_KEYS_FILE \/etc\/k\.json/, `${label}: names the file`); }
  }
  t.throws(() => loadKeysFile('/nonexistent/keys.json'), { constructor: KeysFileError, message: /cannot be read: ENOENT/ });
});

t.test('loopback addresses (RFC 1122 §3.2.1.3: 127.0.0.0/8; RFC 4291 §2.5.3: ::1)', async (t) => {
  for (const h of ['127.0.0.1', '127.1.2.3', '::1', '[::1]', '0:0:0:0:0:0:0:1', 'localhost', 'LOCALHOST', '::ffff:127.0.0.1']) t.ok(isLoopbackHost(h), h);
  for (const h of ['0.0.0.0', '::', '10.0.0.1', '128.0.0.1', 'example.org', '::2', '192.168.1.127', 'localhost.example.org']) t.notOk(isLoopbackHost(h), h);
});
