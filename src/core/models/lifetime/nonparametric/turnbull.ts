// Turnbull's nonparametric maximum-likelihood estimate of a distribution
// function from exact, right-, left- and interval-censored observations
// (Turnbull 1976). Each observation is a set of times: exact [t, t], right
// (t, ∞), left (floor, t], interval (lower, upper], with floor 0 when every
// time is 0 or more and -∞ otherwise. The estimate puts all its mass on the
// innermost intervals (a left end immediately followed by a right end when
// all ends are sorted) and is found by the self-consistency (EM) iteration
//   p_j ← p_j · d_j,  d_j = (1/n) Σ_i [j ⊂ A_i] / Σ_k [k ⊂ A_i] p_k.
// Convergence rule: the log-likelihood is concave in p and n (max_j d_j - 1)
// bounds its distance to the maximum (Böhning 1986, the directional
// derivative towards a vertex), so the iteration stops when that bound is
// at most 1e-6, or at 20,000 iterations (reported as not converged). Inside
// an innermost interval the estimate is not determined: a picture draws the
// rise across it, not a step at one point.
import { EXACT, LEFT, RIGHT, type CensoredResponse } from '../censoring.ts';

export interface TurnbullInterval {
  left: number;
  right: number;
  /** True when the left end belongs to the interval ([t, t] of an exact failure). */
  leftClosed: boolean;
  mass: number;
  /** The estimate of F just below `left` and at `right`. */
  cdfBefore: number;
  cdfAfter: number;
}

export interface TurnbullEstimate {
  method: 'turnbull';
  intervals: TurnbullInterval[];
  logLikelihood: number;
  iterations: number;
  converged: boolean;
  rule: string;
}

export const TURNBULL_TOLERANCE = 1e-6;
export const TURNBULL_MAX_ITERATIONS = 20_000;
export const TURNBULL_RULE = `self-consistency (EM) iteration from equal masses; stops when n (max_j d_j - 1), a bound on the distance of the log-likelihood to its maximum, is at most ${TURNBULL_TOLERANCE}, or after ${TURNBULL_MAX_ITERATIONS} iterations`;

/** An interval end; ties sort a closed left end, then right ends, then open left ends. */
interface End {
  value: number;
  rank: 0 | 1 | 2;
}

function compareEnds(a: End, b: End): number {
  return a.value - b.value || a.rank - b.rank;
}

function observationSets(response: CensoredResponse): { lo: End[]; hi: End[] } {
  const n = response.time.length;
  let floor = 0;
  for (let i = 0; i < n; i++) if (response.time[i] < 0) floor = Number.NEGATIVE_INFINITY;
  const lo: End[] = [];
  const hi: End[] = [];
  for (let i = 0; i < n; i++) {
    const t = response.time[i];
    const s = response.status[i];
    if (s === EXACT) { lo.push({ value: t, rank: 0 }); hi.push({ value: t, rank: 1 }); }
    else if (s === RIGHT) { lo.push({ value: t, rank: 2 }); hi.push({ value: Number.POSITIVE_INFINITY, rank: 1 }); }
    else if (s === LEFT) { lo.push({ value: floor, rank: 2 }); hi.push({ value: t, rank: 1 }); }
    else { lo.push({ value: t, rank: 2 }); hi.push({ value: response.upper[i], rank: 1 }); }
  }
  return { lo, hi };
}

/** The first index in `sorted` whose end is not below `end` (or, with `after`, is above it). */
function search(sorted: End[], end: End, after: boolean): number {
  let a = 0;
  let b = sorted.length;
  while (a < b) {
    const mid = (a + b) >> 1;
    const c = compareEnds(sorted[mid], end);
    if (c < 0 || (after && c === 0)) a = mid + 1;
    else b = mid;
  }
  return a;
}

export function turnbull(response: CensoredResponse): TurnbullEstimate {
  const n = response.time.length;
  const { lo, hi } = observationSets(response);
  const ends = [...lo.map((e) => ({ e, left: true })), ...hi.map((e) => ({ e, left: false }))]
    .sort((a, b) => compareEnds(a.e, b.e) || Number(b.left) - Number(a.left));
  const innerLo: End[] = [];
  const innerHi: End[] = [];
  for (let k = 0; k + 1 < ends.length; k++) {
    if (ends[k].left && !ends[k + 1].left) {
      innerLo.push(ends[k].e);
      innerHi.push(ends[k + 1].e);
    }
  }
  const m = innerLo.length;
  // Observation i holds innermost intervals first[i] … last[i]: those that start at or after its left end and end at or before its right end.
  const first = new Int32Array(n);
  const last = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    first[i] = search(innerLo, lo[i], false);
    last[i] = search(innerHi, hi[i], true) - 1;
  }
  let p = new Float64Array(m).fill(1 / m);
  const prefix = new Float64Array(m + 1);
  const flow = new Float64Array(m + 1);
  let iterations = 0;
  let converged = false;
  let logLikelihood = 0;
  for (;; iterations++) {
    for (let j = 0; j < m; j++) prefix[j + 1] = prefix[j] + p[j];
    flow.fill(0);
    logLikelihood = 0;
    for (let i = 0; i < n; i++) {
      const mass = prefix[last[i] + 1] - prefix[first[i]];
      logLikelihood += Math.log(mass);
      flow[first[i]] += 1 / mass;
      flow[last[i] + 1] -= 1 / mass;
    }
    let running = 0;
    let largest = 0;
    const d = new Float64Array(m);
    for (let j = 0; j < m; j++) {
      running += flow[j];
      d[j] = running / n;
      largest = Math.max(largest, d[j]);
    }
    if (n * (largest - 1) <= TURNBULL_TOLERANCE) {
      converged = true;
      break;
    }
    if (iterations >= TURNBULL_MAX_ITERATIONS) break;
    p = p.map((v, j) => v * d[j]);
  }
  let cdf = 0;
  const intervals = Array.from({ length: m }, (_, j): TurnbullInterval => {
    const before = cdf;
    cdf = Math.min(1, cdf + p[j]);
    return { left: innerLo[j].value, right: innerHi[j].value, leftClosed: innerLo[j].rank === 0, mass: p[j], cdfBefore: before, cdfAfter: cdf };
  });
  return { method: 'turnbull', intervals, logLikelihood, iterations, converged, rule: TURNBULL_RULE };
}
