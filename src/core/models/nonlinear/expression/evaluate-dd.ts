// The model's values in double-double (about 32 digits), row by row: used at
// the end of a fit, where the residuals y - f are small and a double
// evaluation of f would leave them only a few correct digits (NIST Lanczos1:
// residuals near 1e-13 on values near 1, double rounding of f near 1e-16).
// The same role as the linear engine's double-double residuals in its
// iterative refinement. Slower than the double evaluator by one or two
// orders, and called a handful of times per fit.
import { applyDD, powIntDD, type Tape } from './tape.ts';

export function valuesDD(
  tape: Tape,
  columns: readonly Float64Array[],
  rows: number,
  b: ArrayLike<number>,
  fh: Float64Array,
  fl: Float64Array,
): void {
  const count = tape.ops.length;
  const hi = new Float64Array(count);
  const lo = new Float64Array(count);
  // Constants and parameter-only entries once; row-dependent entries per row.
  const perRow: number[] = [];
  tape.ops.forEach((op, k) => {
    if (tape.rows[k]) perRow.push(k);
    else evaluateEntry(tape, k, hi, lo, columns, 0, b);
  });
  for (let i = 0; i < rows; i++) {
    for (const k of perRow) evaluateEntry(tape, k, hi, lo, columns, i, b);
    fh[i] = hi[tape.output];
    fl[i] = lo[tape.output];
  }
}

function evaluateEntry(
  tape: Tape, k: number, hi: Float64Array, lo: Float64Array,
  columns: readonly Float64Array[], row: number, b: ArrayLike<number>,
): void {
  const op = tape.ops[k];
  let value: [number, number];
  switch (op.code) {
    case 'const': value = [op.hi, op.lo]; break;
    case 'param': value = [b[op.index], 0]; break;
    case 'column': value = [columns[op.index][row], 0]; break;
    case 'powi': value = powIntDD([hi[op.a], lo[op.a]], op.n); break;
    case 'add': case 'sub': case 'mul': case 'div': case 'pow':
      value = applyDD(op.code, [hi[op.a], lo[op.a]], [hi[op.b], lo[op.b]]);
      break;
    default:
      value = applyDD(op.code, [hi[op.a], lo[op.a]]);
  }
  hi[k] = value[0];
  lo[k] = value[1];
}
