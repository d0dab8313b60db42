// Scales and ticks of the life-data picture: time on a log axis (decades,
// with 2 and 5 between them when few decades are shown) when every time is
// positive, on a linear axis otherwise; the fraction failed F(t) from 0 to 1.

export interface TimeScale {
  log: boolean;
  min: number;
  max: number;
  /** Screen x of a time (clamped to the axis). */
  x(time: number): number;
  ticks: { value: number; label: string }[];
}

function niceStep(span: number, count: number): number {
  const raw = span / Math.max(1, count);
  const power = 10 ** Math.floor(Math.log10(raw));
  const unit = raw / power;
  return (unit <= 1 ? 1 : unit <= 2 ? 2 : unit <= 5 ? 5 : 10) * power;
}

/** A short label for a tick value: 0.01, 2, 500, 1e+06. */
export function tickLabel(value: number): string {
  const a = Math.abs(value);
  if (a !== 0 && (a >= 1e5 || a < 1e-3)) return value.toExponential(0);
  return String(Number(value.toPrecision(6)));
}

/**
 * The time axis between min and max (the stored picture's axis: whole
 * decades on a log axis), drawn between screen x0 and x1; a linear axis is
 * rounded out to whole steps.
 */
export function timeScale(lo: number, hi: number, log: boolean, x0: number, x1: number): TimeScale {
  let min = lo;
  let max = hi;
  if (log) {
    if (!(min > 0) || !(max > min)) { min = 1; max = 10; }
    const to = (t: number) => (Math.log10(t) - Math.log10(min)) / (Math.log10(max) - Math.log10(min));
    const decades = Math.round(Math.log10(max / min));
    const ticks: { value: number; label: string }[] = [];
    for (let k = 0; k <= decades; k++) {
      const base = min * 10 ** k;
      for (const m of decades <= 3 ? [1, 2, 5] : [1]) {
        const value = base * m;
        if (value <= max * (1 + 1e-9)) ticks.push({ value, label: tickLabel(value) });
      }
    }
    return { log, min, max, ticks, x: (t) => x0 + (x1 - x0) * Math.min(1, Math.max(0, t > 0 ? to(t) : 0)) };
  }
  if (!(max > min)) { min -= 1; max += 1; }
  const step = niceStep(max - min, 6);
  min = Math.floor(min / step) * step;
  max = Math.ceil(max / step) * step;
  const ticks: { value: number; label: string }[] = [];
  for (let v = min; v <= max + step / 2; v += step) ticks.push({ value: v, label: tickLabel(v) });
  return { log, min, max, ticks, x: (t) => x0 + (x1 - x0) * Math.min(1, Math.max(0, (t - min) / (max - min))) };
}
