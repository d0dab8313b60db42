// Where each row of a verification walk is checked. Small rows are checked
// inline, with a turn of the event loop after every slice of work; a row as
// large as a record with 100,000 prediction rows per model takes a second or
// more to parse and hash, so rows past OFF_THREAD_LENGTH go to a worker
// thread and the loop keeps answering (/healthz, other callers) meanwhile.
// One worker per walk, started only when a large row appears, stopped at the
// end: a verification is rare and admin-only, so no thread is kept idle for it.
import { Worker } from 'node:worker_threads';
import type { WalkRow } from './chain.ts';
import type { RecordRow } from './rows.ts';
import { checkVerifyRow, rowBodyLength } from './verify-row.ts';
import type { RowCheckReply, RowCheckTask } from './verify-worker.ts';

/** Rows with more characters of request and result than this are checked in a worker thread (~5 ms of work inline). */
export const OFF_THREAD_LENGTH = 256 * 1024;
/** Characters checked inline between two turns of the event loop (~20 ms of work). */
const INLINE_SLICE = 1024 * 1024;
/** Counted per row besides its bodies: its other columns and the bookkeeping. */
const ROW_OVERHEAD = 512;

const turnOfTheLoop = () => new Promise<void>((resolve) => setImmediate(resolve));

function startWorker(): Worker {
  // Run from sources (tsx, tap) the worker module is the .ts beside this one; built, the .js.
  const ext = import.meta.url.endsWith('.ts') ? '.ts' : '.js';
  const entry = new URL(`./verify-worker${ext}`, import.meta.url).href;
  // The compute pool's plain-JS entry installs the TypeScript loader when the module is a source file;
  // no inherited preloads (a TypeScript one would fail in the worker before any loader).
  return new Worker(new URL('../compute/worker-entry.mjs', import.meta.url), { workerData: { module: entry }, execArgv: [] });
}

export class RowChecker {
  private worker: Worker | null = null;
  private readonly waiting = new Map<number, { resolve: (w: WalkRow) => void; reject: (e: Error) => void }>();
  private nextId = 0;
  private inlineSinceTurn = 0;
  /** Rows sent to the worker thread, for tests and logs. */
  offThread = 0;

  async check(row: RecordRow): Promise<WalkRow> {
    const length = rowBodyLength(row);
    if (length >= OFF_THREAD_LENGTH) return this.inWorker(row);
    this.inlineSinceTurn += length + ROW_OVERHEAD;
    if (this.inlineSinceTurn >= INLINE_SLICE) {
      this.inlineSinceTurn = 0;
      await turnOfTheLoop();
    }
    return checkVerifyRow(row);
  }

  async close(): Promise<void> {
    const worker = this.worker;
    this.worker = null;
    await worker?.terminate();
  }

  private inWorker(row: RecordRow): Promise<WalkRow> {
    this.offThread++;
    const worker = (this.worker ??= this.started());
    const id = this.nextId++;
    return new Promise<WalkRow>((resolve, reject) => {
      this.waiting.set(id, { resolve, reject });
      worker.postMessage({ id, row } satisfies RowCheckTask);
    });
  }

  private started(): Worker {
    const worker = startWorker();
    worker.on('message', (reply: RowCheckReply) => {
      const waiter = this.waiting.get(reply.id);
      this.waiting.delete(reply.id);
      if (reply.ok) waiter?.resolve(reply.walkRow);
      else waiter?.reject(new Error(`checking a row in the verification worker failed: ${reply.error}`));
    });
    const failAll = (error: Error) => {
      for (const waiter of this.waiting.values()) waiter.reject(error);
      this.waiting.clear();
      if (this.worker === worker) this.worker = null;
    };
    worker.on('error', failAll);
    worker.on('exit', (code) => failAll(new Error(`the verification worker stopped (exit code ${code})`)));
    return worker;
  }
}
