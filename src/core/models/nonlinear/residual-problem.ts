// The least-squares problem of one candidate on its rows: residuals
// f_i = sqrt(w_i) (model_i - y_i) and their Jacobian sqrt(w_i) d model_i / d b,
// from the compiled expression; plus the same residuals in double-double for
// the end of the fit.
import type { LeastSquaresProblem } from './lm/levenberg-marquardt.ts';
import { TapeEvaluator } from './expression/evaluate.ts';
import { TapeEvaluatorDD } from './expression/evaluate-dd.ts';
import type { Tape } from './expression/tape.ts';

export interface ResidualData {
  /** Values of the tape's columns on the rows, in tape order. */
  columns: readonly Float64Array[];
  /** The response on the candidate's scale (transformed when it asks). */
  y: Float64Array;
  /** Relative weights, or null. */
  weights: Float64Array | null;
}

export class ResidualProblem implements LeastSquaresProblem {
  readonly rows: number;
  readonly parameters: number;
  private readonly evaluator: TapeEvaluator;
  private readonly extended: TapeEvaluatorDD;
  private readonly rootWeights: Float64Array | null;

  constructor(readonly tape: Tape, readonly data: ResidualData) {
    this.rows = data.y.length;
    this.parameters = tape.parameters.length;
    this.evaluator = new TapeEvaluator(tape, data.columns, this.rows);
    this.extended = new TapeEvaluatorDD(tape, data.columns, this.rows);
    this.rootWeights = data.weights ? data.weights.map(Math.sqrt) : null;
  }

  /** Model values at b. */
  model(b: ArrayLike<number>, out: Float64Array): void {
    this.evaluator.values(b, out);
  }

  residuals(x: Float64Array, f: Float64Array): number {
    this.evaluator.values(x, f);
    return this.toResiduals(f);
  }

  jacobian(x: Float64Array, f: Float64Array, jac: Float64Array): number {
    this.evaluator.valuesAndJacobian(x, f, jac);
    let bad = this.toResiduals(f);
    const n = this.rows;
    const sw = this.rootWeights;
    for (let j = 0; j < this.parameters; j++) {
      const off = j * n;
      for (let i = 0; i < n; i++) {
        const v = sw ? jac[off + i] * sw[i] : jac[off + i];
        jac[off + i] = v;
        if (!Number.isFinite(v) && (bad < 0 || i < bad)) bad = i;
      }
    }
    return bad;
  }

  /** Turns model values into weighted residuals in place; the first non-finite row or -1. */
  private toResiduals(f: Float64Array): number {
    const { y } = this.data;
    const sw = this.rootWeights;
    let bad = -1;
    for (let i = 0; i < f.length; i++) {
      const r = sw ? sw[i] * (f[i] - y[i]) : f[i] - y[i];
      f[i] = r;
      if (bad < 0 && !Number.isFinite(r)) bad = i;
    }
    return bad;
  }

  /**
   * Unweighted residuals y - model in double-double (hi, lo), for the final
   * residuals and sums of squares; the first non-finite row or -1.
   */
  residualsDD(b: ArrayLike<number>, eh: Float64Array, el: Float64Array): number {
    this.extended.values(b, eh, el);
    const { y } = this.data;
    let bad = -1;
    for (let i = 0; i < this.rows; i++) {
      // y - (fh + fl): two-sum of y and -fh, then the low parts.
      const a = y[i];
      const c = -eh[i];
      const s = a + c;
      const bb = s - a;
      const e = a - (s - bb) + (c - bb) - el[i];
      const h = s + e;
      eh[i] = h;
      el[i] = e - (h - s);
      if (bad < 0 && !Number.isFinite(h)) bad = i;
    }
    return bad;
  }
}
