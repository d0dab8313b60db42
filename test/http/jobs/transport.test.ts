// A job's body crosses to a worker with its numeric columns packed into
// Float64Arrays; on the worker's side it must be exactly the body that was
// validated: numbers (-0 and subnormals included), missing values, text
// columns, prediction rows — after a real structured clone.
import { deserialize, serialize } from 'node:v8';
import t from 'tap';
import { forWorker, fromMain } from '../../../src/http/jobs/transport.ts';

const body = {
  data: {
    columns: {
      thickness: [30.25, -0, 5e-324, 1.7976931348623157e308, null, 12],
      lot: ['L1', null, 'L2', 'L1', 'L3', 'L2'],
      empty: [null, null, null, null, null, null],
    },
  },
  response: 'thickness',
  candidates: [{ name: 'lots', terms: ['lot'] }],
  options: { predict: { columns: { lot: ['L2'], thickness: [null] } } },
  label: 'coating line',
};

t.test('a body packed for a worker unpacks to the body as validated', async (t) => {
  const job = { kind: 'comparison', body, policy: { name: 'p' } };
  const message = forWorker(job) as { body: { data: { columns: Record<string, unknown> } } };
  t.type(message.body.data.columns.thickness, 'object');
  t.notOk(Array.isArray(message.body.data.columns.thickness), 'the numeric column travels packed');
  t.ok(Array.isArray(message.body.data.columns.lot), 'a text column travels as it is');
  const arrived = fromMain(deserialize(serialize(message))) as typeof job;
  t.same(arrived, job);
  t.ok(Object.is(arrived.body.data.columns.thickness[1], -0), '-0 stays -0');
  t.equal((forWorker(job) as { body: unknown }).body, (forWorker({ ...job, kind: 'other' }) as { body: unknown }).body, 'a body is packed once for every job that carries it');
});

t.test('a job without a body passes through', async (t) => {
  const task = { kind: 'searchTask', task: { id: 3 } };
  t.equal(forWorker(task), task);
  t.equal(fromMain(task), task);
});
