// The work of one request in the pool: the pieces it runs (one job, or a
// search's prepare, kernel tasks and report), its deadline and its
// cancellation. The deadline counts the time during which at least one of
// its pieces is running on a worker, not time spent waiting in the queue, so
// a request that runs past it would run as long again on an idle service.
// When it fails — deadline, cancellation — every piece still waiting is
// dropped and every piece running has its worker terminated (the pool starts
// a fresh one in its place).
import { ComputeCancelled, ComputeDeadlineExceeded } from './errors.ts';

export interface Piece {
  readonly id: number;
  readonly job: unknown;
  readonly session: ComputeSession;
  readonly resolve: (done: { value: unknown; worker: number }) => void;
  readonly reject: (error: Error) => void;
  /** Set while the piece runs on a worker. */
  running: boolean;
}

/** What a session needs from its pool. */
export interface PieceRunner {
  enqueue(piece: Piece): void;
  /** Takes a piece out of the queue, or stops the worker running it. */
  withdraw(piece: Piece): void;
  release(session: ComputeSession): void;
}

let nextPieceId = 1;

export class ComputeSession {
  private running = 0;
  private usedMs = 0;
  private since = 0;
  private timer: NodeJS.Timeout | null = null;
  private failure: Error | null = null;
  private closed = false;
  private readonly pieces = new Set<Piece>();
  private readonly workers = new Set<number>();
  readonly openedAt = performance.now();

  constructor(private readonly runner: PieceRunner, readonly deadlineMs: number) {}

  /** Runs one job on a worker of the pool; rejects with the session's failure once it has one. */
  async run<T>(job: unknown): Promise<T> {
    return (await this.runOn<T>(job)).value;
  }

  /** As run(), and says which worker (0-based slot) ran it. */
  runOn<T>(job: unknown): Promise<{ value: T; worker: number }> {
    if (this.failure) return Promise.reject(this.failure);
    if (this.closed) return Promise.reject(new ComputeCancelled());
    return new Promise((resolve, reject) => {
      const piece: Piece = {
        id: nextPieceId++,
        job,
        session: this,
        running: false,
        resolve: (done) => {
          this.pieces.delete(piece);
          this.workers.add(done.worker);
          resolve(done as { value: T; worker: number });
        },
        reject: (error) => {
          this.pieces.delete(piece);
          reject(error);
        },
      };
      this.pieces.add(piece);
      this.runner.enqueue(piece);
    });
  }

  /** Stops everything this session still runs or waits for; pending runs reject with ComputeCancelled. */
  cancel(): void {
    this.fail(new ComputeCancelled());
  }

  /** The session is done: its place in the pool is given back (pieces still pending are cancelled). */
  close(): void {
    if (this.closed) return;
    if (this.pieces.size > 0) this.cancel();
    this.closed = true;
    this.stopClock();
    this.runner.release(this);
  }

  /** Time during which at least one of its pieces ran. */
  get computeMs(): number {
    return this.usedMs + (this.running > 0 ? performance.now() - this.since : 0);
  }

  /** Distinct workers its pieces ran on. */
  get workersUsed(): number {
    return this.workers.size;
  }

  get failed(): Error | null {
    return this.failure;
  }

  /** Called by the pool as a piece starts and ends on a worker. */
  pieceStarted(): void {
    if (this.running++ > 0) return;
    this.since = performance.now();
    const left = Math.max(0, this.deadlineMs - this.usedMs);
    this.timer = setTimeout(() => this.fail(new ComputeDeadlineExceeded(this.deadlineMs)), left);
  }

  pieceEnded(): void {
    if (this.running === 0) return; // the clock already stopped: the session failed or closed
    if (--this.running > 0) return;
    this.usedMs += performance.now() - this.since;
    this.clearTimer();
  }

  private stopClock(): void {
    if (this.running > 0) this.usedMs += performance.now() - this.since;
    this.running = 0;
    this.clearTimer();
  }

  private clearTimer(): void {
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
  }

  private fail(error: Error): void {
    if (this.failure || this.closed) return;
    this.failure = error;
    for (const piece of [...this.pieces]) {
      this.runner.withdraw(piece);
      piece.reject(error);
    }
    this.stopClock();
  }
}
