// A worker thread of the search pool: runs tasks as they come and replies
// with each partial result. Errors are replied, never thrown across.

import { parentPort } from 'node:worker_threads';
import type { SearchReply, SearchTask } from './messages.ts';
import { runTask } from './run-task.ts';

parentPort?.on('message', (task: SearchTask) => {
  let reply: SearchReply;
  try {
    reply = { id: task.id, ok: true, partial: runTask(task) };
  } catch (e) {
    reply = { id: task.id, ok: false, error: e instanceof Error ? e.message : String(e) };
  }
  parentPort?.postMessage(reply);
});
