// A comparison computed on the main thread (priced within COMPUTE_INLINE_WORK)
// and the same comparison computed on a worker of the pool give the same
// answer to the last digit: one pure function, two places to run it. The demo
// request (scripts/demo-data.ts), with predictions so a body with numeric and
// text columns crosses to the worker and back.
import t from 'tap';
import { inlineAndPooled } from './inline-and-pooled.ts';
import { demoComparison } from '../../../scripts/demo-data.ts';

t.test('inline and pooled comparisons agree exactly, and so do their replays', async (t) => {
  const payload = { ...demoComparison(), options: { predict: { columns: { peakTemp: [1190, 1230], moisture: [5.5, 6.5], kiln: ['east', 'west'], holdMinutes: [30, 45] } } } };
  const { b, pooled } = await inlineAndPooled(t, payload);
  t.ok(b.json().models[0].predictions.length === 2, 'predictions made on the worker');
  const replay = await pooled.app.inject({ method: 'POST', url: `/v1/comparisons/${b.json().id}/replay` });
  t.equal(replay.statusCode, 200);
  t.equal(replay.json().identical, true, 'a replay in the pool reproduces the stored result');
});
