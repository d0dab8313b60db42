// The chain head last seen, kept in a small file beside an SQLite store
// (audit.sqlite.head.json). The chain detects a record edited, removed from
// the middle or from the end behind a surviving head row; it cannot detect
// that the head row itself went back with the records, as it does when the
// write-ahead log holding the newest commits is lost (deleted with the -shm
// file, left behind by a copy of the main file alone, or a disk that did not
// keep what it acknowledged). This file remembers the head from outside the
// database, so the next start can tell. It is written atomically (a
// temporary file renamed over it) and synced; an operator may delete it to
// accept a loss they have dealt with (README: Lost records).
import { open, readFile, rename } from 'node:fs/promises';
import type { RecordedHead } from './chain.ts';

export interface WitnessedHead extends RecordedHead {
  /** When this process saw the head (ISO 8601). */
  seenAt: string;
}

/** What the start found when the database's head is compared with the witness. */
export interface HeadFinding {
  /** behind: fewer records than last seen; rewritten: as many, but a different last hash. */
  kind: 'behind' | 'rewritten';
  current: RecordedHead;
  lastSeen: WitnessedHead;
  /** Records the witness saw that the database no longer has (0 for rewritten). */
  missing: number;
}

export function witnessPath(sqlitePath: string): string {
  return `${sqlitePath}.head.json`;
}

const isHex64 = (v: unknown): v is string => typeof v === 'string' && /^[0-9a-f]{64}$/.test(v);

/** The witnessed head, or null when there is none yet (or the file is not one this service wrote). */
export async function readWitness(path: string): Promise<WitnessedHead | null> {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch {
    return null;
  }
  try {
    const v = JSON.parse(text) as Record<string, unknown>;
    if (!Number.isSafeInteger(v.seq) || (v.seq as number) < 0 || !isHex64(v.hash) || typeof v.seenAt !== 'string') return null;
    return { seq: v.seq as number, id: typeof v.id === 'string' ? v.id : null, hash: v.hash, seenAt: v.seenAt };
  } catch {
    return null;
  }
}

export async function writeWitness(path: string, head: RecordedHead, seenAt: string): Promise<void> {
  const temporary = `${path}.${process.pid}.tmp`;
  const file = await open(temporary, 'w');
  try {
    await file.writeFile(`${JSON.stringify({ seq: head.seq, id: head.id, hash: head.hash, seenAt })}\n`, 'utf8');
    await file.sync();
  } finally {
    await file.close();
  }
  await rename(temporary, path);
}

export function compareWithWitness(current: RecordedHead, lastSeen: WitnessedHead | null): HeadFinding | null {
  if (lastSeen === null) return null;
  if (current.seq < lastSeen.seq) return { kind: 'behind', current, lastSeen, missing: lastSeen.seq - current.seq };
  if (current.seq === lastSeen.seq && current.hash !== lastSeen.hash) {
    return { kind: 'rewritten', current, lastSeen, missing: 0 };
  }
  return null;
}
