// The stored life-data picture (lifePicture of a comparison's result) as the
// life chart reads it, checked as far as the chart walks it, so a record of
// any age or shape draws without a crash: a record without one (no life
// models, or stored before the picture existed) gives null.
import type { LifePicture, LifeCurve, StoredKaplanMeier, StoredTurnbull } from '../core/models/lifetime/index.ts';

const isObject = (v: unknown): v is Record<string, unknown> => v !== null && typeof v === 'object' && !Array.isArray(v);
const num = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);
const numOrNull = (v: unknown): number | null => (num(v) ? v : null);
const list = (v: unknown): unknown[] => (Array.isArray(v) ? v : []);

function estimateOf(v: unknown): StoredKaplanMeier | StoredTurnbull | null {
  if (!isObject(v)) return null;
  if (v.method === 'kaplanMeier') {
    return {
      method: 'kaplanMeier',
      intervalLevel: num(v.intervalLevel) ? v.intervalLevel : 0.95,
      steps: list(v.steps).filter(isObject).filter((s) => num(s.time) && num(s.fractionFailed))
        .map((s) => ({ time: s.time as number, fractionFailed: s.fractionFailed as number, lower: numOrNull(s.lower), upper: numOrNull(s.upper) })),
      censoredTimes: list(v.censoredTimes).filter(num),
      censoredCount: num(v.censoredCount) ? v.censoredCount : 0,
    };
  }
  if (v.method === 'turnbull') {
    return {
      method: 'turnbull',
      intervals: list(v.intervals).filter(isObject).filter((iv) => num(iv.left) && num(iv.before) && num(iv.after))
        .map((iv) => ({ left: iv.left as number, right: numOrNull(iv.right), before: iv.before as number, after: iv.after as number })),
      converged: v.converged === true,
    };
  }
  return null;
}

export function storedLifePicture(result: Record<string, unknown>): LifePicture | null {
  const p = result.lifePicture;
  if (!isObject(p) || !isObject(p.axis) || !num(p.axis.min) || !num(p.axis.max)) return null;
  const estimate = estimateOf(p.estimate);
  if (!estimate) return null;
  const times = list(p.times).filter(num);
  const curves: LifeCurve[] = list(p.curves).filter(isObject).filter((c) => typeof c.model === 'string').map((c) => ({
    model: c.model as string,
    distribution: String(c.distribution ?? ''),
    reference: c.reference === 'rowAverage' ? 'rowAverage' : 'single',
    fractionFailed: times.map((_, j) => numOrNull(list(c.fractionFailed)[j])),
  }));
  return {
    logTime: p.logTime === true, axis: { min: p.axis.min, max: p.axis.max }, times, estimate, curves,
    notes: list(p.notes).filter((n): n is string => typeof n === 'string'),
  };
}
