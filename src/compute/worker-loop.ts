// The inside of a compute worker: it says it is ready once its modules have
// loaded, then runs each job it is sent, one at a time, and replies with the
// value or the error. The jobs are pure functions of their messages, so the
// same functions also run on the main thread when a request is small.
import { readlinkSync } from 'node:fs';
import { setPriority } from 'node:os';
import { parentPort } from 'node:worker_threads';

/**
 * Niceness of a compute worker's thread. With as many workers as cores, busy
 * workers would take every core from the main thread, which answers every
 * other caller; on Linux niceness is per thread, so the workers step back
 * (weight 110 against the main thread's 1024 under the fair scheduler) and
 * the main thread runs as soon as it has something to do. Elsewhere, or if
 * refused, the worker runs at normal priority.
 */
const WORKER_NICENESS = 10;

function stepBack(): void {
  try {
    // /proc/thread-self -> "<pid>/task/<tid>": the thread's own id, which setpriority(2) accepts on Linux.
    const tid = Number(readlinkSync('/proc/thread-self').split('/').pop());
    if (Number.isInteger(tid) && tid > 0) setPriority(tid, WORKER_NICENESS);
  } catch {
    // Not Linux, or not allowed: normal priority.
  }
}

/** How a worker's warm-up went: not asked for, ran the examples, or failed with this message. */
export type WarmUpOutcome = 'off' | 'done' | { failed: string };

export type WorkerReply = { ready: true; warmUp: WarmUpOutcome } | { id: number; ok: true; value: unknown } | { id: number; ok: false; error: string };

export function serveJobs(run: (job: unknown) => unknown, warmUp: WarmUpOutcome = 'off'): void {
  const port = parentPort;
  if (!port) throw new Error('serveJobs runs inside a worker thread');
  stepBack();
  port.on('message', (message: { id: number; job: unknown }) => {
    let reply: WorkerReply;
    try {
      reply = { id: message.id, ok: true, value: run(message.job) };
    } catch (e) {
      reply = { id: message.id, ok: false, error: e instanceof Error ? `${e.name}: ${e.message}` : String(e) };
    }
    port.postMessage(reply);
  });
  port.postMessage({ ready: true, warmUp } satisfies WorkerReply);
}
