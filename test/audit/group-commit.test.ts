// The batching rule of group commit, on its own: each promise settles after
// the commit holding its record, and one refused record does not fail the
// records that shared its batch (they are retried one at a time).
import t from 'tap';
import { GroupCommit } from '../../src/audit/group-commit.ts';
import type { PreparedRecord } from '../../src/audit/rows.ts';
import type { StoredRecord } from '../../src/audit/store.ts';

const record = (label: string) => ({ label }) as unknown as PreparedRecord;

t.test('a batch with one refused record commits the others', async (t) => {
  const batches: string[][] = [];
  const commit = async (records: PreparedRecord[]) => {
    const labels = records.map((r) => (r as unknown as { label: string }).label);
    batches.push(labels);
    if (labels.includes('bad')) throw new Error('refused by the database');
    return labels.map((label) => ({ label }) as unknown as StoredRecord);
  };
  const group = new GroupCommit(commit, 64);
  const results = await Promise.allSettled(['a', 'b', 'bad', 'c'].map((l) => group.submit(record(l))));
  t.same(results.map((r) => r.status), ['fulfilled', 'fulfilled', 'rejected', 'fulfilled']);
  t.same(batches[0], ['a', 'b', 'bad', 'c'], 'first tried together');
  t.same(batches.slice(1), [['a'], ['b'], ['bad'], ['c']], 'then one at a time');
});
