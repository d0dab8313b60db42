// A run of Householder reflectors applied as one block (compact WY form,
// Schreiber & Van Loan 1989; LAPACK's dlarft and dlarfb):
//
//     H_k0 H_k0+1 ... H_k1-1 = I - V T V^T,   so   Q^T C = C - V (T^T (V^T C)),
//
// with V the reflectors (v_j zero above its own row) and T upper triangular.
// The products V^T C and V Y are swept over tiles of rows so that the tile of the
// trailing columns and of V stays in cache while every column is visited: the
// unblocked QR reads each trailing column from memory once per reflector, this
// reads it twice per block. The inner loops multiply two reflectors by two
// columns at a time (four accumulators) so each load feeds two products.
//
// The sums run in a different order than the reflector-by-reflector update, so
// the last bits differ from the unblocked kernel (agreement ~1e-15 relative per
// entry).

/** Rows per tile: a tile of 16 reflectors and 30 columns (~190 KiB) stays in a core's L2 cache. */
const TILE = 512;

/**
 * T of the block H_k0 ... H_k0+m-1 (m = vOff.length), upper triangular, row-major
 * m x m. `vOff[j]` is the offset in `work` of reflector k0 + j, whose head sits
 * at row k0 + j (entries above it belong to R and count as zero); `beta[k]` is
 * v^T v / 2 for reflector k, so tau_k = 1 / beta[k].
 */
export function blockFactor(work: Float64Array, n: number, k0: number, vOff: number[], beta: Float64Array): Float64Array {
  const m = vOff.length;
  const k1 = k0 + m;
  // G = V^T V (strict upper part): the head rows entry by entry, the full rows
  // by the two-by-two kernel over pairs on or above the diagonal.
  const g = new Float64Array(m * m);
  for (let r = k0; r < Math.min(k1, n); r++) {
    for (let a = 0; a <= r - k0; a++) {
      const va = work[vOff[a] + r];
      for (let b = a + 1; b <= r - k0; b++) g[a * m + b] += va * work[vOff[b] + r];
    }
  }
  for (let t0 = k1; t0 < n; t0 += TILE) crossProducts(work, vOff, work, vOff, t0, Math.min(n, t0 + TILE), g, true);
  // dlarft's recurrence: T[j][j] = tau_j, T[0:j, j] = -tau_j T[0:j, 0:j] G[0:j, j].
  const tm = new Float64Array(m * m);
  for (let j = 0; j < m; j++) {
    const tau = 1 / beta[k0 + j];
    for (let a = 0; a < j; a++) {
      let s = 0;
      for (let b = a; b < j; b++) s += tm[a * m + b] * g[b * m + j];
      tm[a * m + j] = -tau * s;
    }
    tm[j * m + j] = tau;
  }
  return tm;
}

/**
 * C <- (I - V T V^T)^T C (transposed: Q^T C, as the factorisation and Q^T z need)
 * or C <- (I - V T V^T) C (Q z), for the columns of `c` at offsets `cOff`, rows
 * k0..n-1 (rows above k0 are not touched by these reflectors).
 */
export function applyBlock(
  work: Float64Array, n: number, k0: number, vOff: number[], tm: Float64Array,
  c: Float64Array, cOff: number[], transposed: boolean,
): void {
  const m = vOff.length;
  const nc = cOff.length;
  if (m === 0 || nc === 0) return;
  const k1 = Math.min(n, k0 + m);
  // W = V^T C: the head rows k0..k1-1 entry by entry, then the full rows in tiles.
  const w = new Float64Array(m * nc);
  for (let r = k0; r < k1; r++) {
    for (let a = 0; a <= r - k0; a++) {
      const va = work[vOff[a] + r];
      for (let j = 0; j < nc; j++) w[a * nc + j] += va * c[cOff[j] + r];
    }
  }
  for (let t0 = k1; t0 < n; t0 += TILE) crossProducts(work, vOff, c, cOff, t0, Math.min(n, t0 + TILE), w, false);
  // Y = T^T W or T W (m x nc).
  const y = new Float64Array(m * nc);
  for (let a = 0; a < m; a++) {
    for (let j = 0; j < nc; j++) {
      let s = 0;
      if (transposed) for (let b = 0; b <= a; b++) s += tm[b * m + a] * w[b * nc + j];
      else for (let b = a; b < m; b++) s += tm[a * m + b] * w[b * nc + j];
      y[a * nc + j] = s;
    }
  }
  // C -= V Y, the same way.
  for (let r = k0; r < k1; r++) {
    for (let j = 0; j < nc; j++) {
      let s = 0;
      for (let a = 0; a <= r - k0; a++) s += work[vOff[a] + r] * y[a * nc + j];
      c[cOff[j] + r] -= s;
    }
  }
  for (let t0 = k1; t0 < n; t0 += TILE) subtractProducts(work, vOff, c, cOff, t0, Math.min(n, t0 + TILE), y);
}

/**
 * w[a][j] += sum over rows t0..t1-1 of v_a c_j, two reflectors by two columns
 * at a time; `upper`: only the pairs with j >= a - 1 (for V^T V, whose lower
 * part is not needed).
 */
function crossProducts(
  work: Float64Array, vOff: number[], c: Float64Array, cOff: number[], t0: number, t1: number, w: Float64Array, upper: boolean,
): void {
  const m = vOff.length;
  const nc = cOff.length;
  for (let a = 0; a < m; a += 2) {
    const va = vOff[a];
    const pairA = a + 1 < m;
    const vb = pairA ? vOff[a + 1] : va;
    for (let j = upper ? a : 0; j < nc; j += 2) {
      const ca = cOff[j];
      const pairC = j + 1 < nc;
      const cb = pairC ? cOff[j + 1] : ca;
      let s00 = 0;
      let s01 = 0;
      let s10 = 0;
      let s11 = 0;
      for (let i = t0; i < t1; i++) {
        const x0 = work[va + i];
        const x1 = work[vb + i];
        const y0 = c[ca + i];
        const y1 = c[cb + i];
        s00 += x0 * y0;
        s01 += x0 * y1;
        s10 += x1 * y0;
        s11 += x1 * y1;
      }
      w[a * nc + j] += s00;
      if (pairC) w[a * nc + j + 1] += s01;
      if (pairA) {
        w[(a + 1) * nc + j] += s10;
        if (pairC) w[(a + 1) * nc + j + 1] += s11;
      }
    }
  }
}

/** c_j -= sum_a v_a y[a][j] over rows t0..t1-1, two columns by four reflectors at a time. */
function subtractProducts(
  work: Float64Array, vOff: number[], c: Float64Array, cOff: number[], t0: number, t1: number, y: Float64Array,
): void {
  const m = vOff.length;
  const nc = cOff.length;
  for (let j = 0; j < nc; j += 2) {
    const ca = cOff[j];
    const pairC = j + 1 < nc;
    const cb = pairC ? cOff[j + 1] : -1;
    let a = 0;
    for (; a + 4 <= m; a += 4) {
      const v0 = vOff[a];
      const v1 = vOff[a + 1];
      const v2 = vOff[a + 2];
      const v3 = vOff[a + 3];
      const y00 = y[a * nc + j];
      const y10 = y[(a + 1) * nc + j];
      const y20 = y[(a + 2) * nc + j];
      const y30 = y[(a + 3) * nc + j];
      if (pairC) {
        const y01 = y[a * nc + j + 1];
        const y11 = y[(a + 1) * nc + j + 1];
        const y21 = y[(a + 2) * nc + j + 1];
        const y31 = y[(a + 3) * nc + j + 1];
        for (let i = t0; i < t1; i++) {
          const x0 = work[v0 + i];
          const x1 = work[v1 + i];
          const x2 = work[v2 + i];
          const x3 = work[v3 + i];
          c[ca + i] -= x0 * y00 + x1 * y10 + x2 * y20 + x3 * y30;
          c[cb + i] -= x0 * y01 + x1 * y11 + x2 * y21 + x3 * y31;
        }
      } else {
        for (let i = t0; i < t1; i++) {
          c[ca + i] -= work[v0 + i] * y00 + work[v1 + i] * y10 + work[v2 + i] * y20 + work[v3 + i] * y30;
        }
      }
    }
    for (; a < m; a++) {
      const vb = vOff[a];
      const yb0 = y[a * nc + j];
      for (let i = t0; i < t1; i++) c[ca + i] -= work[vb + i] * yb0;
      if (pairC) {
        const yb1 = y[a * nc + j + 1];
        for (let i = t0; i < t1; i++) c[cb + i] -= work[vb + i] * yb1;
      }
    }
  }
}
