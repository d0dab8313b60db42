import t from 'tap';
import { averageModels } from '../../../src/core/averaging/index.ts';
import { compareModels } from '../../../src/core/compare.ts';
import { DEFAULT_POLICY } from '../../../src/core/scoring/policy.ts';

const close = (a: number | null, b: number, tol = 1e-12) => a !== null && Math.abs(a - b) <= tol * Math.max(1, Math.abs(b));

// Worked by hand (Burnham & Anderson 2002 definitions): three models with
// weights 0.5, 0.3, 0.2; term x is in models 1 (b = 2, se = 0.5) and
// 2 (b = 3, se = 1), absent from model 3.
//   importance = 0.5 + 0.3 = 0.8
//   full average: bbar = 0.5*2 + 0.3*3 + 0.2*0 = 1.9
//     eq. 6.12: 0.5(0.25 + 0.01) + 0.3(1 + 1.21) + 0.2(0 + 3.61) = 1.515, se = sqrt(1.515)
//     eq. 4.9:  0.5 sqrt(0.26) + 0.3 sqrt(2.21) + 0.2 sqrt(3.61)
//   over models with x: weights 0.625, 0.375; bbar = 1.25 + 1.125 = 2.375
//     eq. 6.12: 0.625(0.25 + 0.140625) + 0.375(1 + 0.390625) = 0.765625, se = 0.875
//     eq. 4.9:  0.625 sqrt(0.390625) + 0.375 sqrt(1.390625) = 0.625*0.625 + 0.375*1.179248...
// The intercept is in all three (4, 5, 6 with se 1, 1, 2):
//   bbar = 2 + 1.5 + 1.2 = 4.7; eq. 6.12: 0.5(1 + 0.49) + 0.3(1 + 0.09) + 0.2(4 + 1.69) = 0.745 + 0.327 + 1.138 = 2.21
const models = [
  { name: 'm1', weight: 0.5, coefficients: [{ term: 'intercept', estimate: 4, standardError: 1 }, { term: 'x', estimate: 2, standardError: 0.5 }] },
  { name: 'm2', weight: 0.3, coefficients: [{ term: 'intercept', estimate: 5, standardError: 1 }, { term: 'x', estimate: 3, standardError: 1 }] },
  { name: 'm3', weight: 0.2, coefficients: [{ term: 'intercept', estimate: 6, standardError: 2 }, { term: 'x', estimate: null, standardError: null }] },
];

t.test('averaged estimates and unconditional standard errors match the hand computation', async (t) => {
  const avg = averageModels(models, 'eq6.12');
  const x = avg.terms.find((r) => r.term === 'x')!;
  t.ok(close(x.importance, 0.8));
  t.ok(close(x.estimate, 1.9));
  t.ok(close(x.unconditionalStandardError, Math.sqrt(1.515)));
  t.ok(close(x.overModelsWithTerm.estimate, 2.375));
  t.ok(close(x.overModelsWithTerm.unconditionalStandardError, 0.875));
  const b0 = avg.terms.find((r) => r.term === 'intercept')!;
  t.ok(close(b0.importance, 1));
  t.ok(close(b0.estimate, 4.7));
  t.ok(close(b0.unconditionalStandardError, Math.sqrt(2.21)));
  t.match(avg.estimatorDescription, /6\.12/);

  const first = averageModels(models, 'eq4.9').terms.find((r) => r.term === 'x')!;
  t.ok(close(first.unconditionalStandardError, 0.5 * Math.sqrt(0.26) + 0.3 * Math.sqrt(2.21) + 0.2 * Math.sqrt(3.61)));
  t.ok(close(first.overModelsWithTerm.unconditionalStandardError, 0.625 * 0.625 + 0.375 * Math.sqrt(1.390625)));
});

t.test('weights are renormalised over the models passed in', async (t) => {
  const scaled = models.map((m) => ({ ...m, weight: m.weight * 7 }));
  const a = averageModels(models).terms;
  const b = averageModels(scaled).terms;
  a.forEach((r, k) => {
    t.ok(close(b[k].estimate, r.estimate));
    t.ok(close(b[k].unconditionalStandardError, r.unconditionalStandardError!));
    t.ok(close(b[k].importance, r.importance));
  });
});

t.test('averaging needs finite non-negative weights with a positive sum', async (t) => {
  t.same(averageModels([{ ...models[0], weight: 0 }]).issues.map((i) => i.code), ['averaging-weights-invalid']);
});

t.test('a model without a standard error makes the unconditional one null, not wrong', async (t) => {
  const avg = averageModels([models[0], { ...models[1], coefficients: [{ term: 'x', estimate: 3, standardError: null }] }]);
  const x = avg.terms.find((r) => r.term === 'x')!;
  t.ok(close(x.estimate, (0.5 * 2 + 0.3 * 3) / 0.8));
  t.equal(x.unconditionalStandardError, null);
});

t.test('coefficients are pooled by column identity: one label coded two ways is two terms', async (t) => {
  // kiln=west against east and against north are different quantities
  // (west − east and west − north). By the definitions above, each is in one
  // model of weight 0.5: importance 0.5, full average 0.5 b, conditional b.
  const avg = averageModels([
    { name: 'refEast', weight: 0.5, coefficients: [
      { term: 'intercept', key: 'i', estimate: 1, standardError: 0.1 },
      { term: 'kiln=west', key: 'west-east', qualifier: 'reference east', estimate: 2, standardError: 0.2 },
    ] },
    { name: 'refNorth', weight: 0.5, coefficients: [
      { term: 'intercept', key: 'i', estimate: 3, standardError: 0.1 },
      { term: 'kiln=west', key: 'west-north', qualifier: 'reference north', estimate: 0.5, standardError: 0.2 },
    ] },
  ]);
  t.same(avg.terms.map((r) => r.term), ['intercept', 'kiln=west (reference east)', 'kiln=west (reference north)']);
  const east = avg.terms[1], north = avg.terms[2];
  t.ok(close(east.importance, 0.5) && close(north.importance, 0.5));
  t.ok(close(east.estimate, 1) && close(east.overModelsWithTerm.estimate, 2));
  t.ok(close(north.estimate, 0.25) && close(north.overModelsWithTerm.estimate, 0.5));
  t.ok(close(avg.terms[0].estimate, 2));
  t.same(avg.issues.map((i) => i.code), ['averaging-term-coded-differently']);
  t.match(avg.issues[0].message, /"refEast": kiln=west \(reference east\)/);
});

t.test('end to end: differently referenced factors are averaged per coding, with notes', async (t) => {
  const x = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12];
  const noise = [0.3, -0.2, 0.1, 0.4, -0.5, 0.2, -0.1, 0, 0.3, -0.4, 0.2, -0.1];
  const kiln = x.map((v) => ['east', 'north', 'west'][v % 3]);
  const y = x.map((v, i) => 1 + 0.5 * v + (kiln[i] === 'west' ? 2 : kiln[i] === 'north' ? 1 : 0) + noise[i]);
  const r = compareModels({
    columns: { y, x, kiln }, response: 'y', weights: null, policy: DEFAULT_POLICY, policyHash: 'h',
    candidates: [
      { form: 'fit', name: 'refEast', terms: ['x', { kind: 'factor', of: 'kiln', reference: 'east' }], intercept: true },
      { form: 'fit', name: 'refNorth', terms: ['x', { kind: 'factor', of: 'kiln', reference: 'north' }], intercept: true },
    ],
  });
  if ('issues' in r) throw new Error(JSON.stringify(r.issues));
  const { models, averaged } = r.result;
  const coef = (m: number, term: string) => models[m].coefficients.find((c) => c.term === term)!.estimate!;
  // Treatment coding identity (common practice): (west − east) − (north − east) = west − north.
  t.ok(close(coef(0, 'kiln=west') - coef(0, 'kiln=north'), coef(1, 'kiln=west'), 1e-9));
  const terms = averaged!.terms.map((a) => a.term);
  t.ok(terms.includes('kiln=west (reference east)') && terms.includes('kiln=west (reference north)'));
  t.notOk(terms.includes('kiln=west'));
  // The two models are one fit, so their weights are equal: each coding is
  // averaged at half its one model's estimate.
  const east = averaged!.terms.find((a) => a.term === 'kiln=west (reference east)')!;
  t.ok(close(east.importance, 0.5, 1e-9) && close(east.estimate, 0.5 * coef(0, 'kiln=west'), 1e-9));
  t.ok(averaged!.notes.some((n) => /"kiln" is coded against "east" in "refEast"; against "north" in "refNorth"/.test(n)));
});
