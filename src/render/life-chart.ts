// The life-data picture: the nonparametric estimate of the fraction failed
// F(t) — Kaplan–Meier with its band, or Turnbull's estimate with a shaded box
// wherever it is not determined — against each fitted distribution's F(t),
// on a log-time axis for the distributions of positive time. Curves differ
// in dash pattern as well as colour and are named in a legend, so a grey
// printout loses nothing. Pure: data in, SVG text out.
import type { KaplanMeierEstimate, TurnbullEstimate } from '../core/models/lifetime/index.ts';
import { timeScale, type TimeScale } from './life-axes.ts';
import { fontStack, palette } from './palette.ts';
import { element, px, textElement } from './svg-markup.ts';
import { truncateToWidth, wrapToWidth } from './text-measure.ts';

export interface FittedCurve {
  name: string;
  /** Times, increasing, and the model's F(t) at each (fittedDistributionCurve). */
  times: readonly number[];
  cdf: readonly number[];
}

export interface LifeChartInput {
  title: string;
  estimate: KaplanMeierEstimate | TurnbullEstimate;
  curves: readonly FittedCurve[];
  /** A log-time axis (the distributions of positive time). */
  logTime: boolean;
  width?: number;
  height?: number;
}

const STROKES = [palette.deltaBar, palette.weightBar, palette.ink, palette.mutedInk];
const DASHES = [null, '7 4', '2 3', '10 3 2 3', '4 2 1 2'];

/** Log-spaced times between the estimate's extremes, for fittedDistributionCurve. */
export function lifeChartTimes(estimate: KaplanMeierEstimate | TurnbullEstimate, logTime: boolean, count = 120): number[] {
  const scale = timeScale(estimateTimes(estimate), logTime, 0, 1);
  return Array.from({ length: count }, (_, k) => {
    const f = k / (count - 1);
    return scale.log ? scale.min * (scale.max / scale.min) ** f : scale.min + (scale.max - scale.min) * f;
  });
}

function estimateTimes(estimate: KaplanMeierEstimate | TurnbullEstimate): number[] {
  if (estimate.method === 'kaplanMeier') return [...estimate.steps.map((s) => s.time), ...estimate.censoredTimes];
  return estimate.intervals.flatMap((iv) => [iv.left, iv.right]);
}

interface Frame {
  scale: TimeScale;
  y: (f: number) => number;
  top: number;
  bottom: number;
  left: number;
  right: number;
}

function path(points: [number, number][]): string {
  return points.map(([x, y], k) => `${k === 0 ? 'M' : 'L'}${px(x)} ${px(y)}`).join(' ');
}

function drawKaplanMeier(estimate: KaplanMeierEstimate, frame: Frame): string {
  const { scale, y } = frame;
  const line: [number, number][] = [[frame.left, y(0)]];
  let f = 0;
  for (const s of estimate.steps) {
    const x = scale.x(s.time);
    line.push([x, y(f)], [x, y(1 - s.survival)]);
    f = 1 - s.survival;
  }
  line.push([frame.right, y(f)]);
  // The band holds from each step to the next: its upper edge left to right, then its lower edge back.
  const steps = estimate.steps.filter((s) => s.lower !== null && s.upper !== null);
  const until = (k: number) => (k + 1 < steps.length ? scale.x(steps[k + 1].time) : frame.right);
  const band: [number, number][] = [];
  steps.forEach((s, k) => band.push([scale.x(s.time), y(1 - s.lower!)], [until(k), y(1 - s.lower!)]));
  for (let k = steps.length - 1; k >= 0; k--) band.push([until(k), y(1 - steps[k].upper!)], [scale.x(steps[k].time), y(1 - steps[k].upper!)]);
  const marks = estimate.censoredTimes.map((t) => {
    const passed = estimate.steps.filter((s) => s.time <= t);
    const at = passed.length === 0 ? 0 : 1 - passed[passed.length - 1].survival;
    const x = scale.x(t);
    return `M${px(x)} ${px(y(at) - 4)} L${px(x)} ${px(y(at) + 4)}`;
  });
  return [
    band.length > 0 ? element('path', { class: 'estimate-band', d: `${path(band)} Z`, fill: palette.faintRule, stroke: 'none' }) : '',
    element('path', { class: 'estimate', d: path(line), fill: 'none', stroke: palette.ink, 'stroke-width': 1.6 }),
    marks.length > 0 ? element('path', { class: 'censored-marks', d: marks.join(' '), stroke: palette.ink, 'stroke-width': 1 }) : '',
  ].join('');
}

function drawTurnbull(estimate: TurnbullEstimate, frame: Frame): string {
  const { scale, y } = frame;
  // The line is broken across each innermost interval of positive width: the
  // estimate rises somewhere inside it, and the box says so.
  let d = `M${px(frame.left)} ${px(y(0))}`;
  const boxes: string[] = [];
  for (const iv of estimate.intervals) {
    if (iv.mass <= 1e-9) continue;
    const x0 = scale.x(iv.left);
    const x1 = Number.isFinite(iv.right) ? scale.x(iv.right) : frame.right;
    d += ` L${px(x0)} ${px(y(iv.cdfBefore))}`;
    if (x1 - x0 > 0.5) {
      boxes.push(element('rect', {
        class: 'undetermined', x: x0, y: y(iv.cdfAfter), width: x1 - x0, height: y(iv.cdfBefore) - y(iv.cdfAfter),
        fill: palette.zoneWeaker, stroke: palette.rule, 'stroke-width': 0.8,
      }));
      d += ` M${px(x1)} ${px(y(iv.cdfAfter))}`;
    } else d += ` L${px(x1)} ${px(y(iv.cdfAfter))}`;
  }
  const last = estimate.intervals.length > 0 ? estimate.intervals[estimate.intervals.length - 1].cdfAfter : 0;
  d += ` L${px(frame.right)} ${px(y(last))}`;
  return boxes.join('') + element('path', { class: 'estimate', d, fill: 'none', stroke: palette.ink, 'stroke-width': 1.6 });
}

function drawAxes(frame: Frame, logTime: boolean, font: number): string {
  const parts: string[] = [];
  for (const tick of frame.scale.ticks) {
    const x = frame.scale.x(tick.value);
    parts.push(element('line', { x1: x, x2: x, y1: frame.top, y2: frame.bottom, stroke: palette.faintRule }));
    parts.push(textElement('text', { x, y: frame.bottom + font * 1.3, 'font-size': font * 0.85, fill: palette.mutedInk, 'text-anchor': 'middle' }, tick.label));
  }
  for (let k = 0; k <= 5; k++) {
    const v = k / 5;
    parts.push(element('line', { x1: frame.left, x2: frame.right, y1: frame.y(v), y2: frame.y(v), stroke: palette.faintRule }));
    parts.push(textElement('text', { x: frame.left - 6, y: frame.y(v) + font * 0.3, 'font-size': font * 0.85, fill: palette.mutedInk, 'text-anchor': 'end' }, `${k * 20}%`));
  }
  parts.push(element('rect', { x: frame.left, y: frame.top, width: frame.right - frame.left, height: frame.bottom - frame.top, fill: 'none', stroke: palette.rule }));
  parts.push(textElement('text', { x: (frame.left + frame.right) / 2, y: frame.bottom + font * 2.7, 'font-size': font * 0.9, fill: palette.ink, 'text-anchor': 'middle' }, logTime ? 'time (log scale)' : 'time'));
  parts.push(textElement('text', { x: frame.left, y: frame.top - font * 0.6, 'font-size': font * 0.9, fill: palette.ink }, 'fraction failed, F(t)'));
  return element('g', { class: 'axes' }, parts);
}

function drawCurves(curves: readonly FittedCurve[], frame: Frame): string {
  return curves.map((curve, k) => {
    const points: [number, number][] = [];
    curve.times.forEach((t, j) => {
      const f = curve.cdf[j];
      if (!Number.isFinite(f) || t < frame.scale.min || t > frame.scale.max || (frame.scale.log && !(t > 0))) return;
      points.push([frame.scale.x(t), frame.y(Math.min(1, Math.max(0, f)))]);
    });
    return element('path', {
      class: 'fitted-curve', 'data-model': curve.name, d: points.length > 1 ? path(points) : 'M0 0',
      fill: 'none', stroke: STROKES[k % STROKES.length], 'stroke-width': 1.8, 'stroke-dasharray': DASHES[k % DASHES.length],
    });
  }).join('');
}

function drawLegend(input: LifeChartInput, x: number, top: number, width: number, font: number): string {
  const size = font * 0.85;
  const step = font * 1.5;
  const estimateName = input.estimate.method === 'kaplanMeier'
    ? `Kaplan–Meier estimate; band: ${Math.round(input.estimate.intervalLevel * 100)}% interval`
    : "Turnbull's estimate; boxes: where it is not determined";
  const parts = [element('line', { x1: x, x2: x + 28, y1: top - font * 0.3, y2: top - font * 0.3, stroke: palette.ink, 'stroke-width': 1.8 })];
  const lines = wrapToWidth(estimateName, width - 34, size);
  lines.forEach((line, k) => parts.push(textElement('text', { x: x + 34, y: top + k * size * 1.2, 'font-size': size, fill: palette.ink }, line)));
  const entries = input.curves.map((curve, k) => {
    const y = top + (lines.length - 1) * size * 1.2 + (k + 1) * step;
    return element('g', { class: 'legend-entry', 'data-model': curve.name }, [
      element('line', { x1: x, x2: x + 28, y1: y - font * 0.3, y2: y - font * 0.3, stroke: STROKES[k % STROKES.length], 'stroke-width': 1.8, 'stroke-dasharray': DASHES[k % DASHES.length] }),
      textElement('text', { x: x + 34, y, 'font-size': size, fill: palette.ink }, truncateToWidth(curve.name, width - 34, size)),
    ]);
  });
  return element('g', { class: 'legend' }, [element('g', { class: 'legend-estimate' }, parts), ...entries]);
}

export function renderLifeChartSvg(input: LifeChartInput): string {
  const width = input.width ?? 760;
  const height = input.height ?? 460;
  const font = Math.max(10, Math.min(16, width / 55));
  const legendWidth = Math.min(260, width * 0.32);
  const frameLeft = font * 3.6;
  const frameRight = width - legendWidth - font * 1.5;
  const top = font * 4.2;
  const bottom = height - font * 3.6;
  const curveTimes = input.curves.flatMap((c) => c.times);
  const scale = timeScale([...estimateTimes(input.estimate), ...(estimateTimes(input.estimate).length > 0 ? [] : curveTimes)], input.logTime, frameLeft, frameRight);
  const frame: Frame = { scale, y: (f) => bottom - (bottom - top) * f, top, bottom, left: frameLeft, right: frameRight };
  const description = `The fraction of units failed by each time: ${input.estimate.method === 'kaplanMeier' ? 'the Kaplan–Meier estimate' : "Turnbull's estimate"} from the data, against ${input.curves.length} fitted distribution${input.curves.length === 1 ? '' : 's'} (${input.curves.map((c) => c.name).join(', ')}).`;
  const body = [
    textElement('title', {}, input.title),
    textElement('desc', {}, description),
    element('rect', { width, height, fill: palette.paper }),
    textElement('text', { x: font, y: font * 1.6, 'font-size': font * 1.15, 'font-weight': 'bold', fill: palette.ink }, truncateToWidth(input.title, width - 2 * font, font * 1.25)),
    drawAxes(frame, input.logTime, font),
    input.estimate.method === 'kaplanMeier' ? drawKaplanMeier(input.estimate, frame) : drawTurnbull(input.estimate, frame),
    drawCurves(input.curves, frame),
    drawLegend(input, frameRight + font * 1.2, top + font, legendWidth, font),
  ];
  return element('svg', {
    xmlns: 'http://www.w3.org/2000/svg', width, height, viewBox: `0 0 ${width} ${height}`, role: 'img', 'font-family': fontStack,
    'data-estimate': input.estimate.method,
  }, body) + '\n';
}
