// The model's values in double-double (about 32 digits): used at the end of a
// fit, where the residuals y - f are small and a double evaluation of f would
// leave them only a few correct digits (NIST Lanczos1: residuals near 1e-13 on
// values near 1, double rounding of f near 1e-16) — the role the linear
// engine's double-double residuals play in its iterative refinement.
// Organised like the double evaluator: data-only entries once per fit,
// constants and parameter-only entries once per parameter vector, the rest in
// blocks of rows on typed arrays.
import { BLOCK_ROWS } from './evaluate.ts';
import { binaryValuesDD, powIntValuesDD, unaryValuesDD, type OperandDD } from './kernels-dd.ts';
import type { Tape } from './tape.ts';

/** Where an entry's values live: one for all rows, per row for the fit, per row of the current block. */
type Held = 'scalar' | 'data' | 'block';

export class TapeEvaluatorDD {
  private readonly held: Held[];
  private readonly hi: Float64Array[];
  private readonly lo: Float64Array[];

  constructor(private readonly tape: Tape, columns: readonly Float64Array[], private readonly rows: number) {
    this.held = tape.ops.map((_, k) => (tape.rows[k] ? (tape.params[k] ? 'block' : 'data') : 'scalar'));
    this.hi = tape.ops.map((op, k) => {
      if (this.held[k] === 'scalar') return new Float64Array(1);
      if (this.held[k] === 'block') return new Float64Array(BLOCK_ROWS);
      return op.code === 'column' ? columns[op.index] : new Float64Array(rows);
    });
    // Columns are exact doubles: their low parts are 0 (one shared array of zeros).
    const zeros = new Float64Array(rows);
    this.lo = tape.ops.map((op, k) => {
      if (this.held[k] === 'scalar') return new Float64Array(1);
      if (this.held[k] === 'block') return new Float64Array(BLOCK_ROWS);
      return op.code === 'column' ? zeros : new Float64Array(rows);
    });
    tape.ops.forEach((op, k) => {
      if (op.code === 'const') {
        this.hi[k][0] = op.hi;
        this.lo[k][0] = op.lo;
      } else if (this.held[k] === 'data' && op.code !== 'column') {
        this.apply(k, 0, rows);
      }
    });
  }

  private operand(k: number, start: number): OperandDD {
    switch (this.held[k]) {
      case 'scalar': return { v: this.hi[k], w: this.lo[k], o: 0, s: 0 };
      case 'data': return { v: this.hi[k], w: this.lo[k], o: start, s: 1 };
      case 'block': return { v: this.hi[k], w: this.lo[k], o: 0, s: 1 };
    }
  }

  /** Entry k for m rows from `start`, into its own storage (from row 0 of it for block and scalar entries). */
  private apply(k: number, start: number, m: number): void {
    const op = this.tape.ops[k];
    const oh = this.hi[k];
    const ol = this.lo[k];
    switch (op.code) {
      case 'const': case 'param': case 'column':
        return;
      case 'powi':
        powIntValuesDD(oh, ol, m, this.operand(op.a, start), op.n);
        return;
      case 'add': case 'sub': case 'mul': case 'div': case 'pow':
        binaryValuesDD(op.code, oh, ol, m, this.operand(op.a, start), this.operand(op.b, start));
        return;
      default:
        unaryValuesDD(op.code, oh, ol, m, this.operand(op.a, start));
    }
  }

  /** Model values at b as fh + fl. */
  values(b: ArrayLike<number>, fh: Float64Array, fl: Float64Array): void {
    const { ops, params } = this.tape;
    for (let k = 0; k < ops.length; k++) {
      if (this.held[k] !== 'scalar' || !params[k]) continue;
      const op = ops[k];
      if (op.code === 'param') {
        this.hi[k][0] = b[op.index];
        this.lo[k][0] = 0;
      } else {
        this.apply(k, 0, 1);
      }
    }
    const out = this.tape.output;
    for (let start = 0; start < this.rows; start += BLOCK_ROWS) {
      const m = Math.min(BLOCK_ROWS, this.rows - start);
      for (let k = 0; k < ops.length; k++) if (this.held[k] === 'block') this.apply(k, start, m);
      const { v, w, o, s } = this.operand(out, start);
      for (let i = 0; i < m; i++) {
        fh[start + i] = v[o + i * s];
        fl[start + i] = w[o + i * s];
      }
    }
  }
}

/** One-off evaluation (tests and small uses): compiles the data entries and evaluates once. */
export function valuesDD(
  tape: Tape, columns: readonly Float64Array[], rows: number, b: ArrayLike<number>, fh: Float64Array, fl: Float64Array,
): void {
  new TapeEvaluatorDD(tape, columns, rows).values(b, fh, fl);
}
