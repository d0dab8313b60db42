// Time-ordered record ids in the UUIDv7 layout (RFC 9562 §5.7): 48 bits of Unix
// milliseconds, version 7, 12 bits of a per-process counter seeded at random on
// each new millisecond (RFC 9562 §6.2 method 1, so ids made in one millisecond by
// one process still sort in the order they were made), the variant bits, and 62
// random bits. The clock and the randomness are injected to keep stores testable.
import { randomFillSync } from 'node:crypto';

export interface AuditClock {
  /** Milliseconds since the Unix epoch. */
  now(): number;
}

export type RandomBytes = (length: number) => Uint8Array;

export const systemClock: AuditClock = { now: () => Date.now() };
export const systemRandom: RandomBytes = (length) => randomFillSync(new Uint8Array(length));

export interface RecordIdSource {
  /** A new id and the createdAt stamp (ISO 8601 UTC with milliseconds) taken from the same instant. */
  next(): { id: string; createdAt: string };
}

export function recordIdSource(clock: AuditClock = systemClock, random: RandomBytes = systemRandom): RecordIdSource {
  let lastMs = -1;
  let counter = 0;
  return {
    next() {
      let ms = Math.floor(clock.now());
      if (ms < lastMs) ms = lastMs; // a clock stepping back must not reorder this process's ids
      const bytes = random(10);
      if (ms === lastMs && counter < 0xfff) {
        counter += 1;
      } else {
        if (ms === lastMs) ms += 1; // counter exhausted: borrow the next millisecond
        counter = ((bytes[0] << 8) | bytes[1]) & 0x7ff; // top bit clear leaves room to count
      }
      lastMs = ms;
      const hex = ms.toString(16).padStart(12, '0');
      const randA = (0x7000 | counter).toString(16).padStart(4, '0');
      const b = bytes.subarray(2);
      b[0] = (b[0] & 0x3f) | 0x80;
      const randB = Buffer.from(b).toString('hex');
      const id = `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${randA}-${randB.slice(0, 4)}-${randB.slice(4, 16)}`;
      return { id, createdAt: new Date(ms).toISOString() };
    },
  };
}
