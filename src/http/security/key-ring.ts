// The configured API keys, held only as SHA-256 digests. A presented key is
// hashed and compared against every digest in constant time, without stopping at
// the first match, so neither timing nor order says which key was close.
import { createHash, timingSafeEqual } from 'node:crypto';
import type { Role } from './route-roles.ts';

export interface ApiKey {
  id: string;
  roles: ReadonlySet<Role>;
}

interface HeldKey extends ApiKey {
  digest: Buffer;
}

export function sha256OfKey(key: string): Buffer {
  return createHash('sha256').update(key, 'utf8').digest();
}

export class KeyRing {
  readonly #keys: ReadonlyArray<HeldKey>;

  constructor(keys: ReadonlyArray<{ id: string; sha256: string; roles: ReadonlyArray<Role> }>) {
    this.#keys = keys.map((k) => ({ id: k.id, roles: new Set(k.roles), digest: Buffer.from(k.sha256, 'hex') }));
  }

  static empty(): KeyRing {
    return new KeyRing([]);
  }

  /** No keys: the service is open (and server.ts keeps it on loopback). */
  get open(): boolean {
    return this.#keys.length === 0;
  }

  get size(): number {
    return this.#keys.length;
  }

  identify(presented: string): ApiKey | null {
    const digest = sha256OfKey(presented);
    let found: HeldKey | null = null;
    for (const key of this.#keys) {
      // Every digest is compared; the match is remembered, never returned early.
      const same = timingSafeEqual(digest, key.digest);
      if (same && found === null) found = key;
    }
    return found && { id: found.id, roles: found.roles };
  }
}
