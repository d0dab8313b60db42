// The compute pool's refusals as problems. The pool full is a 503 with
// Retry-After: nothing is wrong with the request, the service is busy now.
// Past the deadline is a 422: the clock counts only the time the request's
// own work ran (not its wait in the queue), so the same request would run as
// long again — asking for less is the remedy, retrying is not. A worker that
// ran out of heap is a 422 for the same reason.
import { ComputeBusy, ComputeDeadlineExceeded, ComputeOutOfMemory } from '../../compute/index.ts';
import { refusal, refusalTypes, type Refusal } from '../plugins/refusal.ts';

export function computeRefusal(error: unknown): Refusal | null {
  if (error instanceof ComputeBusy) {
    return refusal(503, refusalTypes.computeBusy, 'Compute queue full',
      `every compute worker is busy and ${error.queueLength} requests are already waiting (COMPUTE_QUEUE_LENGTH=${error.queueLength}); retry after ${error.retryAfterSeconds} s`,
      { limit: error.queueLength, setting: 'COMPUTE_QUEUE_LENGTH', retryAfterSeconds: error.retryAfterSeconds },
      { 'retry-after': String(error.retryAfterSeconds) });
  }
  if (error instanceof ComputeDeadlineExceeded) {
    return refusal(422, refusalTypes.computeDeadline, 'Compute deadline exceeded',
      `the computation ran for more than ${error.deadlineMs} ms (COMPUTE_DEADLINE_MS) and was stopped; nothing was recorded. Time waiting in the queue does not count, so the same request would take as long again: send a data summary, fewer rows, terms, candidates or prediction rows, or a narrower search pool`,
      { limit: error.deadlineMs, setting: 'COMPUTE_DEADLINE_MS' });
  }
  if (error instanceof ComputeOutOfMemory) {
    return refusal(422, refusalTypes.computeMemory, 'Compute worker out of memory',
      `the computation needed more than the ${error.heapLimitMb} MiB heap of a compute worker (derived from MAX_REQUEST_MEMORY_BYTES) and was stopped; nothing was recorded. Send a data summary, fewer rows, terms or candidates`,
      { limit: error.heapLimitMb * 2 ** 20, setting: 'MAX_REQUEST_MEMORY_BYTES' });
  }
  return null;
}
