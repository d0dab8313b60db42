// A recorded comparison or search and the means to replay it, shared by the
// replay tests of both kinds: post the body, read its record back, replay by
// id, and count the audit chain (a replay must not lengthen it).
import type { Test } from 'tap';
import { buildTestApp } from '../helper.ts';

/** headers: sent with the (empty) replay request. */
export async function recordedForReplay(t: Test, kind: 'comparisons' | 'searches', payload: Record<string, unknown>, headers: Record<string, string> = {}) {
  const { app, store } = await buildTestApp(t);
  const post = await app.inject({ method: 'POST', url: `/v1/${kind}`, payload });
  t.equal(post.statusCode, 200, post.body.slice(0, 300));
  const record = (await store.get(post.json().id))!;
  const replay = async (id: string) => app.inject({ method: 'POST', url: `/v1/${kind}/${id}/replay`, headers });
  const chainLength = async () => (await app.inject({ method: 'GET', url: '/v1/audit/verify' })).json().records;
  return { app, store, record, replay, chainLength };
}
