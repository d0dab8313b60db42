// GET /v1/comparisons/{id}/chart.svg: a picture of one ranking, drawn on the
// server. Pure and deterministic: the same record and options give the same
// bytes (no clock, no randomness, ids derived from the record, fixed number
// formatting), so a dashboard can cache it and a test can compare it.
import { chartContent, type ChartContent } from './chart-content.ts';
import { chartLabels, settledNotes, type ChartLabels, type ChartNote } from './chart-labels.ts';
import { chartLayout, integrityWarning, type ChartLayout } from './chart-layout.ts';
import type { ChartOptions } from './chart-options.ts';
import { drawBands, drawPanelTitles, drawRows } from './chart-panels.ts';
import { drawNotes, drawStrip, swatchPatterns } from './chart-strip.ts';
import { formatCriterionDelta, formatPercent } from './number-format.ts';
import { fontStack, palette } from './palette.ts';
import { element, textElement } from './svg-markup.ts';
import { truncateToWidth } from './text-measure.ts';
import type { StoredComparisonView } from './types.ts';

/**
 * For the chart served on its own: it draws with presentation attributes
 * only, so it needs nothing at all; no script, style sheet, image or font
 * may load, whatever a name in it says.
 */
export const chartContentSecurityPolicy = "default-src 'none'";

/** Element ids unique to the record, so several charts inlined in one page do not collide. */
function idPrefix(record: StoredComparisonView): string {
  const safe = String(record.id ?? '').replace(/[^A-Za-z0-9_-]/g, '').slice(0, 32);
  return `pm-${safe === '' ? 'chart' : safe}`;
}

export function chartTitle(record: StoredComparisonView, content: ChartContent): string {
  const label = typeof record.label === 'string' && record.label.trim() !== '' ? `: ${record.label.trim()}` : '';
  return `Ranking by ${content.criterionLabel}${label}`;
}

/** The whole ranking in words, for screen readers and for anyone who cannot see the bars. */
export function chartDescription(content: ChartContent): string {
  const count = content.rows.length;
  const warning = integrityWarning(content);
  const sentences = [
    ...(warning === null ? [] : [warning]),
    `Differences in ${content.criterionLabel} from the best of ${count} candidate model${count === 1 ? '' : 's'}, one bar per model` +
      (content.weightsDefined ? ', with their weights beside them.' : '.'),
  ];
  if (content.best !== null) sentences.push(`Best by ${content.criterionLabel}: ${content.best}.`);
  const rows = content.rows.map((row) => {
    const band = row.bandWording ? ` (${row.bandWording})` : '';
    const weight = row.weight === null ? '' : `, weight ${formatPercent(row.weight)}`;
    return `${row.key} ${row.name}: Δ ${formatCriterionDelta(content.criterion, row.delta)}${band}${weight}`;
  });
  if (rows.length > 0) sentences.push(`${rows.join('; ')}.`);
  if (content.cells.length > 1) {
    const picks = content.cells.map((c) => `${c.criterionLabel} prefers ${c.model ?? 'no model'}`).join('; ');
    sentences.push(`${picks}.`);
    sentences.push(content.distinctPreferred <= 1 ? 'The criteria agree.' : `The criteria disagree: ${content.distinctPreferred} different models are preferred.`);
  }
  return sentences.join(' ');
}

function subtitle(content: ChartContent): string {
  const best = content.best === null ? 'no best model' : `best: ${content.best}`;
  const count = `${content.rows.length} model${content.rows.length === 1 ? '' : 's'}`;
  const agreement =
    content.cells.length <= 1 ? '' : content.distinctPreferred <= 1 ? ' · criteria agree' : ' · criteria disagree';
  return `${count} · ${best}${agreement}`;
}

/** Across the top, dark on light so it survives grey printing: the record failed its integrity check. */
function drawWarning(layout: ChartLayout): string {
  if (layout.warningLines.length === 0) return '';
  const height = layout.warningLines.length * layout.warningLineHeight + layout.font * 0.5;
  const lines = layout.warningLines.map((line, i) =>
    textElement('tspan', { x: layout.pad, y: layout.warningTop + layout.font * 0.25 + (i + 0.8) * layout.warningLineHeight }, i < layout.warningLines.length - 1 ? `${line} ` : line));
  return element('g', { class: 'integrity-warning' }, [
    element('rect', { x: layout.pad * 0.5, y: layout.warningTop, width: layout.width - layout.pad, height, fill: palette.ink }),
    element('text', { 'font-size': layout.warningFont, 'font-weight': 'bold', fill: palette.paper }, lines),
  ]);
}

function drawHeading(record: StoredComparisonView, content: ChartContent, layout: ChartLayout): string {
  const usable = layout.width - 2 * layout.pad;
  const legend = layout.legendLines.map((line, i) =>
    // The space between wrapped lines stays in the text, so copied or spoken text reads as one sentence.
    textElement('tspan', { x: layout.pad, y: layout.legendY + i * layout.legendLineHeight }, i < layout.legendLines.length - 1 ? `${line} ` : line),
  );
  return [
    textElement('text', { x: layout.pad, y: layout.titleY, 'font-size': layout.font * 1.15, 'font-weight': 'bold', fill: palette.ink }, truncateToWidth(chartTitle(record, content), usable, layout.font * 1.25)),
    textElement('text', { x: layout.pad, y: layout.subtitleY, 'font-size': layout.font * 0.95, fill: palette.ink }, truncateToWidth(subtitle(content), usable, layout.font * 0.95)),
    element('text', { class: 'band-legend', 'font-size': layout.smallFont, fill: palette.mutedInk }, legend),
  ].join('');
}

/**
 * Renders the chart. `options` should come from parseChartOptions, which
 * guarantees the criterion is ranked in the record and the size is in range.
 */
export function renderChartSvg(record: StoredComparisonView, options: ChartOptions): string {
  const content = chartContent(record, options.criterion);
  // Two passes: the labels of a first layout decide which notes to make room
  // for and whether rows need a line for band words; with that room the rows
  // can only shrink or gain that line, so the final labels need no notes
  // beyond those (settledNotes).
  const draft = chartLayout(content, options.width, options.height);
  const drafted = chartLabels(content, draft);
  const wordLine = drafted.rows.some((r) => r.wordsAt === 'omitted');
  const layout = drafted.notes.length === 0 ? draft : chartLayout(content, options.width, options.height, { notes: drafted.notes, wordLine });
  const labels = layout === draft ? drafted : chartLabels(content, layout);
  const notes = layout === draft ? drafted.notes : settledNotes(drafted.notes, labels.notes);
  // Free height: rows do not depend on the notes, so the height can fit the notes actually drawn.
  const final = options.height === null && notes.length !== drafted.notes.length ? chartLayout(content, options.width, null, { notes, wordLine }) : layout;
  return drawChart(record, content, final, labels, notes);
}

function drawChart(record: StoredComparisonView, content: ChartContent, layout: ChartLayout, labels: ChartLabels, notes: readonly ChartNote[]): string {
  const prefix = idPrefix(record);
  const groups = Math.max(0, ...content.cells.map((c) => c.group + 1));
  const body = [
    textElement('title', { id: `${prefix}-title` }, chartTitle(record, content)),
    textElement('desc', { id: `${prefix}-desc` }, chartDescription(content)),
    swatchPatterns(prefix, groups),
    element('rect', { width: layout.width, height: layout.viewHeight, fill: palette.paper }),
    drawWarning(layout),
    drawHeading(record, content, layout),
    drawPanelTitles(content, layout),
    drawBands(content, layout),
    drawRows(content, layout, labels.rows),
    drawStrip(content, layout, prefix, labels.cells),
    drawNotes(layout, notes),
  ];
  return element('svg', {
    xmlns: 'http://www.w3.org/2000/svg',
    width: layout.width,
    height: layout.height,
    viewBox: `0 0 ${layout.width} ${layout.viewHeight}`,
    role: 'img',
    'aria-labelledby': `${prefix}-title ${prefix}-desc`,
    'font-family': fontStack,
    'data-criterion': content.criterion,
    'data-integrity': content.integrity === null ? null : content.integrity.ok ? 'ok' : 'failed',
  }, body) + '\n';
}
