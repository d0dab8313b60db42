// The warm-up runs the worked examples of the OpenAPI document (the demo
// scenario) through the same jobs a request runs, on the main thread and on a
// worker, and must complete: a failure would only be logged in production.
import t from 'tap';
import { warmUpMainThread, warmUpWorker } from '../../src/http/warm-up.ts';

t.test('the main thread\'s warm-up runs the example comparison to the end', async (t) => {
  t.doesNotThrow(() => warmUpMainThread());
});

t.test('a worker\'s warm-up runs the example comparison and the whole example search', async (t) => {
  await t.resolves(warmUpWorker());
});
