// Why a piece of work did not come back with its value. The HTTP layer turns
// each into its problem (src/http/compute/refusals.ts); nothing here picks words
// for callers beyond the facts.

/** Every worker is busy and the queue is full: come back later. */
export class ComputeBusy extends Error {
  constructor(readonly queueLength: number, readonly retryAfterSeconds: number) {
    super(`the compute queue is full (${queueLength} requests waiting)`);
    this.name = 'ComputeBusy';
  }
}

/** The work ran past the deadline and was stopped (its worker terminated and replaced). */
export class ComputeDeadlineExceeded extends Error {
  constructor(readonly deadlineMs: number) {
    super(`the computation ran past its deadline of ${deadlineMs} ms and was stopped`);
    this.name = 'ComputeDeadlineExceeded';
  }
}

/** The caller no longer wants the answer (its client went away); the work was stopped. */
export class ComputeCancelled extends Error {
  constructor() {
    super('the computation was cancelled');
    this.name = 'ComputeCancelled';
  }
}

/** A worker ran out of its heap (resourceLimits) while running the work; it was replaced. */
export class ComputeOutOfMemory extends Error {
  constructor(readonly heapLimitMb: number) {
    super(`a compute worker ran out of its ${heapLimitMb} MiB heap`);
    this.name = 'ComputeOutOfMemory';
  }
}

/** The job threw inside the worker, or the worker died: a fault of the service, not of the request. */
export class ComputeFailed extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ComputeFailed';
  }
}
