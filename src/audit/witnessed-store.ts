// An SQLite store with its head witness kept up to date (head-witness.ts says
// why): after appends the newest head is written to the side file, at most
// once per WITNESS_INTERVAL_MS (a write is a small file, an fsync and a
// rename: not something to do per record); at close the store's own head is
// written last. The witness never moves back: while the chain is behind what
// it saw, it keeps saying so at every start, until the chain passes it or an
// operator deletes the file to accept the loss. A witness that cannot be
// written is reported, never turned into a failed append: the records
// themselves are safe in the database.
import type { RecordedHead } from './chain.ts';
import { writeWitness } from './head-witness.ts';
import type { AuditStore } from './store.ts';

export const WITNESS_INTERVAL_MS = 1000;

export interface WitnessOptions {
  /** The seq the witness file holds now (-1: none); nothing at or below it is written. */
  witnessedSeq?: number;
  intervalMs?: number;
  now?: () => Date;
  /** A witness write failed (the disk is full, the directory read-only): log it. */
  onError?: (error: unknown) => void;
}

export function withHeadWitness(store: AuditStore, path: string, options: WitnessOptions = {}): AuditStore {
  const intervalMs = options.intervalMs ?? WITNESS_INTERVAL_MS;
  const now = options.now ?? (() => new Date());
  let latest: RecordedHead | null = null;
  let writtenSeq = options.witnessedSeq ?? -1;
  let timer: NodeJS.Timeout | null = null;
  let writing: Promise<void> = Promise.resolve();

  const write = (head: RecordedHead): Promise<void> => {
    writing = writing.then(async () => {
      if (head.seq <= writtenSeq) return;
      try {
        await writeWitness(path, head, now().toISOString());
        writtenSeq = head.seq;
      } catch (error) {
        options.onError?.(error);
      }
    });
    return writing;
  };
  const schedule = () => {
    if (timer) return;
    timer = setTimeout(() => {
      timer = null;
      if (latest) void write(latest);
    }, intervalMs);
    timer.unref();
  };

  return {
    backend: store.backend,
    async append(input, written) {
      const stored = await store.append(input, written);
      if (!latest || stored.seq > latest.seq) latest = { seq: stored.seq, id: stored.id, hash: stored.hash };
      schedule();
      return stored;
    },
    get: (id) => store.get(id),
    list: (query) => store.list(query),
    verify: () => store.verify(),
    ready: () => store.ready(),
    head: () => store.head(),
    chainLinks: (seq) => store.chainLinks(seq),
    async close() {
      if (timer) clearTimeout(timer);
      timer = null;
      // The database's own head: appends by other processes on the file included.
      const head = await store.head().catch(() => latest);
      if (head) await write(head);
      await store.close();
    },
  };
}
