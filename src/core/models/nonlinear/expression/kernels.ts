// The arithmetic of one tape entry over a run of rows, in double precision.
// An operand is (array, offset, stride): stride 0 for a value shared by every
// row (a constant or a parameter-only entry), 1 for a value per row. Loops
// sit inside the switch, so each runs one operation over typed arrays.
import type { BinaryCode, UnaryCode } from './tape.ts';

export interface Operand {
  v: Float64Array;
  o: number;
  s: number;
}

/** x^n for an integer n by binary powering: the same rounding on every platform, unlike Math.pow. */
export function powInt(x: number, n: number): number {
  let k = n < 0 ? -n : n;
  let r = 1;
  let b = x;
  while (k > 0) {
    if (k & 1) r *= b;
    k >>>= 1;
    if (k > 0) b *= b;
  }
  return n < 0 ? 1 / r : r;
}

export function unaryValues(code: UnaryCode, out: Float64Array, m: number, a: Operand): void {
  const { v, o, s } = a;
  switch (code) {
    case 'neg': for (let i = 0; i < m; i++) out[i] = -v[o + i * s]; return;
    case 'exp': for (let i = 0; i < m; i++) out[i] = Math.exp(v[o + i * s]); return;
    case 'log': for (let i = 0; i < m; i++) out[i] = Math.log(v[o + i * s]); return;
    case 'log10': for (let i = 0; i < m; i++) out[i] = Math.log10(v[o + i * s]); return;
    case 'sqrt': for (let i = 0; i < m; i++) out[i] = Math.sqrt(v[o + i * s]); return;
    case 'abs': for (let i = 0; i < m; i++) out[i] = Math.abs(v[o + i * s]); return;
    case 'sin': for (let i = 0; i < m; i++) out[i] = Math.sin(v[o + i * s]); return;
    case 'cos': for (let i = 0; i < m; i++) out[i] = Math.cos(v[o + i * s]); return;
    case 'tan': for (let i = 0; i < m; i++) out[i] = Math.tan(v[o + i * s]); return;
    case 'atan': for (let i = 0; i < m; i++) out[i] = Math.atan(v[o + i * s]); return;
  }
}

export function binaryValues(code: BinaryCode, out: Float64Array, m: number, a: Operand, b: Operand): void {
  const { v: av, o: ao, s: as } = a;
  const { v: bv, o: bo, s: bs } = b;
  switch (code) {
    case 'add': for (let i = 0; i < m; i++) out[i] = av[ao + i * as] + bv[bo + i * bs]; return;
    case 'sub': for (let i = 0; i < m; i++) out[i] = av[ao + i * as] - bv[bo + i * bs]; return;
    case 'mul': for (let i = 0; i < m; i++) out[i] = av[ao + i * as] * bv[bo + i * bs]; return;
    case 'div': for (let i = 0; i < m; i++) out[i] = av[ao + i * as] / bv[bo + i * bs]; return;
    case 'pow': for (let i = 0; i < m; i++) out[i] = Math.pow(av[ao + i * as], bv[bo + i * bs]); return;
  }
}

export function powIntValues(out: Float64Array, m: number, a: Operand, n: number): void {
  const { v, o, s } = a;
  if (n === 2) {
    for (let i = 0; i < m; i++) {
      const x = v[o + i * s];
      out[i] = x * x;
    }
    return;
  }
  for (let i = 0; i < m; i++) out[i] = powInt(v[o + i * s], n);
}

/**
 * adj += g * d(code(a))/da for a unary entry whose value is `y`.
 * The derivatives are exact formulas (no differencing): d sqrt(a) = 1/(2 sqrt a),
 * d |a| = sign(a) (0 at 0), d tan(a) = 1 + tan(a)^2, d atan(a) = 1/(1 + a^2).
 */
export function unaryAdjoint(code: UnaryCode, adj: Float64Array, g: Float64Array, m: number, a: Operand, y: Operand): void {
  const { v, o, s } = a;
  const { v: yv, o: yo, s: ys } = y;
  switch (code) {
    case 'neg': for (let i = 0; i < m; i++) adj[i] -= g[i]; return;
    case 'exp': for (let i = 0; i < m; i++) adj[i] += g[i] * yv[yo + i * ys]; return;
    case 'log': for (let i = 0; i < m; i++) adj[i] += g[i] / v[o + i * s]; return;
    case 'log10': for (let i = 0; i < m; i++) adj[i] += (g[i] * Math.LOG10E) / v[o + i * s]; return;
    case 'sqrt': for (let i = 0; i < m; i++) adj[i] += (0.5 * g[i]) / yv[yo + i * ys]; return;
    case 'abs': for (let i = 0; i < m; i++) adj[i] += g[i] * Math.sign(v[o + i * s]); return;
    case 'sin': for (let i = 0; i < m; i++) adj[i] += g[i] * Math.cos(v[o + i * s]); return;
    case 'cos': for (let i = 0; i < m; i++) adj[i] -= g[i] * Math.sin(v[o + i * s]); return;
    case 'tan': for (let i = 0; i < m; i++) {
      const t = yv[yo + i * ys];
      adj[i] += g[i] * (1 + t * t);
    } return;
    case 'atan': for (let i = 0; i < m; i++) {
      const x = v[o + i * s];
      adj[i] += g[i] / (1 + x * x);
    } return;
  }
}

/** adj += g * d(a^n)/da = g n a^(n-1). */
export function powIntAdjoint(adj: Float64Array, g: Float64Array, m: number, a: Operand, n: number): void {
  const { v, o, s } = a;
  if (n === 2) {
    for (let i = 0; i < m; i++) adj[i] += 2 * g[i] * v[o + i * s];
    return;
  }
  for (let i = 0; i < m; i++) adj[i] += g[i] * n * powInt(v[o + i * s], n - 1);
}

/**
 * adj += g * d(a op b)/d(side) for side 'a' (left operand) or 'b' (right).
 * Powers: d a^b/da = b a^(b-1); d a^b/db = a^b ln a, taken as 0 at a = 0
 * where a^b = 0 (its limit from the right for b > 0).
 */
export function binaryAdjoint(
  code: BinaryCode, side: 'a' | 'b', adj: Float64Array, g: Float64Array, m: number,
  a: Operand, b: Operand, y: Operand,
): void {
  const { v: av, o: ao, s: as } = a;
  const { v: bv, o: bo, s: bs } = b;
  const { v: yv, o: yo, s: ys } = y;
  const left = side === 'a';
  switch (code) {
    case 'add':
      for (let i = 0; i < m; i++) adj[i] += g[i];
      return;
    case 'sub':
      if (left) for (let i = 0; i < m; i++) adj[i] += g[i];
      else for (let i = 0; i < m; i++) adj[i] -= g[i];
      return;
    case 'mul':
      if (left) for (let i = 0; i < m; i++) adj[i] += g[i] * bv[bo + i * bs];
      else for (let i = 0; i < m; i++) adj[i] += g[i] * av[ao + i * as];
      return;
    case 'div':
      if (left) for (let i = 0; i < m; i++) adj[i] += g[i] / bv[bo + i * bs];
      else for (let i = 0; i < m; i++) adj[i] -= (g[i] * yv[yo + i * ys]) / bv[bo + i * bs];
      return;
    case 'pow':
      if (left) {
        for (let i = 0; i < m; i++) {
          const e = bv[bo + i * bs];
          adj[i] += g[i] * e * Math.pow(av[ao + i * as], e - 1);
        }
      } else {
        for (let i = 0; i < m; i++) {
          const x = av[ao + i * as];
          const p = yv[yo + i * ys];
          adj[i] += x === 0 && p === 0 ? 0 : g[i] * p * Math.log(x);
        }
      }
      return;
  }
}
