// Invariances every comparison must have, checked over random data (fast-check).
// Each is an identity of least squares and of the criteria's definitions
// (common practice), not a fitted number.
import t from 'tap';
import fc from 'fast-check';
import { compareModels, type ComparisonInput } from '../../../src/core/compare.ts';
import type { ComparisonOutcome } from '../../../src/core/compare.ts';
import { DEFAULT_POLICY } from '../../../src/core/scoring/policy.ts';


/**
 * A small random data set with a numeric response, two numeric columns and a
 * factor. Values are measurement-like decimals (two decimals, a bounded range):
 * the invariances are about the criteria, not about subnormal or constant data,
 * which other tests cover.
 */
const decimal = (min: number, max: number) => fc.integer({ min: min * 100, max: max * 100 }).map((v) => v / 100);
const dataArb = fc.integer({ min: 12, max: 40 }).chain((n) =>
  fc.record({
    x1: fc.array(decimal(-50, 50), { minLength: n, maxLength: n }),
    x2: fc.array(decimal(0.5, 20), { minLength: n, maxLength: n }),
    g: fc.array(fc.constantFrom('a', 'b', 'c'), { minLength: n, maxLength: n }),
    noise: fc.array(decimal(-3, 3), { minLength: n, maxLength: n }),
    seed: fc.integer(),
  }),
).filter((d) => ['a', 'b', 'c'].every((l) => d.g.filter((g) => g === l).length >= 3) && new Set(d.x1).size > 6 && new Set(d.x2).size > 6 && new Set(d.noise).size > 6);

function inputOf(d: { x1: number[]; x2: number[]; g: string[]; noise: number[] }, scale = 1): ComparisonInput {
  const y = d.x1.map((x, i) => scale * (2 + 0.5 * x - 0.3 * d.x2[i] + (d.g[i] === 'b' ? 1 : 0) + d.noise[i]));
  return {
    columns: { y, x1: d.x1, x2: d.x2, g: d.g },
    response: 'y',
    weights: null,
    candidates: [
      { form: 'fit', name: 'one', terms: ['x1'], intercept: true },
      { form: 'fit', name: 'two', terms: ['x1', 'x2'], intercept: true },
      { form: 'fit', name: 'three', terms: ['x1', 'x2', 'g'], intercept: true },
      { form: 'fit', name: 'curved', terms: ['x1', { kind: 'power', of: 'x1', degree: 2 }, 'g'], intercept: true },
      { form: 'fit', name: 'log', terms: [{ kind: 'transform', of: 'x2', fn: 'log' }, 'g'], intercept: true },
    ],
    rankBy: 'aicc',
    confidenceLevel: 0.95,
    policy: DEFAULT_POLICY,
    policyHash: 'sha256:test',
  };
}

function outcome(input: ComparisonInput): ComparisonOutcome {
  const r = compareModels(input);
  if ('issues' in r) throw new Error(JSON.stringify(r.issues));
  return r.result;
}

const close = (a: number | null, b: number | null, rel = 1e-9) =>
  a === b || (a !== null && b !== null && Math.abs(a - b) <= rel * Math.max(1, Math.abs(a), Math.abs(b)));

const ALL = ['logLikelihood', 'aic', 'aicc', 'bic', 'hqc', 'rss', 'r2', 'adjustedR2', 'sigma'] as const;

function sameModels(a: ComparisonOutcome, b: ComparisonOutcome, keys: readonly (typeof ALL)[number][] = ALL) {
  for (const m of a.models) {
    const o = b.models.find((x) => x.name === m.name)!;
    for (const key of keys) {
      if (!close(m[key], o[key])) return `${m.name}.${key}: ${m[key]} vs ${o[key]}`;
    }
    for (let j = 0; j < m.coefficients.length; j++) {
      if (!close(m.coefficients[j].estimate, o.coefficients[j].estimate, 1e-8)) return `${m.name} coefficient ${j}`;
    }
  }
  return null;
}

t.test('permuting rows changes no number (only the fingerprint, since row order is part of the data)', async (t) => {
  fc.assert(
    fc.property(dataArb, fc.integer(), (d, seed) => {
      const n = d.x1.length;
      const order = Array.from({ length: n }, (_, i) => i);
      let s = seed >>> 0;
      for (let i = n - 1; i > 0; i--) {
        s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
        const j = s % (i + 1);
        [order[i], order[j]] = [order[j], order[i]];
      }
      const permuted = { x1: order.map((i) => d.x1[i]), x2: order.map((i) => d.x2[i]), g: order.map((i) => d.g[i]), noise: order.map((i) => d.noise[i]) };
      const problem = sameModels(outcome(inputOf(d)), outcome(inputOf(permuted)));
      if (problem) throw new Error(problem);
    }),
    { numRuns: 60 },
  );
  t.pass('60 random data sets');
});

t.test('permuting candidates changes no number, ranking or fingerprint', async (t) => {
  fc.assert(
    fc.property(dataArb, (d) => {
      const input = inputOf(d);
      const reversed = { ...input, candidates: [...input.candidates].reverse() };
      const a = outcome(input);
      const b = outcome(reversed);
      const problem = sameModels(a, b);
      if (problem) throw new Error(problem);
      if (a.dataset.fingerprint !== b.dataset.fingerprint) throw new Error('fingerprint moved');
      const names = (o: ComparisonOutcome) => o.rankings.aicc.map((e) => e.name).join(',');
      if (names(a) !== names(b)) throw new Error(`ranking moved: ${names(a)} vs ${names(b)}`);
    }),
    { numRuns: 60 },
  );
  t.pass('60 random data sets');
});

t.test('multiplying the response by c shifts every logLikelihood by -n ln|c| and leaves deltas and weights alone', async (t) => {
  // The Gaussian log-likelihood at the ML variance: RSS scales by c², so
  // -n/2 ln(RSS/n) moves by -n ln|c| (a change of units; common practice).
  fc.assert(
    fc.property(dataArb, fc.constantFrom(-1000, -2.5, 0.001, 3, 1e6), (d, c) => {
      const a = outcome(inputOf(d));
      const b = outcome(inputOf(d, c));
      const n = a.dataset.observations;
      for (const m of a.models) {
        const o = b.models.find((x) => x.name === m.name)!;
        if (!close(o.logLikelihood! - m.logLikelihood!, -n * Math.log(Math.abs(c)), 1e-9)) throw new Error(`${m.name} logL shift`);
      }
      for (const criterion of ['aicc', 'aic', 'bic', 'hqc'] as const) {
        for (const e of a.rankings[criterion]) {
          const o = b.rankings[criterion].find((x) => x.name === e.name)!;
          if (!close(e.delta, o.delta, 1e-7) || !close(e.weight, o.weight, 1e-7)) throw new Error(`${criterion} ${e.name} moved`);
        }
      }
    }),
    { numRuns: 60 },
  );
  t.pass('60 random data sets × scale factors');
});

t.test('weights of every weighted criterion sum to 1', async (t) => {
  fc.assert(
    fc.property(dataArb, (d) => {
      const a = outcome(inputOf(d));
      for (const criterion of ['aicc', 'aic', 'bic', 'hqc'] as const) {
        const sum = a.rankings[criterion].reduce((s, e) => s + (e.weight ?? 0), 0);
        if (Math.abs(sum - 1) > 1e-12) throw new Error(`${criterion} weights sum to ${sum}`);
      }
      if (a.rankings.adjustedR2.some((e) => e.weight !== null)) throw new Error('adjustedR2 has weights');
    }),
    { numRuns: 60 },
  );
  t.pass('60 random data sets');
});

t.test('equal weights give the unweighted answer (relative weights; common practice)', async (t) => {
  fc.assert(
    fc.property(dataArb, fc.double({ min: 0.01, max: 100, noNaN: true }), (d, w) => {
      const plain = inputOf(d);
      const weighted = { ...plain, columns: { ...plain.columns, w: d.x1.map(() => w) }, weights: 'w' };
      const a = outcome(plain);
      const b = outcome(weighted);
      // RSS is Σ w e², so it scales by w; sigma is the error scale at unit weight.
      const problem = sameModels(a, b, ALL.filter((k) => k !== 'rss' && k !== 'sigma'));
      if (problem) throw new Error(problem);
      for (const m of a.models) {
        const o = b.models.find((x) => x.name === m.name)!;
        if (!close(o.rss!, w * m.rss!) || !close(o.sigma!, Math.sqrt(w) * m.sigma!)) throw new Error(`${m.name} rss/sigma scaling`);
      }
    }),
    { numRuns: 40 },
  );
  t.pass('40 random data sets × weight levels');
});

t.test('adding a term never raises the RSS (nested least squares; common practice)', async (t) => {
  fc.assert(
    fc.property(dataArb, (d) => {
      const a = outcome(inputOf(d));
      const rss = (name: string) => a.models.find((m) => m.name === name)!.rss!;
      if (rss('two') > rss('one') * (1 + 1e-12)) throw new Error('two > one');
      if (rss('three') > rss('two') * (1 + 1e-12)) throw new Error('three > two');
    }),
    { numRuns: 60 },
  );
  t.pass('60 random data sets');
});
