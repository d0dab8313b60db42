// Double-double arithmetic of one tape entry over a run of rows, on typed
// arrays: value i is hi[i] + lo[i]. The four operations are written out
// inline (the algorithms of double-double.ts: Knuth's two-sum, Dekker's split
// product, the QD library's accurate add and a two-digit division), because a
// fit evaluates them for every row and entry and a tuple per operation would
// spend most of that time allocating. Elementary functions call the scalar
// double-double functions row by row.
import { applyDD, powIntDD, type BinaryCode, type UnaryCode } from './tape.ts';

const SPLITTER = 134217729; // 2^27 + 1

/** An operand: value i is v[o + i s] + w[o + i s] (stride 0 for a shared value). */
export interface OperandDD {
  v: Float64Array;
  w: Float64Array;
  o: number;
  s: number;
}

export function binaryValuesDD(
  code: BinaryCode, oh: Float64Array, ol: Float64Array, m: number, a: OperandDD, b: OperandDD,
): void {
  const { v: ah, w: al, o: ao, s: as } = a;
  const { v: bh, w: bl, o: bo, s: bs } = b;
  switch (code) {
    case 'add':
    case 'sub': {
      const sign = code === 'add' ? 1 : -1;
      for (let i = 0; i < m; i++) {
        const x = ah[ao + i * as];
        const y = sign * bh[bo + i * bs];
        const s = x + y;
        const sb = s - x;
        const e = x - (s - sb) + (y - sb);
        const u = al[ao + i * as];
        const v = sign * bl[bo + i * bs];
        const t = u + v;
        const tb = t - u;
        const f = u - (t - tb) + (v - tb);
        const e1 = e + t;
        const h1 = s + e1;
        const l1 = e1 - (h1 - s) + f;
        const h2 = h1 + l1;
        ol[i] = l1 - (h2 - h1);
        oh[i] = h2;
      }
      return;
    }
    case 'mul':
      for (let i = 0; i < m; i++) {
        const x = ah[ao + i * as];
        const y = bh[bo + i * bs];
        const p = x * y;
        let t = SPLITTER * x;
        const x1 = t - (t - x);
        const x2 = x - x1;
        t = SPLITTER * y;
        const y1 = t - (t - y);
        const y2 = y - y1;
        const e = x1 * y1 - p + x1 * y2 + x2 * y1 + x2 * y2 + (x * bl[bo + i * bs] + al[ao + i * as] * y);
        const h = p + e;
        ol[i] = e - (h - p);
        oh[i] = h;
      }
      return;
    case 'div':
      for (let i = 0; i < m; i++) {
        const xh = ah[ao + i * as];
        const xl = al[ao + i * as];
        const yh = bh[bo + i * bs];
        const yl = bl[bo + i * bs];
        const q1 = xh / yh;
        // r = x - q1 y, with q1 yh exact by Dekker's product.
        const p = q1 * yh;
        let t = SPLITTER * q1;
        const q11 = t - (t - q1);
        const q12 = q1 - q11;
        t = SPLITTER * yh;
        const y1 = t - (t - yh);
        const y2 = yh - y1;
        const pe = q11 * y1 - p + q11 * y2 + q12 * y1 + q12 * y2;
        const r = xh - p - pe + xl - q1 * yl;
        const q2 = r / yh;
        const h = q1 + q2;
        ol[i] = q2 - (h - q1);
        oh[i] = h;
      }
      return;
    case 'pow':
      for (let i = 0; i < m; i++) {
        const [h, l] = applyDD('pow', [ah[ao + i * as], al[ao + i * as]], [bh[bo + i * bs], bl[bo + i * bs]]);
        oh[i] = h;
        ol[i] = l;
      }
      return;
  }
}

export function unaryValuesDD(code: UnaryCode, oh: Float64Array, ol: Float64Array, m: number, a: OperandDD): void {
  const { v, w, o, s } = a;
  if (code === 'neg') {
    for (let i = 0; i < m; i++) {
      oh[i] = -v[o + i * s];
      ol[i] = -w[o + i * s];
    }
    return;
  }
  for (let i = 0; i < m; i++) {
    const [h, l] = applyDD(code, [v[o + i * s], w[o + i * s]]);
    oh[i] = h;
    ol[i] = l;
  }
}

export function powIntValuesDD(oh: Float64Array, ol: Float64Array, m: number, a: OperandDD, n: number): void {
  const { v, w, o, s } = a;
  if (n !== 2) {
    for (let i = 0; i < m; i++) {
      const [h, l] = powIntDD([v[o + i * s], w[o + i * s]], n);
      oh[i] = h;
      ol[i] = l;
    }
    return;
  }
  for (let i = 0; i < m; i++) {
    const x = v[o + i * s];
    const p = x * x;
    const t = SPLITTER * x;
    const x1 = t - (t - x);
    const x2 = x - x1;
    const e = x1 * x1 - p + 2 * x1 * x2 + x2 * x2 + 2 * x * w[o + i * s];
    const h = p + e;
    ol[i] = e - (h - p);
    oh[i] = h;
  }
}
