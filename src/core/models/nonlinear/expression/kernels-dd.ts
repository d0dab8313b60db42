// Double-double arithmetic of one tape entry over a run of rows, on typed
// arrays: value i is hi[i] + lo[i]. The four operations write into one
// scratch cell (numeric/dd-cell.ts), because a fit evaluates them for every
// row and entry and a pair per operation would spend most of that time
// allocating. Elementary functions call the scalar double-double functions
// row by row.
import { addTo, divTo, mulTo, newCell } from '../../../numeric/dd-cell.ts';
import { applyDD, powIntDD, type BinaryCode, type UnaryCode } from './tape.ts';

/** An operand: value i is v[o + i s] + w[o + i s] (stride 0 for a shared value). */
export interface OperandDD {
  v: Float64Array;
  w: Float64Array;
  o: number;
  s: number;
}

const cell = newCell();

export function binaryValuesDD(
  code: BinaryCode, oh: Float64Array, ol: Float64Array, m: number, a: OperandDD, b: OperandDD,
): void {
  const { v: ah, w: al, o: ao, s: as } = a;
  const { v: bh, w: bl, o: bo, s: bs } = b;
  const c = cell;
  if (code === 'pow') {
    for (let i = 0; i < m; i++) {
      const [h, l] = applyDD('pow', [ah[ao + i * as], al[ao + i * as]], [bh[bo + i * bs], bl[bo + i * bs]]);
      oh[i] = h;
      ol[i] = l;
    }
    return;
  }
  const operation = code === 'mul' ? mulTo : code === 'div' ? divTo : addTo;
  const sign = code === 'sub' ? -1 : 1;
  for (let i = 0; i < m; i++) {
    operation(c, ah[ao + i * as], al[ao + i * as], sign * bh[bo + i * bs], sign * bl[bo + i * bs]);
    oh[i] = c.h;
    ol[i] = c.l;
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
  const c = cell;
  for (let i = 0; i < m; i++) {
    const x = v[o + i * s];
    const y = w[o + i * s];
    mulTo(c, x, y, x, y);
    oh[i] = c.h;
    ol[i] = c.l;
  }
}
