// A comparison mixing a probability mass with a density is refused, naming
// every candidate on each side; one measure alone (either) passes.
import t from 'tap';
import { measureMixIssue } from '../../../src/core/comparison/measure-mix.ts';

t.test('mass beside density: one issue naming both sides', async (t) => {
  const found = measureMixIssue([
    { name: 'logit', measure: 'mass' }, { name: 'line', measure: 'density' }, { name: 'counts', measure: 'mass' },
  ]);
  t.match(found, { code: 'measures_mixed', mass: ['logit', 'counts'], density: ['line'] });
  t.match(found!.message, /"logit".*"counts".*"line"/s);
});

t.test('one measure alone is not refused', async (t) => {
  t.equal(measureMixIssue([{ name: 'a', measure: 'mass' }, { name: 'b', measure: 'mass' }]), null);
  t.equal(measureMixIssue([{ name: 'a', measure: 'density' }]), null);
  t.equal(measureMixIssue([]), null);
});
