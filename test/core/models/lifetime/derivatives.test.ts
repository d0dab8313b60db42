// The analytic first and second derivatives of every contribution (exact,
// right, left, interval; three location-scale laws and the gamma) against
// central differences: first derivatives of the value, second derivatives of
// the analytic first derivatives (so the Hessian is the gradient's
// Jacobian). Points include both tails, where the stable forms matter.
// Five-point central differences with h = 1e-3 have truncation error O(h⁴)
// (~1e-12 here) and rounding error about ε|ℓ|/h; the narrow interval's ℓ is
// itself a difference of distribution functions accurate to ~1e-11, so its
// differences carry ~1e-8. 1e-6 relative (with an absolute floor) is a safe margin.
import t from 'tap';
import { EXACT, RIGHT, LEFT, INTERVAL } from '../../../../src/core/models/lifetime/index.ts';
import { locationScaleLogLikelihood, rowDerivatives } from '../../../../src/core/models/lifetime/location-scale-likelihood.ts';
import { gammaLogLikelihood } from '../../../../src/core/models/lifetime/gamma-likelihood.ts';
import { logisticLaw, normalLaw, smallestExtremeValueLaw } from '../../../../src/core/models/lifetime/standard-families.ts';
import type { Bounds } from '../../../../src/core/models/lifetime/bounds.ts';

type Kernel = (bounds: Bounds, mu: Float64Array, s: number, out: ReturnType<typeof rowDerivatives> | null) => number;

const laws = { smallestExtremeValue: smallestExtremeValueLaw, normal: normalLaw, logistic: logisticLaw };
const kernels: Record<string, Kernel> = {
  ...Object.fromEntries(Object.entries(laws).map(([name, law]) => [name, (b: Bounds, mu: Float64Array, s: number, out: any) => locationScaleLogLikelihood(law, b, mu, s, out)])),
  gamma: gammaLogLikelihood,
};

function one(kind: number, lo: number, hi: number): Bounds {
  return { kind: Uint8Array.of(kind), lo: Float64Array.of(lo), hi: Float64Array.of(hi) };
}

function analytic(kernel: Kernel, b: Bounds, mu: number, s: number) {
  const out = rowDerivatives(1);
  const value = kernel(b, Float64Array.of(mu), s, out);
  return { value, gMu: out.gMu[0], gS: out.gS[0], hMuMu: out.hMuMu[0], hMuS: out.hMuS[0], hSS: out.hSS[0] };
}

function close(a: number, b: number, floor: number): boolean {
  return Math.abs(a - b) <= 1e-6 * Math.max(Math.abs(a), Math.abs(b)) + floor;
}

const cases: { label: string; b: Bounds }[] = [
  { label: 'exact', b: one(EXACT, 0.3, 0.3) },
  { label: 'exact, upper tail', b: one(EXACT, 3.5, 3.5) },
  { label: 'exact, lower tail', b: one(EXACT, -4, -4) },
  { label: 'right', b: one(RIGHT, 0.4, Infinity) },
  { label: 'right, far upper tail', b: one(RIGHT, 4.2, Infinity) },
  { label: 'right, lower tail', b: one(RIGHT, -3, Infinity) },
  { label: 'left', b: one(LEFT, -Infinity, -0.2) },
  { label: 'left, far lower tail', b: one(LEFT, -Infinity, -5) },
  { label: 'left, upper tail', b: one(LEFT, -Infinity, 3) },
  { label: 'interval', b: one(INTERVAL, -0.5, 0.8) },
  { label: 'interval, both in the upper tail', b: one(INTERVAL, 2.8, 3.4) },
  { label: 'interval, both in the lower tail', b: one(INTERVAL, -4.5, -3.9) },
  { label: 'interval, narrow', b: one(INTERVAL, 0.1, 0.1001) },
];

for (const [name, kernel] of Object.entries(kernels)) {
  t.test(`${name}: analytic derivatives equal central differences`, async (t) => {
    // Location and log scale (log shape for the gamma) at two settings.
    for (const [mu, s] of [[0.1, -0.2], [-0.4, 0.3]]) {
      for (const { label, b } of cases) {
        const a = analytic(kernel, b, mu, s);
        const h = 1e-3;
        type Field = 'value' | 'gMu' | 'gS';
        // Five-point stencil of a field along μ (dμ = 1) or s (dμ = 0).
        const slope = (field: Field, alongMu: boolean) => {
          const at = (k: number) => analytic(kernel, b, mu + (alongMu ? k * h : 0), s + (alongMu ? 0 : k * h))[field];
          return (-at(2) + 8 * at(1) - 8 * at(-1) + at(-2)) / (12 * h);
        };
        const where = `${label} at μ=${mu}, s=${s}`;
        t.ok(Number.isFinite(a.value), `${where}: finite value ${a.value}`);
        const floor = 1e-7;
        const check = (got: number, want: number, what: string) => t.ok(close(got, want, floor), `${where}: ${what} ${got} vs ${want}`);
        check(a.gMu, slope('value', true), 'ℓ_μ');
        check(a.gS, slope('value', false), 'ℓ_s');
        check(a.hMuMu, slope('gMu', true), 'ℓ_μμ');
        check(a.hMuS, slope('gMu', false), 'ℓ_μs');
        check(a.hMuS, slope('gS', true), 'ℓ_sμ');
        check(a.hSS, slope('gS', false), 'ℓ_ss');
      }
    }
  });
}

t.test('contributions stay finite far in the tails (no underflow to -∞)', async (t) => {
  for (const [name, kernel] of Object.entries(kernels)) {
    const far = name === 'gamma' ? 6 : 60;
    for (const b of [one(RIGHT, far, Infinity), one(LEFT, -Infinity, -far), one(INTERVAL, far, far + 0.5), one(INTERVAL, -far - 0.5, -far)]) {
      const a = analytic(kernel, b, 0, 0);
      t.ok(Number.isFinite(a.value) && [a.gMu, a.gS, a.hMuMu, a.hMuS, a.hSS].every(Number.isFinite), `${name}: kind ${b.kind[0]} at ${b.lo[0]}..${b.hi[0]} gives ${a.value}`);
    }
  }
});
