// The process-wide compute pool: sessions, deadline, cancellation.
export { ComputePool, type ComputePoolOptions, type PoolStats } from './pool.ts';
export { ComputeSession } from './session.ts';
export { ComputeBusy, ComputeCancelled, ComputeDeadlineExceeded, ComputeFailed, ComputeOutOfMemory } from './errors.ts';
export { serveJobs } from './worker-loop.ts';
