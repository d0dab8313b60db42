// One process-wide pool of worker threads, started with the service and kept,
// with a bounded queue. Requests enter as sessions (session.ts): at most
// `size` run and `queueLength` more wait; beyond that open() refuses at once
// (ComputeBusy) rather than let memory and waiting grow without bound.
// Pieces of work are dispatched first come, first served to whichever worker
// is free. A worker whose piece is withdrawn (deadline, cancellation) is
// terminated — that stops even a tight loop — and a fresh one takes its slot;
// so does a worker that died or ran out of heap.
import { EventEmitter } from 'node:events';
import { Worker } from 'node:worker_threads';
import { ComputeBusy, ComputeFailed, ComputeOutOfMemory } from './errors.ts';
import { ComputeSession, type Piece, type PieceRunner } from './session.ts';
import type { WorkerReply } from './worker-loop.ts';

export interface ComputePoolOptions {
  /** Worker threads. */
  size: number;
  /** Requests that may wait for a worker beyond those running. */
  queueLength: number;
  /** Compute time one request may use before it is stopped. */
  deadlineMs: number;
  /** The module each worker runs (it calls serveJobs); .ts from sources, .js when built. */
  workerModule: URL;
  /** Old-generation heap of each worker (resourceLimits); past it the worker dies, not the process. */
  heapLimitMb?: number;
  /** Sent to each worker as workerData.warmUp: run the worked examples once before saying it is ready. */
  warmUp?: boolean;
}

export interface PoolStats {
  workers: number;
  ready: number;
  busy: number;
  /** Pieces waiting for a worker. */
  waiting: number;
  /** Requests admitted and not yet finished. */
  sessions: number;
  /** Workers started to replace one that was stopped or died. */
  replaced: number;
  /** Workers that ran the worked examples before saying they were ready (COMPUTE_WARM_UP). */
  warmedUp: number;
}

interface Slot {
  readonly index: number;
  worker: Worker | null;
  ready: boolean;
  piece: Piece | null;
  failedStarts: number;
}

const ENTRY = new URL('./worker-entry.mjs', import.meta.url);
/** A worker that fails to start is retried after this, doubling up to a minute. */
const RESTART_DELAY_MS = 500;

export class ComputePool extends EventEmitter implements PieceRunner {
  private readonly slots: Slot[];
  private readonly waiting: Piece[] = [];
  private readonly sessions = new Set<ComputeSession>();
  private started = false;
  private closed = false;
  private replaced = 0;
  /** Some worker has said it is ready since start(). */
  private servedOnce = false;
  private warmedUp = 0;
  /** Smoothed wall time of a request in the pool, for Retry-After. */
  private typicalSeconds = 1;

  constructor(readonly options: ComputePoolOptions) {
    super();
    this.slots = Array.from({ length: Math.max(1, options.size) }, (_, index) => ({ index, worker: null, ready: false, piece: null, failedStarts: 0 }));
  }

  get size(): number {
    return this.slots.length;
  }

  /** Starts every worker now (the service does this at start, so the first request finds them warm). */
  start(): void {
    if (this.started || this.closed) return;
    this.started = true;
    for (const slot of this.slots) this.spawn(slot);
  }

  /**
   * Started and no worker ready yet (still loading its modules and, with
   * warm-up, running the worked examples): work sent now would wait for it.
   * A pool never started starts on its first request and is not "starting".
   */
  starting(): boolean {
    return this.started && !this.closed && !this.servedOnce;
  }

  /** Admits one request, or refuses with ComputeBusy when every worker is taken and the queue is full. */
  open(): ComputeSession {
    if (this.closed || this.sessions.size >= this.slots.length + this.options.queueLength) {
      throw new ComputeBusy(this.options.queueLength, this.retryAfterSeconds());
    }
    this.start();
    const session = new ComputeSession(this, this.options.deadlineMs);
    this.sessions.add(session);
    return session;
  }

  /** A worker is up, free and nothing waits for it: a piece enqueued now starts at once. */
  hasIdleWorker(): boolean {
    if (this.closed || this.waiting.length > 0 || this.sessions.size >= this.slots.length) return false;
    return this.slots.some((s) => s.ready && s.piece === null && s.worker !== null);
  }

  stats(): PoolStats {
    return {
      workers: this.slots.length,
      ready: this.slots.filter((s) => s.ready).length,
      busy: this.slots.filter((s) => s.piece !== null).length,
      waiting: this.waiting.length,
      sessions: this.sessions.size,
      replaced: this.replaced,
      warmedUp: this.warmedUp,
    };
  }

  async close(): Promise<void> {
    if (this.closed) return;
    this.closed = true;
    for (const session of [...this.sessions]) session.cancel();
    await Promise.all(this.slots.map((slot) => {
      const worker = slot.worker;
      slot.worker = null;
      slot.ready = false;
      return worker?.terminate();
    }));
  }

  enqueue(piece: Piece): void {
    if (this.closed) {
      piece.reject(new ComputeFailed('the compute pool is closed'));
      return;
    }
    this.waiting.push(piece);
    this.dispatch();
  }

  withdraw(piece: Piece): void {
    const at = this.waiting.indexOf(piece);
    if (at >= 0) {
      this.waiting.splice(at, 1);
      return;
    }
    const slot = this.slots.find((s) => s.piece === piece);
    if (!slot) return;
    // Terminate the worker mid-job (this stops a tight loop too) and start a fresh one in its place.
    const worker = slot.worker;
    slot.worker = null;
    slot.ready = false;
    slot.piece = null;
    void worker?.terminate();
    this.replaced++;
    this.emit('replaced', { slot: slot.index, reason: 'stopped' });
    this.spawn(slot);
  }

  release(session: ComputeSession): void {
    if (!this.sessions.delete(session)) return;
    this.typicalSeconds = 0.8 * this.typicalSeconds + 0.2 * ((performance.now() - session.openedAt) / 1000);
  }

  /** Seconds a refused caller might wait: the typical request time for each request ahead, spread over the workers. */
  private retryAfterSeconds(): number {
    const ahead = this.sessions.size - this.slots.length + 1;
    return Math.min(60, Math.max(1, Math.ceil((this.typicalSeconds * Math.max(1, ahead)) / this.slots.length)));
  }

  private dispatch(): void {
    for (const slot of this.slots) {
      if (this.waiting.length === 0) return;
      if (!slot.ready || slot.piece || !slot.worker) continue;
      const piece = this.waiting.shift()!;
      slot.piece = piece;
      piece.running = true;
      piece.session.pieceStarted();
      slot.worker.ref();
      slot.worker.postMessage({ id: piece.id, job: piece.job });
    }
  }

  private spawn(slot: Slot): void {
    if (this.closed) return;
    const heap = this.options.heapLimitMb;
    const worker = new Worker(ENTRY, {
      workerData: { module: this.options.workerModule.href, warmUp: this.options.warmUp ?? false },
      // The entry installs what the worker needs itself. Inherited preloads (node --import …) would run
      // in the worker before any loader, and a TypeScript one fails there.
      execArgv: [],
      resourceLimits: heap ? { maxOldGenerationSizeMb: heap } : undefined,
    });
    // An idle worker must not keep the process alive; one running a piece does.
    worker.unref();
    slot.worker = worker;
    slot.ready = false;
    worker.on('message', (reply: WorkerReply) => {
      if (slot.worker !== worker) return;
      if ('ready' in reply) {
        slot.ready = true;
        slot.failedStarts = 0;
        this.servedOnce = true;
        if (reply.warmUp === 'done') this.warmedUp++;
        else if (reply.warmUp !== 'off') this.emit('warm-up-failed', { slot: slot.index, error: reply.warmUp.failed });
        this.dispatch();
        return;
      }
      const piece = slot.piece;
      slot.piece = null;
      worker.unref();
      if (piece && piece.id === reply.id) {
        piece.running = false;
        piece.session.pieceEnded();
        if (reply.ok) piece.resolve({ value: reply.value, worker: slot.index });
        else piece.reject(new ComputeFailed(reply.error));
      }
      this.dispatch();
    });
    const lost = (error: Error & { code?: string }) => {
      if (slot.worker !== worker) return;
      const wasReady = slot.ready;
      slot.worker = null;
      slot.ready = false;
      const piece = slot.piece;
      slot.piece = null;
      if (piece) {
        piece.running = false;
        piece.session.pieceEnded();
        piece.reject(error.code === 'ERR_WORKER_OUT_OF_MEMORY'
          ? new ComputeOutOfMemory(heap ?? 0)
          : new ComputeFailed(`a compute worker stopped: ${error.message}`));
      }
      this.replaced++;
      this.emit('replaced', { slot: slot.index, reason: error.message });
      if (wasReady) {
        this.spawn(slot);
        return;
      }
      // It never came up: retry later, and fail the waiting work if no worker can start at all.
      slot.failedStarts++;
      this.emit('start-failed', { slot: slot.index, error });
      if (this.slots.every((s) => !s.ready && s.failedStarts > 0)) {
        for (const waiting of this.waiting.splice(0)) waiting.reject(new ComputeFailed(`compute workers cannot start: ${error.message}`));
      }
      const delay = Math.min(60_000, RESTART_DELAY_MS * 2 ** (slot.failedStarts - 1));
      setTimeout(() => this.spawn(slot), delay).unref();
    };
    worker.on('error', lost);
    worker.on('exit', (code) => lost(Object.assign(new Error(`exit code ${code}`), { code: 'EXIT' })));
  }
}
