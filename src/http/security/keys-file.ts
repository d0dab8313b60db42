// API_KEYS_FILE, fixed format:
//   { "keys": [ { "id": "dashboard", "sha256": "<hex SHA-256 of the key>", "roles": ["score", "read"] } ] }
// Read and validated once at start; any fault stops the service with a message
// that names the file and the entry, never a key.
import { readFileSync } from 'node:fs';
import { z } from 'zod';
import { KeyRing } from './key-ring.ts';
import { ROLES } from './route-roles.ts';

const KeyEntry = z.strictObject({
  // The id is the caller written into every audit record, so it must read well there.
  id: z.string().regex(/^[A-Za-z0-9][A-Za-z0-9._-]{0,99}$/, 'an id is 1–100 letters, digits, ".", "_" or "-", starting with a letter or digit')
    .refine((id) => id !== 'anonymous', '"anonymous" is the caller recorded when no keys are configured; choose another id'),
  sha256: z.string().regex(/^[0-9a-fA-F]{64}$/, 'sha256 is the 64 hex digits of the SHA-256 of the key, never the key itself')
    .transform((s) => s.toLowerCase()),
  roles: z.array(z.enum(ROLES)).min(1, 'a key needs at least one role (score, read, admin)'),
});

export const KeysFileSchema = z.strictObject({
  keys: z.array(KeyEntry).min(1, 'the file lists no keys; remove API_KEYS_FILE to run open on loopback instead'),
}).superRefine((file, ctx) => {
  const seenIds = new Map<string, number>();
  const seenDigests = new Map<string, number>();
  file.keys.forEach((k, i) => {
    if (seenIds.has(k.id)) ctx.addIssue({ code: 'custom', path: ['keys', i, 'id'], message: `id "${k.id}" is also used by keys/${seenIds.get(k.id)}` });
    if (seenDigests.has(k.sha256)) ctx.addIssue({ code: 'custom', path: ['keys', i, 'sha256'], message: `the same key digest is also listed at keys/${seenDigests.get(k.sha256)}` });
    seenIds.set(k.id, i);
    seenDigests.set(k.sha256, i);
  });
});

export class KeysFileError extends Error {}

export function parseKeysFile(text: string, path: string): KeyRing {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    throw new KeysFileError(`API_KEYS_FILE ${path} is not JSON: ${(error as Error).message}`);
  }
  const parsed = KeysFileSchema.safeParse(json);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `${i.path.join('/') || '(top level)'}: ${i.message}`);
    throw new KeysFileError(`API_KEYS_FILE ${path} is not in the expected form {"keys":[{"id","sha256","roles"}]}: ${lines.join('; ')}`);
  }
  return new KeyRing(parsed.data.keys);
}

export function loadKeysFile(path: string): KeyRing {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (error) {
    throw new KeysFileError(`API_KEYS_FILE ${path} cannot be read: ${(error as NodeJS.ErrnoException).code ?? (error as Error).message}`);
  }
  return parseKeysFile(text, path);
}
