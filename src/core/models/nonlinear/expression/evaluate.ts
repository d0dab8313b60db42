// The model's values and its exact Jacobian over the rows, in double
// precision, by reverse-mode automatic differentiation of the tape: one
// forward sweep for the values, one backward sweep that carries d f_i / d
// entry for every row at once, so all p partial derivatives cost about twice
// one evaluation whatever p is (forward mode would cost p evaluations).
// Rows are processed in blocks of BLOCK_ROWS so the per-entry buffers stay in
// cache and the memory is independent of the number of rows; data-only
// entries are computed once for all rows when the evaluator is made.
import { binaryAdjoint, binaryValues, powIntAdjoint, powIntValues, unaryAdjoint, unaryValues, type Operand } from './kernels.ts';
import type { Tape } from './tape.ts';

export const BLOCK_ROWS = 256;

/** How an entry's values are held (plain numbers: tap's loader strips types only). */
const Storage = {
  /** One value for every row: a constant or a parameter-only entry. */
  Scalar: 0,
  /** One value per row, fixed for the fit: a data-only entry. */
  Data: 1,
  /** One value per row of the current block: depends on rows and parameters. */
  Block: 2,
} as const;
type Storage = (typeof Storage)[keyof typeof Storage];

export class TapeEvaluator {
  readonly rows: number;
  readonly parameterCount: number;
  private readonly storage: Storage[];
  private readonly scalar: Float64Array[];
  private readonly data: (Float64Array | null)[];
  private readonly block: (Float64Array | null)[];
  private readonly adjoint: (Float64Array | null)[];

  /** `columns[c]` holds the values of tape column c on the rows, each of length `rows`. */
  constructor(private readonly tape: Tape, columns: readonly Float64Array[], rows: number) {
    this.rows = rows;
    this.parameterCount = tape.parameters.length;
    const count = tape.ops.length;
    this.storage = tape.ops.map((_, k) => (tape.rows[k] ? (tape.params[k] ? Storage.Block : Storage.Data) : Storage.Scalar));
    this.scalar = tape.ops.map(() => new Float64Array(1));
    this.data = new Array(count).fill(null);
    this.block = tape.ops.map((_, k) => (this.storage[k] === Storage.Block ? new Float64Array(BLOCK_ROWS) : null));
    this.adjoint = tape.ops.map((_, k) => (tape.params[k] ? new Float64Array(BLOCK_ROWS) : null));
    tape.ops.forEach((op, k) => {
      if (op.code === 'const') this.scalar[k][0] = op.hi;
      if (this.storage[k] !== Storage.Data) return;
      const out = op.code === 'column' ? columns[op.index] : new Float64Array(rows);
      this.data[k] = out;
      if (op.code !== 'column') this.apply(k, out, 0, rows);
    });
  }

  private operand(k: number, start: number): Operand {
    switch (this.storage[k]) {
      case Storage.Scalar: return { v: this.scalar[k], o: 0, s: 0 };
      case Storage.Data: return { v: this.data[k]!, o: start, s: 1 };
      case Storage.Block: return { v: this.block[k]!, o: 0, s: 1 };
    }
  }

  /** Computes entry k for `m` rows from `start` into `out`. */
  private apply(k: number, out: Float64Array, start: number, m: number): void {
    const op = this.tape.ops[k];
    switch (op.code) {
      case 'const':
      case 'param':
      case 'column':
        return;
      case 'powi':
        powIntValues(out, m, this.operand(op.a, start), op.n);
        return;
      case 'add': case 'sub': case 'mul': case 'div': case 'pow':
        binaryValues(op.code, out, m, this.operand(op.a, start), this.operand(op.b, start));
        return;
      default:
        unaryValues(op.code, out, m, this.operand(op.a, start));
    }
  }

  /** Sets the parameter vector: parameter entries and every parameter-only entry. */
  private setParameters(b: ArrayLike<number>): void {
    const { ops, params } = this.tape;
    for (let k = 0; k < ops.length; k++) {
      if (this.storage[k] !== Storage.Scalar || !params[k]) continue;
      const op = ops[k];
      if (op.code === 'param') this.scalar[k][0] = b[op.index];
      else this.apply(k, this.scalar[k], 0, 1);
    }
  }

  private forwardBlock(start: number, m: number): void {
    for (let k = 0; k < this.tape.ops.length; k++) {
      if (this.storage[k] === Storage.Block) this.apply(k, this.block[k]!, start, m);
    }
  }

  private copyOutput(f: Float64Array, start: number, m: number): void {
    const out = this.operand(this.tape.output, start);
    for (let i = 0; i < m; i++) f[start + i] = out.v[out.o + i * out.s];
  }

  /** f_i = model value at row i for parameters b. */
  values(b: ArrayLike<number>, f: Float64Array): void {
    this.setParameters(b);
    for (let start = 0; start < this.rows; start += BLOCK_ROWS) {
      const m = Math.min(BLOCK_ROWS, this.rows - start);
      this.forwardBlock(start, m);
      this.copyOutput(f, start, m);
    }
  }

  /**
   * Values and the Jacobian d f_i / d b_j, column-major: jacobian[j * rows + i].
   * A parameter the output does not reach gets a column of zeros.
   */
  valuesAndJacobian(b: ArrayLike<number>, f: Float64Array, jacobian: Float64Array): void {
    this.setParameters(b);
    const { ops, params, output } = this.tape;
    const n = this.rows;
    jacobian.fill(0);
    for (let start = 0; start < n; start += BLOCK_ROWS) {
      const m = Math.min(BLOCK_ROWS, n - start);
      this.forwardBlock(start, m);
      this.copyOutput(f, start, m);
      if (!params[output]) continue; // no parameter reaches the output: the Jacobian is zero
      for (let k = 0; k <= output; k++) if (params[k]) this.adjoint[k]!.fill(0, 0, m);
      this.adjoint[output]!.fill(1, 0, m);
      for (let k = output; k >= 0; k--) {
        if (!params[k]) continue;
        const g = this.adjoint[k]!;
        const op = ops[k];
        if (op.code === 'param') {
          const col = op.index * n + start;
          for (let i = 0; i < m; i++) jacobian[col + i] = g[i];
          continue;
        }
        if (op.code === 'const' || op.code === 'column') continue;
        const a = this.operand(op.a, start);
        if (op.code === 'powi') {
          powIntAdjoint(this.adjoint[op.a]!, g, m, a, op.n);
        } else if (op.code === 'add' || op.code === 'sub' || op.code === 'mul' || op.code === 'div' || op.code === 'pow') {
          const bOperand = this.operand(op.b, start);
          const y = this.operand(k, start);
          if (params[op.a]) binaryAdjoint(op.code, 'a', this.adjoint[op.a]!, g, m, a, bOperand, y);
          if (params[op.b]) binaryAdjoint(op.code, 'b', this.adjoint[op.b]!, g, m, a, bOperand, y);
        } else {
          unaryAdjoint(op.code, this.adjoint[op.a]!, g, m, a, this.operand(k, start));
        }
      }
    }
  }
}
