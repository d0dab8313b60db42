// API keys for tests: each key is random per run, and the ring holds only its
// SHA-256 — the same shape API_KEYS_FILE has.
import { createHash, randomBytes } from 'node:crypto';
import { parseKeysFile } from '../../../src/http/security/keys-file.ts';
import type { Role } from '../../../src/http/security/route-roles.ts';

export const sha256Hex = (s: string) => createHash('sha256').update(s).digest('hex');
export const newKey = () => `pk_${randomBytes(24).toString('base64url')}`;

export function testKeys(entries: Record<string, Role[]>) {
  const secrets: Record<string, string> = {};
  const keys = Object.entries(entries).map(([id, roles]) => {
    secrets[id] = newKey();
    return { id, sha256: sha256Hex(secrets[id]), roles };
  });
  const fileText = JSON.stringify({ keys });
  return { ring: parseKeysFile(fileText, 'test-keys.json'), secrets, fileText };
}

export const bearer = (key: string) => ({ authorization: `Bearer ${key}` });
