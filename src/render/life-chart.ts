// The life-data picture: the nonparametric estimate of the fraction failed
// F(t) — Kaplan–Meier with its band, or Turnbull's estimate with a shaded box
// wherever it is not determined — against each fitted distribution's F(t),
// on a log-time axis when every time is positive. Drawn only from the
// numbers stored with the comparison (lifePicture): a GET never refits. A
// model with terms is drawn averaged over the rows, and its legend entry
// says so. Curves differ in dash pattern as well as colour and are named in
// a legend, so a grey printout loses nothing. Pure: data in, SVG text out.
import type { LifePicture, StoredKaplanMeier, StoredTurnbull } from '../core/models/lifetime/index.ts';
import { timeScale, type TimeScale } from './life-axes.ts';
import { fontStack, palette } from './palette.ts';
import { element, px, textElement } from './svg-markup.ts';
import { truncateToWidth, wrapToWidth } from './text-measure.ts';

export interface LifeChartInput {
  title: string;
  /** The stored numbers (lifePicture of the result): nothing is refitted to draw them. */
  picture: LifePicture;
  width?: number;
  height?: number;
}

const STROKES = [palette.deltaBar, palette.weightBar, palette.ink, palette.mutedInk];
const DASHES = [null, '7 4', '2 3', '10 3 2 3', '4 2 1 2'];

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

function drawKaplanMeier(estimate: StoredKaplanMeier, frame: Frame): string {
  const { scale, y } = frame;
  const line: [number, number][] = [[frame.left, y(0)]];
  let f = 0;
  for (const s of estimate.steps) {
    const x = scale.x(s.time);
    line.push([x, y(f)], [x, y(s.fractionFailed)]);
    f = s.fractionFailed;
  }
  line.push([frame.right, y(f)]);
  // The band holds from each step to the next: its lower edge left to right, then its upper edge back.
  const steps = estimate.steps.filter((s) => s.lower !== null && s.upper !== null);
  const until = (k: number) => (k + 1 < steps.length ? scale.x(steps[k + 1].time) : frame.right);
  const band: [number, number][] = [];
  steps.forEach((s, k) => band.push([scale.x(s.time), y(s.lower!)], [until(k), y(s.lower!)]));
  for (let k = steps.length - 1; k >= 0; k--) band.push([until(k), y(steps[k].upper!)], [scale.x(steps[k].time), y(steps[k].upper!)]);
  const marks = estimate.censoredTimes.map((t) => {
    let at = 0;
    for (const s of estimate.steps) if (s.time <= t) at = s.fractionFailed;
    const x = scale.x(t);
    return `M${px(x)} ${px(y(at) - 4)} L${px(x)} ${px(y(at) + 4)}`;
  });
  return [
    band.length > 0 ? element('path', { class: 'estimate-band', d: `${path(band)} Z`, fill: palette.faintRule, stroke: 'none' }) : '',
    element('path', { class: 'estimate', d: path(line), fill: 'none', stroke: palette.ink, 'stroke-width': 1.6 }),
    marks.length > 0 ? element('path', { class: 'censored-marks', d: marks.join(' '), stroke: palette.ink, 'stroke-width': 1 }) : '',
  ].join('');
}

function drawTurnbull(estimate: StoredTurnbull, frame: Frame): string {
  const { scale, y } = frame;
  // The line is broken across each interval of positive width: the estimate
  // rises somewhere inside it, and the box says so.
  let d = `M${px(frame.left)} ${px(y(0))}`;
  const boxes: string[] = [];
  for (const iv of estimate.intervals) {
    const x0 = scale.x(iv.left);
    const x1 = iv.right === null ? frame.right : scale.x(iv.right);
    d += ` L${px(x0)} ${px(y(iv.before))}`;
    if (x1 - x0 > 0.5) {
      boxes.push(element('rect', {
        class: 'undetermined', x: x0, y: y(iv.after), width: x1 - x0, height: y(iv.before) - y(iv.after),
        fill: palette.zoneWeaker, stroke: palette.rule, 'stroke-width': 0.8,
      }));
      d += ` M${px(x1)} ${px(y(iv.after))}`;
    } else d += ` L${px(x1)} ${px(y(iv.after))}`;
  }
  const last = estimate.intervals.length > 0 ? estimate.intervals[estimate.intervals.length - 1].after : 0;
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

/** A curve's points as screen coordinates; data-points carries the stored (t, F) pairs drawn, for a reader to check. */
function drawCurves(picture: LifePicture, frame: Frame): string {
  return picture.curves.map((curve, k) => {
    const points: [number, number][] = [];
    picture.times.forEach((t, j) => {
      const f = curve.fractionFailed[j];
      if (f === null || !Number.isFinite(f) || (frame.scale.log && !(t > 0))) return;
      points.push([frame.scale.x(t), frame.y(Math.min(1, Math.max(0, f)))]);
    });
    return element('path', {
      class: 'fitted-curve', 'data-model': curve.model, 'data-reference': curve.reference, d: points.length > 1 ? path(points) : 'M0 0',
      fill: 'none', stroke: STROKES[k % STROKES.length], 'stroke-width': 1.8, 'stroke-dasharray': DASHES[k % DASHES.length],
    });
  }).join('');
}

function drawLegend(input: LifeChartInput, x: number, top: number, width: number, font: number): string {
  const size = font * 0.85;
  const step = font * 1.5;
  const estimate = input.picture.estimate;
  const estimateName = estimate.method === 'kaplanMeier'
    ? `Kaplan–Meier estimate; band: ${Math.round(estimate.intervalLevel * 100)}% interval`
    : "Turnbull's estimate; boxes: where it is not determined";
  const parts = [element('line', { x1: x, x2: x + 28, y1: top - font * 0.3, y2: top - font * 0.3, stroke: palette.ink, 'stroke-width': 1.8 })];
  const lines = wrapToWidth(estimateName, width - 34, size);
  lines.forEach((line, k) => parts.push(textElement('text', { x: x + 34, y: top + k * size * 1.2, 'font-size': size, fill: palette.ink }, line)));
  const entries = input.picture.curves.map((curve, k) => {
    const y = top + (lines.length - 1) * size * 1.2 + (k + 1) * step;
    const label = curve.reference === 'rowAverage' ? `${curve.model} (averaged over the rows)` : curve.model;
    return element('g', { class: 'legend-entry', 'data-model': curve.model }, [
      element('line', { x1: x, x2: x + 28, y1: y - font * 0.3, y2: y - font * 0.3, stroke: STROKES[k % STROKES.length], 'stroke-width': 1.8, 'stroke-dasharray': DASHES[k % DASHES.length] }),
      textElement('text', { x: x + 34, y, 'font-size': size, fill: palette.ink }, truncateToWidth(label, width - 34, size)),
    ]);
  });
  return element('g', { class: 'legend' }, [element('g', { class: 'legend-estimate' }, parts), ...entries]);
}

/** The standing caution, under the frame: a picture of fit is not a validation. */
const CAUTION = 'Criteria and this picture rank and compare models; they do not validate one. A life model for a safety-relevant decision needs domain review and local rules.';

export function renderLifeChartSvg(input: LifeChartInput): string {
  const width = input.width ?? 760;
  const height = input.height ?? 460;
  const font = Math.max(10, Math.min(16, width / 55));
  const legendWidth = Math.min(260, width * 0.32);
  const frameLeft = font * 3.6;
  const frameRight = width - legendWidth - font * 1.5;
  const top = font * 4.2;
  const cautionLines = wrapToWidth(CAUTION, width - 2 * font, font * 0.75);
  const bottom = height - font * 3.6 - cautionLines.length * font * 0.95;
  const { picture } = input;
  const scale = timeScale(picture.axis.min, picture.axis.max, picture.logTime, frameLeft, frameRight);
  const frame: Frame = { scale, y: (f) => bottom - (bottom - top) * f, top, bottom, left: frameLeft, right: frameRight };
  const names = picture.curves.map((c) => (c.reference === 'rowAverage' ? `${c.model}, averaged over the rows` : c.model));
  const description = `The fraction of units failed by each time: ${picture.estimate.method === 'kaplanMeier' ? 'the Kaplan–Meier estimate' : "Turnbull's estimate"} from the data, against ${names.length} fitted distribution${names.length === 1 ? '' : 's'} (${names.join('; ')}).`;
  const body = [
    textElement('title', {}, input.title),
    textElement('desc', {}, description),
    element('rect', { width, height, fill: palette.paper }),
    textElement('text', { x: font, y: font * 1.6, 'font-size': font * 1.15, 'font-weight': 'bold', fill: palette.ink }, truncateToWidth(input.title, width - 2 * font, font * 1.25)),
    drawAxes(frame, picture.logTime, font),
    picture.estimate.method === 'kaplanMeier' ? drawKaplanMeier(picture.estimate, frame) : drawTurnbull(picture.estimate, frame),
    drawCurves(picture, frame),
    drawLegend(input, frameRight + font * 1.2, top + font, legendWidth, font),
    element('g', { class: 'caution' }, cautionLines.map((line, k) => textElement('text', {
      x: font, y: height - font * 0.6 - (cautionLines.length - 1 - k) * font * 0.95, 'font-size': font * 0.75, fill: palette.mutedInk,
    }, line))),
  ];
  return element('svg', {
    xmlns: 'http://www.w3.org/2000/svg', width, height, viewBox: `0 0 ${width} ${height}`, role: 'img', 'font-family': fontStack,
    'data-estimate': picture.estimate.method,
  }, body) + '\n';
}
