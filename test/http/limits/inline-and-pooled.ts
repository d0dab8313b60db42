// One request computed on the main thread (priced within COMPUTE_INLINE_WORK)
// and on a worker of the pool: both answers, the pooled app to replay on.
import type { Test } from 'tap';
import { buildTestApp } from '../../helper.ts';

export async function inlineAndPooled(t: Test, payload: object) {
  const inline = await buildTestApp(t, { computeInlineWork: 1e12 });
  const pooled = await buildTestApp(t, { computeInlineWork: 0 });
  const a = await inline.app.inject({ method: 'POST', url: '/v1/comparisons', payload });
  const b = await pooled.app.inject({ method: 'POST', url: '/v1/comparisons', payload });
  t.equal(a.statusCode, 200, a.body.slice(0, 200));
  t.equal(b.statusCode, 200, b.body.slice(0, 200));
  const strip = (r: Record<string, unknown>) => ({ ...r, id: undefined, createdAt: undefined });
  t.same(strip(b.json()), strip(a.json()), 'the same answer');
  return { a, b, pooled };
}
