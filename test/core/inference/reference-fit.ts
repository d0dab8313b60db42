// A plain reference least-squares fit for these tests, independent of the
// project's solver: ml-matrix's Householder QR on sqrt(W) X over the columns
// that raise the rank (chosen greedily in design order, rank judged by
// ml-matrix's SVD), C = R^-1 R^-T. Accurate enough for the small,
// well-conditioned problems the tests use.
import { Matrix, QrDecomposition, SingularValueDecomposition, inverse } from 'ml-matrix';
import type { DesignMatrix, LeastSquaresFit } from '../../../src/core/types.ts';
import { fitLeastSquares } from '../../../src/core/fit/index.ts';

export function makeDesign(labels: string[], columns: number[][], intercept: boolean): DesignMatrix {
  const rows = columns[0].length;
  return {
    rows,
    labels,
    high: columns.map((c) => Float64Array.from(c)),
    low: columns.map(() => new Float64Array(rows)),
    intercept,
    termOfColumn: labels.map((l, j) => (intercept && j === 0 ? -1 : intercept ? j - 1 : j)),
  };
}

/** Design with an intercept column first, then the given named columns. */
export function designWithIntercept(named: Record<string, number[]>): DesignMatrix {
  const names = Object.keys(named);
  const n = named[names[0]].length;
  return makeDesign(['intercept', ...names], [new Array(n).fill(1), ...names.map((k) => named[k])], true);
}

function rankOf(cols: number[][]): number {
  if (cols.length === 0) return 0;
  return new SingularValueDecomposition(new Matrix(cols).transpose(), { autoTranspose: true }).rank;
}

export function referenceFit(design: DesignMatrix, y: number[], weights?: number[]): LeastSquaresFit {
  const n = design.rows;
  const w = weights ?? new Array(n).fill(1);
  const sw = w.map(Math.sqrt);
  const all = design.high.map((c) => Array.from(c, (x, i) => x * sw[i]));
  const estimable: number[] = [];
  for (let j = 0; j < all.length; j++) {
    if (rankOf([...estimable.map((k) => all[k]), all[j]]) > estimable.length) estimable.push(j);
  }
  // Columns scaled to unit length before the QR (equilibration), undone after,
  // so that the units of the data do not enter the conditioning.
  const scale = estimable.map((k) => Math.hypot(...all[k]) || 1);
  const xw = new Matrix(estimable.map((k, m) => all[k].map((v) => v / scale[m]))).transpose();
  const yw = Matrix.columnVector(y.map((v, i) => v * sw[i]));
  const qr = new QrDecomposition(xw);
  const b = qr.solve(yw).to1DArray().map((v, m) => v / scale[m]);
  const rInv = inverse(qr.upperTriangularMatrix);
  const c = rInv.mmul(rInv.transpose()).to2DArray().map((row, a) => row.map((v, m) => v / (scale[a] * scale[m])));
  const coefficients: (number | null)[] = design.labels.map(() => null);
  estimable.forEach((k, m) => { coefficients[k] = b[m]; });
  const fitted = new Float64Array(n);
  for (let i = 0; i < n; i++) estimable.forEach((k, m) => { fitted[i] += design.high[k][i] * b[m]; });
  const residuals = Float64Array.from(y, (v, i) => v - fitted[i]);
  const rss = residuals.reduce((s, e, i) => s + w[i] * e * e, 0);
  const rank = estimable.length;
  const wsum = w.reduce((a, b) => a + b, 0);
  const ybar = y.reduce((s, v, i) => s + w[i] * v, 0) / wsum;
  const tss = y.reduce((s, v, i) => s + w[i] * (design.intercept ? (v - ybar) ** 2 : v * v), 0);
  const sigma = n > rank ? Math.sqrt(rss / (n - rank)) : null;
  const yscale = Math.sqrt(y.reduce((s, v, i) => s + w[i] * v * v, 0));
  const exactFit = Math.sqrt(rss) <= 1e-13 * yscale;
  return {
    observations: n,
    rank,
    coefficients,
    standardErrors: coefficients.map((cf, j) => {
      const m = estimable.indexOf(j);
      return cf === null || sigma === null || sigma === 0 ? null : sigma * Math.sqrt(c[m][m]);
    }),
    aliased: design.labels.filter((_, j) => !estimable.includes(j)),
    unscaledCovariance: c,
    estimable,
    residuals,
    fitted,
    rss,
    tss,
    sigma,
    exactFit,
    conditionNumber: new SingularValueDecomposition(xw).condition,
    refinement: { steps: 0, lastCorrection: 0 },
  };
}

/** The project's solver under the same call shape, for running each check against both fits. */
export function projectFit(design: DesignMatrix, y: number[], weights?: number[]): LeastSquaresFit {
  return fitLeastSquares(design, Float64Array.from(y), weights ? Float64Array.from(weights) : undefined);
}

export const SOLVERS = [
  ['reference (ml-matrix QR)', referenceFit],
  ['fitLeastSquares', projectFit],
] as const;
