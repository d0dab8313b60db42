// Dense algebra on the small symmetric matrices of a likelihood's
// parameters (coefficients plus one scale or shape): a few dozen rows at
// most, stored row-major in a Float64Array.

/** Lower Cholesky factor L of a symmetric positive definite m×m matrix (L Lᵀ = A), or null when A is not positive definite. */
export function cholesky(a: Float64Array, m: number): Float64Array | null {
  const l = new Float64Array(m * m);
  for (let j = 0; j < m; j++) {
    let d = a[j * m + j];
    for (let k = 0; k < j; k++) d -= l[j * m + k] * l[j * m + k];
    // Relative pivot floor: a pivot that lost all but rounding of its
    // diagonal means the matrix is numerically singular.
    if (!(d > 1e-14 * Math.abs(a[j * m + j])) || !Number.isFinite(d)) return null;
    const root = Math.sqrt(d);
    l[j * m + j] = root;
    for (let i = j + 1; i < m; i++) {
      let s = a[i * m + j];
      for (let k = 0; k < j; k++) s -= l[i * m + k] * l[j * m + k];
      l[i * m + j] = s / root;
    }
  }
  return l;
}

/** Solves L Lᵀ x = b. */
export function choleskySolve(l: Float64Array, m: number, b: ArrayLike<number>): Float64Array {
  const x = Float64Array.from(b);
  for (let i = 0; i < m; i++) {
    let s = x[i];
    for (let k = 0; k < i; k++) s -= l[i * m + k] * x[k];
    x[i] = s / l[i * m + i];
  }
  for (let i = m - 1; i >= 0; i--) {
    let s = x[i];
    for (let k = i + 1; k < m; k++) s -= l[k * m + i] * x[k];
    x[i] = s / l[i * m + i];
  }
  return x;
}

/** A⁻¹ from the Cholesky factor of A, row-major. */
export function choleskyInverse(l: Float64Array, m: number): Float64Array {
  const inverse = new Float64Array(m * m);
  const e = new Float64Array(m);
  for (let j = 0; j < m; j++) {
    e.fill(0);
    e[j] = 1;
    const column = choleskySolve(l, m, e);
    for (let i = 0; i < m; i++) inverse[i * m + j] = column[i];
  }
  // Symmetrise: the two triangles agree to rounding only.
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < i; j++) {
      const v = (inverse[i * m + j] + inverse[j * m + i]) / 2;
      inverse[i * m + j] = inverse[j * m + i] = v;
    }
  }
  return inverse;
}

/** x' A y for a row-major m×m A. */
export function bilinear(a: Float64Array, m: number, x: ArrayLike<number>, y: ArrayLike<number>): number {
  let total = 0;
  for (let i = 0; i < m; i++) {
    if (x[i] === 0) continue;
    let inner = 0;
    for (let j = 0; j < m; j++) inner += a[i * m + j] * y[j];
    total += x[i] * inner;
  }
  return total;
}

/** B A Bᵀ for a row-major r×m B and m×m A: the covariance of linear combinations. */
export function congruence(b: Float64Array, r: number, m: number, a: Float64Array): Float64Array {
  const ba = new Float64Array(r * m);
  for (let i = 0; i < r; i++) {
    for (let j = 0; j < m; j++) {
      let s = 0;
      for (let k = 0; k < m; k++) s += b[i * m + k] * a[k * m + j];
      ba[i * m + j] = s;
    }
  }
  const out = new Float64Array(r * r);
  for (let i = 0; i < r; i++) {
    for (let j = 0; j <= i; j++) {
      let s = 0;
      for (let k = 0; k < m; k++) s += ba[i * m + k] * b[j * m + k];
      out[i * r + j] = out[j * r + i] = s;
    }
  }
  return out;
}
