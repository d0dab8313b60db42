// Householder QR with limited column pivoting, in double precision.
//
// The n-sized work runs on one column-major Float64Array with explicit offsets:
// element-wise get/set through a matrix class (ml-matrix) is about 16x slower at
// 100,000 x 30, and this factorisation is the dominant O(n p^2) cost of a fit.
//
// Pivoting follows the caller's column order, as LINPACK dqrdc2 does: columns
// are taken in order, and a column whose part not explained by the columns
// already accepted has norm <= tolerance * (its own norm) is declared aliased
// and moved to the end. The remaining norm is computed afresh from the updated
// column at the moment of the decision, never from downdated norms.

export interface HouseholderQR {
  rows: number;
  /** Number of accepted (non-aliased) columns. */
  rank: number;
  /** Candidate positions (working columns) in factorisation order: accepted first, then aliased. */
  order: number[];
  /** Column-major n x p working array: reflectors on and below the diagonal, R above. */
  work: Float64Array;
  /** Diagonal of R for accepted columns (index = position in order). */
  rdiag: Float64Array;
  /** Householder scalars: H_k = I - v v^T / beta_k. */
  beta: Float64Array;
  /** Relative remaining norm of each candidate column at its decision (1 for the first). */
  remainingNorm: Float64Array;
}

/**
 * Factorise the columns `candidates` (indices into `columns`) of an n-row matrix.
 * `referenceNorm[j]` is the norm a column's remaining part is compared against.
 */
export function householderQR(
  columns: ArrayLike<number>[],
  rows: number,
  candidates: number[],
  referenceNorm: ArrayLike<number>,
  tolerance: number,
): HouseholderQR {
  const n = rows;
  const q = candidates.length;
  const work = new Float64Array(n * q);
  for (let c = 0; c < q; c++) {
    const src = columns[candidates[c]];
    const off = c * n;
    for (let i = 0; i < n; i++) work[off + i] = src[i];
  }
  // Candidate c lives in working column c; `accepted` lists them in pivot order.
  const accepted: number[] = [];
  const aliased: number[] = [];
  const rdiag = new Float64Array(q);
  const beta = new Float64Array(q);
  const remainingNorm = new Float64Array(q);
  const pending: number[] = [];
  for (let c = 0; c < q; c++) pending.push(c);

  while (pending.length > 0) {
    const c = pending.shift()!;
    const k = accepted.length;
    const off = c * n;
    let ss = 0;
    for (let i = k; i < n; i++) ss += work[off + i] * work[off + i];
    const nrm = Math.sqrt(ss);
    const ref = referenceNorm[candidates[c]];
    remainingNorm[c] = ref > 0 ? nrm / ref : 0;
    if (k >= n || !(nrm > tolerance * ref) || !Number.isFinite(nrm)) {
      aliased.push(c);
      continue;
    }
    // Reflector mapping x = work[k.., c] to alpha e_1 with alpha = -sign(x_k) ||x||,
    // so that v_k = x_k - alpha never cancels.
    const x0 = work[off + k];
    const alpha = x0 >= 0 ? -nrm : nrm;
    const v0 = x0 - alpha;
    work[off + k] = v0;
    const b = -alpha * v0; // = v^T v / 2
    rdiag[k] = alpha;
    beta[k] = b;
    for (const d of pending) {
      const offd = d * n;
      let s = 0;
      for (let i = k; i < n; i++) s += work[off + i] * work[offd + i];
      const f = s / b;
      for (let i = k; i < n; i++) work[offd + i] -= f * work[off + i];
    }
    accepted.push(c);
  }
  // Reflectors and R entries sit in the accepted columns' slots; order maps positions to slots.
  return {
    rows: n,
    rank: accepted.length,
    order: [...accepted, ...aliased],
    work,
    rdiag,
    beta,
    remainingNorm,
  };
}

/** z <- Q^T z (z has n entries). */
export function applyQt(qr: HouseholderQR, z: Float64Array): void {
  const { rows: n, work, beta } = qr;
  for (let k = 0; k < qr.rank; k++) {
    const off = qr.order[k] * n;
    let s = 0;
    for (let i = k; i < n; i++) s += work[off + i] * z[i];
    const f = s / beta[k];
    for (let i = k; i < n; i++) z[i] -= f * work[off + i];
  }
}

/** z <- Q z. */
export function applyQ(qr: HouseholderQR, z: Float64Array): void {
  const { rows: n, work, beta } = qr;
  for (let k = qr.rank - 1; k >= 0; k--) {
    const off = qr.order[k] * n;
    let s = 0;
    for (let i = k; i < n; i++) s += work[off + i] * z[i];
    const f = s / beta[k];
    for (let i = k; i < n; i++) z[i] -= f * work[off + i];
  }
}

/** R(k, l) for accepted positions k <= l. */
export function rEntry(qr: HouseholderQR, k: number, l: number): number {
  return k === l ? qr.rdiag[k] : qr.work[qr.order[l] * qr.rows + k];
}

/** The rank x rank upper-triangular R as rows of plain arrays. */
export function upperTriangle(qr: HouseholderQR): number[][] {
  const r = qr.rank;
  const out: number[][] = [];
  for (let k = 0; k < r; k++) {
    const row = new Array<number>(r).fill(0);
    for (let l = k; l < r; l++) row[l] = rEntry(qr, k, l);
    out.push(row);
  }
  return out;
}

/** Solve R x = c in place (c has rank entries). */
export function solveUpper(qr: HouseholderQR, c: Float64Array): void {
  for (let k = qr.rank - 1; k >= 0; k--) {
    let s = c[k];
    for (let l = k + 1; l < qr.rank; l++) s -= rEntry(qr, k, l) * c[l];
    c[k] = s / qr.rdiag[k];
  }
}

/** Solve R^T h = g in place (g has rank entries). */
export function solveUpperTransposed(qr: HouseholderQR, g: Float64Array): void {
  for (let k = 0; k < qr.rank; k++) {
    let s = g[k];
    for (let l = 0; l < k; l++) s -= rEntry(qr, l, k) * g[l];
    g[k] = s / qr.rdiag[k];
  }
}
