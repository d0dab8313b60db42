// The inside of a compute worker: it says it is ready once its modules have
// loaded, then runs each job it is sent, one at a time, and replies with the
// value or the error. The jobs are pure functions of their messages, so the
// same functions also run on the main thread when a request is small.
import { parentPort } from 'node:worker_threads';

export type WorkerReply = { ready: true } | { id: number; ok: true; value: unknown } | { id: number; ok: false; error: string };

export function serveJobs(run: (job: unknown) => unknown): void {
  const port = parentPort;
  if (!port) throw new Error('serveJobs runs inside a worker thread');
  port.on('message', (message: { id: number; job: unknown }) => {
    let reply: WorkerReply;
    try {
      reply = { id: message.id, ok: true, value: run(message.job) };
    } catch (e) {
      reply = { id: message.id, ok: false, error: e instanceof Error ? `${e.name}: ${e.message}` : String(e) };
    }
    port.postMessage(reply);
  });
  port.postMessage({ ready: true } satisfies WorkerReply);
}
