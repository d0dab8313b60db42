// Geometry of the chart for a requested size: an integrity warning when the
// record failed its check, a heading and a band legend, then one row per model
// spanning a name column (key and name), the Δ panel and the weight panel,
// the strip of preferred models, and notes (the model key spelled out, band
// words left out) when the labels need them. Everything scales from one base
// font size, which itself follows the width, so a dashboard tile and a printed
// page both stay legible.
import type { ChartContent } from './chart-content.ts';
import type { ChartNote } from './chart-labels.ts';
import { estimateTextWidth, wrapToWidth } from './text-measure.ts';

export interface ChartLayout {
  /** Size written on the root element. */
  width: number;
  height: number;
  /** Height of the drawing's own coordinate system (taller than `height` when rows had to shrink past readability). */
  viewHeight: number;
  font: number;
  smallFont: number;
  rowFont: number;
  pad: number;
  /** The integrity warning's lines (empty when the record passed or was not checked). */
  warningLines: string[];
  warningTop: number;
  warningLineHeight: number;
  warningFont: number;
  titleY: number;
  subtitleY: number;
  legendLines: string[];
  legendY: number;
  legendLineHeight: number;
  panelTitleY: number;
  tickY: number;
  rowsTop: number;
  rowHeight: number;
  rowsBottom: number;
  /** Rows hold a second line, under the bar, for the band's words. */
  wordLine: boolean;
  nameX: number;
  nameWidth: number;
  /** Width of the key badge before each name. */
  keyWidth: number;
  deltaX: number;
  deltaWidth: number;
  /** Width the Δ bars scale into; the rest of the panel holds the value text. */
  deltaScaleWidth: number;
  axisMax: number;
  weightX: number;
  weightWidth: number;
  weightScaleWidth: number;
  stripTitleY: number;
  stripTop: number;
  cellHeight: number;
  cellWidth: number;
  cellGap: number;
  /** Where the notes start, and the room they were given (the notes drawn may be fewer). */
  notesY: number;
  notesWidth: number;
  notesLineHeight: number;
}

const clamp = (x: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, x));

/** The notes wrapped to the chart's inner width. */
export function wrapNotes(notes: readonly ChartNote[], width: number, font: number): { kind: ChartNote['kind']; lines: string[] }[] {
  return notes.map((note) => ({ kind: note.kind, lines: wrapToWidth(note.text, width, font) }));
}

/** Lines, with a little air between notes. */
export function notesHeight(wrapped: readonly { lines: string[] }[], lineHeight: number): number {
  const lines = wrapped.reduce((sum, note) => sum + note.lines.length, 0);
  return lines * lineHeight + Math.max(0, wrapped.length - 1) * lineHeight * 0.3;
}

export function legendText(content: ChartContent): string {
  if (content.legend !== null) return content.legend.text;
  const weights = content.weightsDefined ? '' : ' No weights are defined for this criterion.';
  return `Δ is the distance from the best ${content.criterionLabel}; evidence bands apply only to likelihood criteria.${weights}`;
}

/** The warning drawn across the top of a record that failed its integrity check; null otherwise. */
export function integrityWarning(content: ChartContent): string | null {
  const integrity = content.integrity;
  if (integrity === null || integrity.ok) return null;
  const finding = integrity.detail.split(/(?<=\.) /)[0];
  return `Integrity check failed (${integrity.reason ?? 'unknown'}): ${finding} Do not rely on this picture; run GET /v1/audit/verify.`;
}

/**
 * The Δ axis. For likelihood criteria it always shows the bands (0 to 12),
 * widening once to 16; larger differences are drawn as broken bars with
 * their value written out, because a linear axis to Δ = 300 would squeeze
 * every band into a sliver. Other criteria scale to their largest Δ.
 */
function axisMaximum(content: ChartContent): number {
  const deltas = content.rows.map((r) => r.delta).filter((d): d is number => d !== null);
  const largest = deltas.length > 0 ? Math.max(...deltas) : 0;
  if (content.bandsApply) return largest <= 12 ? 12 : 16;
  return largest > 0 ? largest : 1;
}

export interface LayoutRequest {
  /** The notes under the strip to make room for (chart-labels.ts decides them from a first layout). */
  notes?: readonly ChartNote[];
  /** Give each row a second line for the band's words, where the height allows. */
  wordLine?: boolean;
}

export function chartLayout(content: ChartContent, width: number, requestedHeight: number | null, request: LayoutRequest = {}): ChartLayout {
  const notes = request.notes ?? [];
  const font = clamp(Math.round(width / 55), 10, 15);
  const smallFont = Math.round(font * 0.85 * 10) / 10;
  const pad = font;
  const gap = font;
  const innerWidth = width - 2 * pad;

  const widestKey = Math.max(1, ...[...content.keys.values()].map((k) => k.length));
  const keyWidth = estimateTextWidth('M'.repeat(widestKey), font * 0.8) + font * 0.5;
  // Without weights (adjusted R², leave-one-out) the Δ panel takes the weight panel's room.
  const weightWidth = content.weightsDefined ? clamp(width * 0.2, 64, 280) : 0;
  // The name column takes what the longest name needs, within a third of the
  // width and never squeezing the Δ panel below 42% of the inner width: on a
  // narrow chart the keys name the models and a note spells them out.
  const longestName = Math.max(0, ...content.rows.map((r) => estimateTextWidth(r.name, font)));
  const nameRoom = innerWidth - weightWidth - gap * (content.weightsDefined ? 2 : 1) - innerWidth * 0.42;
  // (+1: the estimate's own rounding must not cut the longest name it was sized for.)
  const nameWidth = Math.max(keyWidth + font * 1.5, Math.min(keyWidth + font * 0.4 + longestName + 1, width * 0.34, nameRoom));
  const nameX = pad;
  const deltaX = nameX + nameWidth + gap;
  const weightX = width - pad - weightWidth;
  const deltaWidth = weightX - (content.weightsDefined ? gap : 0) - deltaX;

  const warning = integrityWarning(content);
  const warningFont = font * 0.9;
  const warningLineHeight = warningFont * 1.3;
  const warningLines = warning === null ? [] : wrapToWidth(warning, innerWidth - font, warningFont);
  const warningTop = pad * 0.6;
  const headingTop = warningLines.length === 0 ? pad : warningTop + warningLines.length * warningLineHeight + font * 1.1;

  const titleY = headingTop + font;
  const subtitleY = titleY + font * 1.3;
  const legendLineHeight = smallFont * 1.25;
  const legendLines = wrapToWidth(legendText(content), innerWidth, smallFont);
  const legendY = subtitleY + smallFont * 1.45;
  const panelTitleY = legendY + (legendLines.length - 1) * legendLineHeight + font * 1.6;
  const tickY = panelTitleY + smallFont * 1.3;
  const rowsTop = tickY + smallFont * 0.5;

  const cells = Math.max(1, content.cells.length);
  const cellGap = font * 0.4;
  const cellWidth = (innerWidth - (cells - 1) * cellGap) / cells;
  const cellHeight = font * 2.7;
  const notesLineHeight = smallFont * 1.3;
  const notesBlock = notes.length === 0 ? 0 : gap * 0.5 + notesHeight(wrapNotes(notes, innerWidth, smallFont), notesLineHeight);

  const stripBlock = gap * 0.6 + font * 1.5 + cellHeight;
  const fixed = rowsTop + stripBlock + notesBlock + pad;
  const n = Math.max(1, content.rows.length);
  const asked = request.wordLine === true;
  const comfortable = asked ? font * 2.6 : font * 2;
  const smallest = 6;
  const rowHeight =
    requestedHeight === null ? comfortable : clamp((requestedHeight - fixed) / n, smallest, asked ? font * 2.8 : font * 2.4);
  // A line of words under the bar only where the rows can hold it legibly.
  const wordLine = asked && rowHeight >= font * 2.2;
  const rowsBottom = rowsTop + n * rowHeight;
  const rowFont = Math.round(Math.min(font, wordLine ? rowHeight / 2.5 : rowHeight * 0.72) * 10) / 10;

  const stripTitleY = rowsBottom + gap * 0.6 + font;
  const stripTop = stripTitleY + font * 0.5;
  const notesY = stripTop + cellHeight + gap * 0.5 + smallFont;
  const contentHeight = stripTop + cellHeight + notesBlock + pad;

  const height = requestedHeight ?? Math.ceil(contentHeight);
  return {
    width,
    height,
    viewHeight: Math.max(height, Math.ceil(contentHeight)),
    font,
    smallFont,
    rowFont,
    pad,
    warningLines,
    warningTop,
    warningLineHeight,
    warningFont,
    titleY,
    subtitleY,
    legendLines,
    legendY,
    legendLineHeight,
    panelTitleY,
    tickY,
    rowsTop,
    rowHeight,
    rowsBottom,
    wordLine,
    nameX,
    nameWidth,
    keyWidth,
    deltaX,
    deltaWidth,
    deltaScaleWidth: deltaWidth - rowFont * 3.6,
    axisMax: axisMaximum(content),
    weightX,
    weightWidth,
    weightScaleWidth: weightWidth - rowFont * 3.9,
    stripTitleY,
    stripTop,
    cellHeight,
    cellWidth,
    cellGap,
    notesY,
    notesWidth: innerWidth,
    notesLineHeight,
  };
}

/** Where a row's bar sits and where its text lines stand, one line or two (words under the bar). */
export function rowGeometry(layout: ChartLayout, index: number): { y: number; barTop: number; barHeight: number; baseline: number; wordsBaseline: number } {
  const y = layout.rowsTop + index * layout.rowHeight;
  const barTop = y + layout.rowHeight * (layout.wordLine ? 0.1 : 0.2);
  const barHeight = layout.rowHeight * (layout.wordLine ? 0.44 : 0.6);
  const baseline = barTop + barHeight / 2 + layout.rowFont * 0.35;
  return { y, barTop, barHeight, baseline, wordsBaseline: barTop + barHeight + layout.rowFont * 0.95 };
}

export function deltaToX(layout: ChartLayout, delta: number): number {
  return layout.deltaX + (Math.min(delta, layout.axisMax) / layout.axisMax) * layout.deltaScaleWidth;
}

/** A bar's drawn width: a zero difference still gets a sliver, so the best model's bar is visibly there. */
export function barWidthOf(layout: ChartLayout, delta: number): number {
  return Math.max(1.5, deltaToX(layout, delta) - layout.deltaX);
}

/** Where the value text after a bar starts. */
export function valueXOf(layout: ChartLayout, delta: number): number {
  return layout.deltaX + barWidthOf(layout, delta) + layout.rowFont * 0.35;
}

/** A strip box's key badge and the room left beside it for the name. */
export function cellNameGeometry(layout: ChartLayout, key: string): { badgeWidth: number; nameFont: number; nameWidth: number } {
  const nameFont = layout.smallFont;
  const badgeWidth = estimateTextWidth(key, nameFont * 0.8) + nameFont * 0.6;
  return { badgeWidth, nameFont, nameWidth: layout.cellWidth - layout.font * 0.8 - badgeWidth - nameFont * 0.4 };
}
