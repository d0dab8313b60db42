// A worker thread of the verification walk: checks one row per message and
// replies with what it found. Errors are replied, never thrown across.
import { parentPort } from 'node:worker_threads';
import type { WalkRow } from './chain.ts';
import type { RecordRow } from './rows.ts';
import { checkVerifyRow } from './verify-row.ts';

export interface RowCheckTask {
  id: number;
  row: RecordRow;
}

export type RowCheckReply = { id: number; ok: true; walkRow: WalkRow } | { id: number; ok: false; error: string };

parentPort?.on('message', (task: RowCheckTask) => {
  let reply: RowCheckReply;
  try {
    reply = { id: task.id, ok: true, walkRow: checkVerifyRow(task.row) };
  } catch (e) {
    reply = { id: task.id, ok: false, error: e instanceof Error ? e.message : String(e) };
  }
  parentPort?.postMessage(reply);
});
