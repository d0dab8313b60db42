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
  // dots[d]: v_k^T (column d) for the latest reflector k, taken during the pass
  // that applied reflector k-1 to column d (see applyAndDot).
  const dots = new Float64Array(q);

  /** Decide candidate c at position k; when accepted, form its reflector in place. */
  const decide = (c: number, k: number): boolean => {
    const off = c * n;
    let ss = 0;
    for (let i = k; i < n; i++) ss += work[off + i] * work[off + i];
    const nrm = Math.sqrt(ss);
    const ref = referenceNorm[candidates[c]];
    remainingNorm[c] = ref > 0 ? nrm / ref : 0;
    if (k >= n || !(nrm > tolerance * ref) || !Number.isFinite(nrm)) return false;
    // Reflector mapping x = work[k.., c] to alpha e_1 with alpha = -sign(x_k) ||x||,
    // so that v_k = x_k - alpha never cancels.
    const x0 = work[off + k];
    const alpha = x0 >= 0 ? -nrm : nrm;
    const v0 = x0 - alpha;
    work[off + k] = v0;
    rdiag[k] = alpha;
    beta[k] = -alpha * v0; // = v^T v / 2
    return true;
  };

  // Columns are taken in order. Each pending column is brought up to date with the
  // latest reflector just before it is decided; once the next reflector is formed,
  // one pass per remaining column applies the previous reflector and accumulates
  // the dot product with the new one. These are the operations of the textbook
  // loop (dot, then update, per reflector) in the same order, so the result is
  // bit-identical to it, with one pass over each column per reflector instead of two.
  let current = -1; // working column of the latest reflector, -1 before the first
  let next = 0; // index into candidates order of the next column to decide
  while (next < q) {
    const k = accepted.length;
    let chosen = -1;
    while (next < q) {
      const c = next++;
      if (current >= 0) applyReflector(work, n, current * n, k - 1, beta[k - 1], c * n, dots[c]);
      if (decide(c, k)) {
        chosen = c;
        break;
      }
      aliased.push(c);
    }
    if (chosen < 0) break;
    accepted.push(chosen);
    const offV = chosen * n;
    let d = next;
    if (current >= 0) {
      // Four (then two) pending columns per pass: each column's operations are
      // exactly those of applyAndDot, so the result is bit-identical, but the two
      // reflectors are read once for all of them and the dot products accumulate
      // side by side instead of waiting on one another (~30% less time at
      // 100,000 x 31, scripts/bench-large-fit.ts).
      for (; d + 3 < q; d += 4) {
        applyAndDotQuad(work, n, current * n, k - 1, beta[k - 1], d, dots, offV);
      }
      for (; d + 1 < q; d += 2) {
        applyAndDotPair(work, n, current * n, k - 1, beta[k - 1], d * n, (d + 1) * n, dots, d, offV);
      }
    }
    for (; d < q; d++) {
      const offD = d * n;
      if (current < 0) {
        let s = 0;
        for (let i = k; i < n; i++) s += work[offV + i] * work[offD + i];
        dots[d] = s;
      } else {
        dots[d] = applyAndDot(work, n, current * n, k - 1, beta[k - 1], offD, dots[d], offV);
      }
    }
    current = chosen;
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

/** Column at offD -= (s / b) v, with v the reflector of position k at offV. */
function applyReflector(work: Float64Array, n: number, offV: number, k: number, b: number, offD: number, s: number): void {
  const f = s / b;
  for (let i = k; i < n; i++) work[offD + i] -= f * work[offV + i];
}

/**
 * applyReflector for the reflector of position k, and in the same pass the dot
 * product (from row k + 1) of the updated column with the next reflector at offW.
 */
function applyAndDot(
  work: Float64Array, n: number, offV: number, k: number, b: number, offD: number, s: number, offW: number,
): number {
  const f = s / b;
  if (k < n) work[offD + k] -= f * work[offV + k];
  let t = 0;
  for (let i = k + 1; i < n; i++) {
    const x = work[offD + i] - f * work[offV + i];
    work[offD + i] = x;
    t += work[offW + i] * x;
  }
  return t;
}

/** applyAndDot for the columns at offD and offE (dots[d] and dots[d + 1]) in one pass; results in dots. */
function applyAndDotPair(
  work: Float64Array, n: number, offV: number, k: number, b: number, offD: number, offE: number,
  dots: Float64Array, d: number, offW: number,
): void {
  const f = dots[d] / b;
  const g = dots[d + 1] / b;
  if (k < n) {
    work[offD + k] -= f * work[offV + k];
    work[offE + k] -= g * work[offV + k];
  }
  let t = 0;
  let u = 0;
  for (let i = k + 1; i < n; i++) {
    const v = work[offV + i];
    const w = work[offW + i];
    const x = work[offD + i] - f * v;
    const y = work[offE + i] - g * v;
    work[offD + i] = x;
    work[offE + i] = y;
    t += w * x;
    u += w * y;
  }
  dots[d] = t;
  dots[d + 1] = u;
}

/** applyAndDot for the four columns d..d+3 (each n long, dots[d..d+3]) in one pass; results in dots. */
function applyAndDotQuad(
  work: Float64Array, n: number, offV: number, k: number, b: number, d: number, dots: Float64Array, offW: number,
): void {
  const o0 = d * n;
  const o1 = o0 + n;
  const o2 = o1 + n;
  const o3 = o2 + n;
  const f0 = dots[d] / b;
  const f1 = dots[d + 1] / b;
  const f2 = dots[d + 2] / b;
  const f3 = dots[d + 3] / b;
  if (k < n) {
    const v = work[offV + k];
    work[o0 + k] -= f0 * v;
    work[o1 + k] -= f1 * v;
    work[o2 + k] -= f2 * v;
    work[o3 + k] -= f3 * v;
  }
  let t0 = 0;
  let t1 = 0;
  let t2 = 0;
  let t3 = 0;
  for (let i = k + 1; i < n; i++) {
    const v = work[offV + i];
    const w = work[offW + i];
    const x0 = work[o0 + i] - f0 * v;
    const x1 = work[o1 + i] - f1 * v;
    const x2 = work[o2 + i] - f2 * v;
    const x3 = work[o3 + i] - f3 * v;
    work[o0 + i] = x0;
    work[o1 + i] = x1;
    work[o2 + i] = x2;
    work[o3 + i] = x3;
    t0 += w * x0;
    t1 += w * x1;
    t2 += w * x2;
    t3 += w * x3;
  }
  dots[d] = t0;
  dots[d + 1] = t1;
  dots[d + 2] = t2;
  dots[d + 3] = t3;
}

// applyQt and applyQ fuse the update by one reflector with the dot product for
// the next, in the textbook order of operations (bit-identical to dot-then-update
// per reflector), so that z and the reflectors are read once per reflector.

/** z <- Q^T z (z has n entries). */
export function applyQt(qr: HouseholderQR, z: Float64Array): void {
  const { rows: n, work, beta, rank } = qr;
  if (rank === 0) return;
  let off = qr.order[0] * n;
  let s = 0;
  for (let i = 0; i < n; i++) s += work[off + i] * z[i];
  for (let k = 0; k < rank; k++) {
    const f = s / beta[k];
    if (k + 1 === rank) {
      for (let i = k; i < n; i++) z[i] -= f * work[off + i];
      return;
    }
    const offW = qr.order[k + 1] * n;
    z[k] -= f * work[off + k];
    let t = 0;
    for (let i = k + 1; i < n; i++) {
      const x = z[i] - f * work[off + i];
      z[i] = x;
      t += work[offW + i] * x;
    }
    s = t;
    off = offW;
  }
}

/** z <- Q z. */
export function applyQ(qr: HouseholderQR, z: Float64Array): void {
  const { rows: n, work, beta, rank } = qr;
  if (rank === 0) return;
  let k = rank - 1;
  let off = qr.order[k] * n;
  let s = 0;
  for (let i = k; i < n; i++) s += work[off + i] * z[i];
  for (; k >= 0; k--) {
    const f = s / beta[k];
    if (k === 0) {
      for (let i = 0; i < n; i++) z[i] -= f * work[off + i];
      return;
    }
    // The next reflector (k - 1) starts one row earlier, where z is not changed by this one.
    const offW = qr.order[k - 1] * n;
    let t = 0;
    t += work[offW + k - 1] * z[k - 1];
    for (let i = k; i < n; i++) {
      const x = z[i] - f * work[off + i];
      z[i] = x;
      t += work[offW + i] * x;
    }
    s = t;
    off = offW;
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
