// What the life-data picture needs, computed once when the comparison runs
// and stored with its result, so drawing it later never refits anything:
// - the nonparametric estimate of the fraction failed F(t) (Kaplan–Meier with
//   its band, or Turnbull's estimate), thinned so the stored step function
//   is bounded in size yet never further than PICTURE_RISE from the full one;
// - each life model's F(t) at PICTURE_POINTS times spread over the same
//   time axis the picture draws.
// A model with terms has no single F(t): it is drawn as the average of
// F(t | x_i) over the comparison's rows, the fitted counterpart of the
// estimate from the whole sample (the stated reference `rowAverage`).
import { EXACT, INTERVAL, RIGHT, type CensoredResponse } from './censoring.ts';
import { cumulativeHazardAt } from './life-quantities.ts';
import type { LifetimeFit } from './lifetime-result.ts';
import { nonparametricEstimate } from './nonparametric/index.ts';

/** Times at which each fitted curve is stored. */
export const PICTURE_POINTS = 81;
/** The stored estimate keeps a step only once F has risen this much since the last kept one. */
export const PICTURE_RISE = 0.002;
/** At most this many censoring marks are stored (evenly spread by rank). */
export const PICTURE_MARKS = 200;
/** A model with terms is averaged over at most this many groups of rows (equal counts, by location). */
export const PICTURE_GROUPS = 256;

export interface StoredKaplanMeier {
  method: 'kaplanMeier';
  intervalLevel: number;
  /** Each kept step: F just after it, and its band (log-log Greenwood interval of S, turned into F); null where undefined. */
  steps: { time: number; fractionFailed: number; lower: number | null; upper: number | null }[];
  /** Times of right-censored units (at most PICTURE_MARKS of them), for tick marks. */
  censoredTimes: number[];
  censoredCount: number;
}

export interface StoredTurnbull {
  method: 'turnbull';
  /** Where F rises: from `before` at `left` to `after` at `right` (right null: beyond every inspection), undetermined inside. */
  intervals: { left: number; right: number | null; before: number; after: number }[];
  converged: boolean;
}

export interface LifeCurve {
  model: string;
  distribution: string;
  /** 'single': a model without terms; 'rowAverage': F(t | x_i) averaged over the rows. */
  reference: 'single' | 'rowAverage';
  fractionFailed: (number | null)[];
}

export interface LifePicture {
  /** Log-time axis when every observed time is positive. */
  logTime: boolean;
  /** The axis the picture draws (rounded out from the data), and the times of every curve. */
  axis: { min: number; max: number };
  times: number[];
  estimate: StoredKaplanMeier | StoredTurnbull;
  curves: LifeCurve[];
  /** The rules above in words, for the answer and the picture. */
  notes: string[];
}

/** The ends of the time axis: whole decades with a margin on a log axis, the data's range with a margin otherwise. */
export function pictureAxis(times: readonly number[], log: boolean): { min: number; max: number } {
  const usable = times.filter((t) => Number.isFinite(t) && (!log || t > 0));
  let min = usable.length > 0 ? Math.min(...usable) : log ? 1 : 0;
  let max = usable.length > 0 ? Math.max(...usable) : log ? 10 : 1;
  if (log) return { min: 10 ** Math.floor(Math.log10(min) - 0.2), max: 10 ** Math.ceil(Math.log10(max) + 0.2) };
  if (max === min) { min -= 1; max += 1; }
  const margin = 0.05 * (max - min);
  return { min: min - margin, max: max + margin };
}

function observedTimes(response: CensoredResponse): number[] {
  const out: number[] = [];
  for (let i = 0; i < response.time.length; i++) {
    if (response.status[i] !== INTERVAL || response.time[i] > 0) out.push(response.time[i]);
    if (response.status[i] === INTERVAL) out.push(response.upper[i]);
  }
  return out;
}

function thinKaplanMeier(response: CensoredResponse, level: number): StoredKaplanMeier {
  const km = nonparametricEstimate(response, level);
  if (km.method !== 'kaplanMeier') throw new Error('expected Kaplan–Meier');
  const steps: StoredKaplanMeier['steps'] = [];
  let kept = 0;
  km.steps.forEach((s, k) => {
    const f = 1 - s.survival;
    if (k === km.steps.length - 1 || steps.length === 0 || f - kept >= PICTURE_RISE) {
      steps.push({ time: s.time, fractionFailed: f, lower: s.upper === null ? null : 1 - s.upper, upper: s.lower === null ? null : 1 - s.lower });
      kept = f;
    }
  });
  const marks = [...new Set(km.censoredTimes)];
  const every = marks.length <= PICTURE_MARKS ? marks : Array.from({ length: PICTURE_MARKS }, (_, k) => marks[Math.round((k * (marks.length - 1)) / (PICTURE_MARKS - 1))]);
  return { method: 'kaplanMeier', intervalLevel: level, steps, censoredTimes: every, censoredCount: km.censoredTimes.length };
}

function thinTurnbull(response: CensoredResponse, level: number): StoredTurnbull {
  const tb = nonparametricEstimate(response, level);
  if (tb.method !== 'turnbull') throw new Error("expected Turnbull's estimate");
  const intervals: StoredTurnbull['intervals'] = [];
  const finite = (v: number) => (Number.isFinite(v) ? v : null);
  for (const iv of tb.intervals) {
    if (iv.mass <= 1e-9) continue;
    const last = intervals[intervals.length - 1];
    // Merge into the previous interval while together they rise less than PICTURE_RISE: the box widens, F is never off by more.
    if (last && iv.cdfAfter - last.before < PICTURE_RISE && last.right !== null) {
      last.right = finite(iv.right);
      last.after = iv.cdfAfter;
    } else intervals.push({ left: Number.isFinite(iv.left) ? iv.left : 0, right: finite(iv.right), before: iv.cdfBefore, after: iv.cdfAfter });
  }
  return { method: 'turnbull', intervals, converged: tb.converged };
}

/** Locations of the rows, as (location, share) groups: exact for few distinct values, else equal-count groups by their middle row. */
function locationGroups(locations: Float64Array): { mu: number; share: number }[] {
  const sorted = Float64Array.from(locations).sort();
  const distinct: { mu: number; share: number }[] = [];
  for (let i = 0; i < sorted.length; i++) {
    if (distinct.length > 0 && distinct[distinct.length - 1].mu === sorted[i]) distinct[distinct.length - 1].share++;
    else distinct.push({ mu: sorted[i], share: 1 });
    if (distinct.length > PICTURE_GROUPS) break;
  }
  const n = sorted.length;
  if (distinct.length <= PICTURE_GROUPS) return distinct.map((d) => ({ mu: d.mu, share: d.share / n }));
  return Array.from({ length: PICTURE_GROUPS }, (_, g) => {
    const from = Math.floor((g * n) / PICTURE_GROUPS);
    const to = Math.floor(((g + 1) * n) / PICTURE_GROUPS);
    return { mu: sorted[(from + to - 1) >> 1], share: (to - from) / n };
  });
}

/** A fitted model's F(t) at the picture's times: its own, or averaged over the rows' locations. */
export function lifeCurve(fit: LifetimeFit, hasTerms: boolean, times: readonly number[]): LifeCurve {
  const groups = locationGroups(fit.fittedLocation);
  const fractionFailed = times.map((t) => {
    let f = 0;
    for (const g of groups) f += g.share * -Math.expm1(-cumulativeHazardAt(fit.estimates, g.mu, t));
    return Number.isFinite(f) ? Math.min(1, Math.max(0, f)) : null;
  });
  return { model: fit.name, distribution: fit.distribution, reference: hasTerms ? 'rowAverage' : 'single', fractionFailed };
}

export const PICTURE_NOTES = [
  `the estimate keeps a step only once the fraction failed has risen by ${PICTURE_RISE} since the last kept one (Turnbull: neighbouring intervals merged while together they rise less), so it is never further than that from the full estimate`,
  `each fitted curve is stored at ${PICTURE_POINTS} times evenly spread over the axis`,
  `a model with terms is drawn as the average of F(t | x) over the comparison's rows (at most ${PICTURE_GROUPS} equal-count groups of rows by location, each at its middle row), the counterpart of the estimate from the whole sample; its curve at one row is in lifePredictions`,
];

/** The picture's numbers: the estimate (Kaplan–Meier or Turnbull, chosen by the censoring) and every life model's curve. */
export function lifePicture(response: CensoredResponse, curves: readonly ((times: readonly number[]) => LifeCurve)[], level: number): LifePicture {
  const times = observedTimes(response);
  const logTime = times.every((t) => t > 0 || t === Number.POSITIVE_INFINITY);
  const axis = pictureAxis(times, logTime);
  const curveTimes = Array.from({ length: PICTURE_POINTS }, (_, k) => {
    const f = k / (PICTURE_POINTS - 1);
    return logTime ? axis.min * (axis.max / axis.min) ** f : axis.min + (axis.max - axis.min) * f;
  });
  const kmEnough = response.status.every((s) => s === EXACT || s === RIGHT);
  return {
    logTime,
    axis,
    times: curveTimes,
    estimate: kmEnough ? thinKaplanMeier(response, level) : thinTurnbull(response, level),
    curves: curves.map((curve) => curve(curveTimes)),
    notes: PICTURE_NOTES,
  };
}
