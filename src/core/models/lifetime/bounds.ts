// Each observation as bounds on the model's own scale y (ln t for the
// distributions of positive time, t for the others): an exact failure is
// lo = hi = y; a right-censored unit lo = y, hi = +∞; a left-censored one
// lo = -∞, hi = y; an interval (lo, hi]. An interval that starts at time 0
// on the log scale is a left-censored unit at its upper time.
//
// The fit works on a standardised scale y' = (y - centre) / spread so that
// Newton steps and damping are in units of the data's own spread, whatever
// the time unit; the likelihood on the data's scale is recovered exactly
// (each exact observation's density gains -ln spread).
import { EXACT, INTERVAL, LEFT, RIGHT, type CensoredResponse } from './censoring.ts';
import { NeumaierSum } from './log-arithmetic.ts';

export interface Bounds {
  /** EXACT, RIGHT, LEFT or INTERVAL per row (an interval from -∞ is stored as LEFT). */
  kind: Uint8Array;
  lo: Float64Array;
  hi: Float64Array;
}

export interface ModelScaleBounds {
  bounds: Bounds;
  /** A single value per row for starting values: the time itself, a censoring time, or the middle of a window. */
  representative: Float64Array;
  exactCount: number;
  /** Σ ln t over exact failures (0 on the time scale): the Jacobian between the log-time and time likelihoods. */
  sumLogExactTimes: number;
}

export function modelScaleBounds(response: CensoredResponse, logScale: boolean): ModelScaleBounds {
  const n = response.time.length;
  const kind = new Uint8Array(n);
  const lo = new Float64Array(n);
  const hi = new Float64Array(n);
  const representative = new Float64Array(n);
  const y = (t: number) => (logScale ? (t > 0 ? Math.log(t) : Number.NEGATIVE_INFINITY) : t);
  let exactCount = 0;
  // Compensated: Σ ln t is compared across tools to many digits.
  const sumLog = new NeumaierSum();
  for (let i = 0; i < n; i++) {
    const s = response.status[i];
    const v = y(response.time[i]);
    kind[i] = s;
    if (s === EXACT) {
      lo[i] = hi[i] = representative[i] = v;
      exactCount++;
      if (logScale) sumLog.add(v);
    } else if (s === RIGHT) {
      lo[i] = representative[i] = v;
      hi[i] = Number.POSITIVE_INFINITY;
    } else if (s === LEFT) {
      lo[i] = Number.NEGATIVE_INFINITY;
      hi[i] = representative[i] = v;
    } else {
      const top = y(response.upper[i]);
      lo[i] = v;
      hi[i] = top;
      if (v === Number.NEGATIVE_INFINITY) {
        kind[i] = LEFT;
        representative[i] = top;
      } else {
        kind[i] = INTERVAL;
        representative[i] = (v + top) / 2;
      }
    }
  }
  return { bounds: { kind, lo, hi }, representative, exactCount, sumLogExactTimes: sumLog.value() };
}

/** The bounds on the standardised scale (y - centre) / spread; infinite bounds stay infinite. */
export function standardiseBounds(bounds: Bounds, centre: number, spread: number): Bounds {
  const map = (v: number) => (Number.isFinite(v) ? (v - centre) / spread : v);
  return { kind: bounds.kind, lo: bounds.lo.map(map), hi: bounds.hi.map(map) };
}
