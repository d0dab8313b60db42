// Group commit: appends that arrive while the store is busy (or within the same
// event-loop turn) are written in one transaction, so one fsync covers many
// records. No timer delays anything: a lone append is committed on the next
// turn. Each caller's promise settles only after the COMMIT that holds its
// record has returned, so an acknowledged record is a durable record.
import type { PreparedRecord } from './rows.ts';
import type { StoredRecord } from './store.ts';

interface Waiting {
  record: PreparedRecord;
  resolve: (stored: StoredRecord) => void;
  reject: (err: unknown) => void;
}

export type CommitBatch = (records: PreparedRecord[]) => Promise<StoredRecord[]>;

export class GroupCommit {
  private waiting: Waiting[] = [];
  private busy = false;
  private scheduled = false;
  private idle: (() => void)[] = [];

  constructor(private readonly commit: CommitBatch, private readonly maxBatch: number) {}

  submit(record: PreparedRecord): Promise<StoredRecord> {
    return new Promise((resolve, reject) => {
      this.waiting.push({ record, resolve, reject });
      this.schedule();
    });
  }

  /** Resolves once every submitted record has been committed or refused. */
  drained(): Promise<void> {
    if (!this.busy && !this.scheduled && this.waiting.length === 0) return Promise.resolve();
    return new Promise((resolve) => this.idle.push(resolve));
  }

  private schedule(): void {
    if (this.busy || this.scheduled) return;
    this.scheduled = true;
    setImmediate(() => {
      this.scheduled = false;
      void this.flush();
    });
  }

  private async flush(): Promise<void> {
    const batch = this.waiting.splice(0, this.maxBatch);
    if (batch.length === 0) return this.settleIdle();
    this.busy = true;
    try {
      const stored = await this.commit(batch.map((w) => w.record));
      batch.forEach((w, i) => w.resolve(stored[i]));
    } catch (err) {
      // The whole transaction rolled back: none of these records exists. One
      // record the database refuses must not take its neighbours down with it,
      // so a failed batch is retried one record at a time.
      if (batch.length === 1) batch[0].reject(err);
      else await this.oneByOne(batch);
    } finally {
      this.busy = false;
    }
    if (this.waiting.length > 0) this.schedule();
    else this.settleIdle();
  }

  private async oneByOne(batch: Waiting[]): Promise<void> {
    for (const w of batch) {
      try {
        const [stored] = await this.commit([w.record]);
        w.resolve(stored);
      } catch (err) {
        w.reject(err);
      }
    }
  }

  private settleIdle(): void {
    const idle = this.idle.splice(0);
    for (const resolve of idle) resolve();
  }
}
