// The search against a comparison of every subset (brute force by QR on the
// rows): best models, criteria, Akaike weights and importance to 1e-9.
// Data: NIST StRD Longley (public reference data, test/reference/nist) and
// the demo scenario's generator (scripts/demo-data.ts) as a realistic mix of
// numeric, factor, power and product terms.

import t from 'tap';
import { demoColumns } from '../../../scripts/demo-data.ts';
import { loadStrd } from '../../reference/nist/strd.ts';
import { searchSubsets, type SearchCriterion } from '../../../src/core/search/index.ts';
import type { Term } from '../../../src/core/types.ts';
import { bruteForce, problemFor, type SearchCase } from './brute-force.ts';

const close = (a: number, b: number, tol = 1e-9) => Math.abs(a - b) <= tol * Math.max(1, Math.abs(b));

function check(t: typeof import('tap').default, name: string, c: SearchCase, criterion: SearchCriterion, top: number) {
  t.test(`${name} by ${criterion}`, (t) => {
    const reference = bruteForce(c, criterion);
    const { problem } = problemFor(c);
    for (const method of ['exhaustive', 'branchAndBound'] as const) {
      const out = searchSubsets(problem, { criterion, top, rankDeficient: 'score' }, method);
      if (method === 'exhaustive') {
        t.equal(out.evaluated, reference.models.length, 'exhaustive: every admissible subset scored');
        t.ok(out.weightsCoverAllSubsets, 'weights over all subsets');
        const imp = out.importance.map((x) => x.weight);
        t.ok(imp.every((w, j) => close(w, reference.importance[j])), 'importance equals brute force');
      }
      const best = reference.models.slice(0, top);
      t.same(out.models.map((x) => x.terms), best.map((x) => x.terms), `${method}: same best ${top} subsets in the same order`);
      t.ok(out.models.every((x, i) => close(x.value, best[i].value)), `${method}: criteria equal to 1e-9`);
      t.ok(out.models.every((x, i) => x.parameters === best[i].parameters), `${method}: parameter counts equal`);
      t.ok(out.models.every((x, i) => close(x.rss, best[i].rss, 1e-9)), `${method}: RSS equal to 1e-9 relative`);
      if (method === 'exhaustive') t.ok(out.models.every((x, i) => close(x.weight, best[i].weight)), 'Akaike weights equal');
    }
    t.end();
  });
}

const longley = loadStrd('longley');
const longleyCase: SearchCase = {
  columns: longley.data,
  response: 'y',
  pool: longley.predictors,
  always: [],
  intercept: true,
  hierarchy: false,
};
for (const criterion of ['aic', 'aicc', 'bic', 'hqc'] as const) check(t, 'Longley, pool x1..x6', longleyCase, criterion, 10);

const demo = demoColumns();
const pool: Term[] = [
  'peakTemp',
  'holdMinutes',
  'moisture',
  { kind: 'factor', of: 'kiln' },
  { kind: 'power', of: 'peakTemp', degree: 2 },
  { kind: 'power', of: 'holdMinutes', degree: 2 },
  { kind: 'power', of: 'moisture', degree: 2 },
  { kind: 'product', of: ['peakTemp', 'holdMinutes'] },
  { kind: 'product', of: ['peakTemp', 'moisture'] },
  { kind: 'product', of: ['holdMinutes', 'moisture'] },
  { kind: 'product', of: ['peakTemp', 'kiln'] },
  { kind: 'product', of: ['moisture', 'kiln'] },
];
const demoCase: SearchCase = { columns: demo, response: 'shrinkage', pool, always: [], intercept: true, hierarchy: false };
check(t, 'demo, 12-term pool', demoCase, 'aicc', 20);
check(t, 'demo, 12-term pool, hierarchy', { ...demoCase, hierarchy: true }, 'bic', 20);
check(t, 'demo, 8-term pool, always moisture', { ...demoCase, pool: pool.filter((_, j) => j !== 2 && j < 10 && j !== 6 && j !== 9), always: ['moisture'] }, 'aic', 15);
check(t, 'demo, no intercept, 6-term pool', { ...demoCase, intercept: false, pool: pool.slice(0, 6) }, 'hqc', 10);
