// The compute pool's contract, by behaviour: admission up to the workers plus
// the queue and a refusal beyond; a deadline that stops a tight loop by
// terminating its worker (and a fresh worker takes its place); cancellation
// that drops waiting work; the deadline counting only time spent running;
// a worker out of heap or a failing job costing the pool nothing. No test
// here asserts a duration: only what happened.
import t, { type Test } from 'tap';
import { ComputeBusy, ComputeCancelled, ComputeDeadlineExceeded, ComputeFailed, ComputeOutOfMemory, ComputePool } from '../../src/compute/index.ts';

const WORKER = new URL('./test-jobs-worker.ts', import.meta.url);

function pool(t: Test, options: Partial<ConstructorParameters<typeof ComputePool>[0]> = {}): ComputePool {
  const p = new ComputePool({ size: 1, queueLength: 1, deadlineMs: 60_000, workerModule: WORKER, ...options });
  t.teardown(() => p.close());
  return p;
}

/** Resolves once the pool's workers are up (the first job waits for one anyway). */
async function warm(p: ComputePool): Promise<void> {
  const s = p.open();
  await s.run({ kind: 'echo', value: 1 });
  s.close();
}

t.test('a job runs on a worker and comes back by structured clone', async (t) => {
  const p = pool(t);
  const s = p.open();
  t.same(await s.run({ kind: 'echo', value: { a: [1, 2, 3], b: new Float64Array([0.5]) } }), { a: [1, 2, 3], b: new Float64Array([0.5]) });
  t.equal(s.workersUsed, 1);
  s.close();
  t.equal(p.stats().sessions, 0, 'closing gives the place back');
});

t.test('admission: workers plus queue length, then ComputeBusy with a Retry-After', async (t) => {
  const p = pool(t, { size: 1, queueLength: 1 });
  const first = p.open();
  const second = p.open();
  const refused = (() => {
    try {
      p.open();
      return null;
    } catch (e) {
      return e;
    }
  })();
  t.ok(refused instanceof ComputeBusy, 'a third request is refused at once');
  t.equal((refused as ComputeBusy).queueLength, 1);
  t.ok((refused as ComputeBusy).retryAfterSeconds >= 1);
  first.close();
  const third = p.open();
  t.ok(third, 'a place freed is a place taken');
  second.close();
  third.close();
});

t.test('the deadline stops a tight loop: its worker is terminated and replaced, and the pool goes on', async (t) => {
  const p = pool(t, { deadlineMs: 300 });
  await warm(p);
  const s = p.open();
  const failure = await s.run({ kind: 'spin', ms: 120_000 }).catch((e) => e);
  t.ok(failure instanceof ComputeDeadlineExceeded, 'refused as past the deadline');
  t.equal((failure as ComputeDeadlineExceeded).deadlineMs, 300);
  t.equal(p.stats().replaced, 1, 'the worker was replaced');
  t.ok(s.computeMs >= 300, 'the session ran for its deadline');
  await t.rejects(s.run({ kind: 'echo', value: 2 }), ComputeDeadlineExceeded, 'a failed session takes no more work');
  s.close();
  const next = p.open();
  t.equal(await next.run({ kind: 'echo', value: 'after' }), 'after', 'a fresh worker serves the next request');
  next.close();
});

t.test('cancel drops waiting work and stops running work', async (t) => {
  const p = pool(t, { size: 1, queueLength: 2 });
  await warm(p);
  const busy = p.open();
  const waiting = p.open();
  const running = busy.run({ kind: 'spin', ms: 120_000 }).catch((e) => e);
  const queued = waiting.run({ kind: 'echo', value: 'never' }).catch((e) => e);
  t.equal(p.stats().waiting, 1, 'the second request waits behind the first');
  waiting.cancel();
  t.ok((await queued) instanceof ComputeCancelled, 'waiting work is dropped');
  t.equal(p.stats().waiting, 0);
  busy.cancel();
  t.ok((await running) instanceof ComputeCancelled, 'running work is stopped');
  t.equal(p.stats().replaced, 1);
  busy.close();
  waiting.close();
});

t.test('the deadline counts time running, not time waiting in the queue', async (t) => {
  const p = pool(t, { size: 1, queueLength: 1, deadlineMs: 1500 });
  await warm(p);
  const first = p.open();
  const second = p.open();
  // The first request runs for well under its deadline, while the second waits the whole time.
  const ahead = first.run({ kind: 'spin', ms: 1000 });
  const behind = second.run({ kind: 'spin', ms: 300 });
  t.type(await ahead, 'number');
  t.type(await behind, 'number', 'the request that waited was not charged for its wait');
  t.ok(second.computeMs < 1500);
  first.close();
  second.close();
});

t.test('a job that throws is a ComputeFailed; the worker serves on', async (t) => {
  const p = pool(t);
  const s = p.open();
  const failure = await s.run<unknown>({ kind: 'throw' }).catch((e: Error) => e);
  t.ok(failure instanceof ComputeFailed);
  t.match((failure as Error).message, /fails on purpose/);
  t.equal(await s.run({ kind: 'echo', value: 3 }), 3);
  t.equal(p.stats().replaced, 0, 'no worker was lost');
  s.close();
});

t.test('a worker that runs out of heap dies alone: ComputeOutOfMemory, a fresh worker, the process lives', async (t) => {
  const p = pool(t, { heapLimitMb: 64 });
  const s = p.open();
  const failure = await s.run({ kind: 'hog' }).catch((e) => e);
  t.ok(failure instanceof ComputeOutOfMemory, String(failure));
  t.equal((failure as ComputeOutOfMemory).heapLimitMb, 64);
  t.equal(await s.run({ kind: 'echo', value: 'alive' }), 'alive');
  s.close();
});

t.test('a search fans its tasks out over every worker of one pool', async (t) => {
  const p = pool(t, { size: 2, queueLength: 0 });
  const s = p.open();
  const results = await Promise.all(Array.from({ length: 6 }, () => s.runOn({ kind: 'spin', ms: 200 })));
  t.equal(results.length, 6);
  t.equal(s.workersUsed, 2, 'both workers took pieces of one request');
  s.close();
});

t.test('workers that cannot start fail the waiting work rather than leave it waiting', async (t) => {
  const p = pool(t, { workerModule: new URL('./no-such-worker.ts', import.meta.url) });
  const s = p.open();
  const failure = await s.run({ kind: 'echo', value: 1 }).catch((e: Error) => e);
  t.ok(failure instanceof ComputeFailed);
  t.match((failure as Error).message, /compute workers cannot start/);
  s.close();
});
