// Geometry of the chart for a requested size: one row per model spanning a
// name column, the Δ panel and the weight panel, under a heading and a band
// legend, over the strip of preferred models. Everything scales from one base
// font size, which itself follows the width, so a dashboard tile and a
// printed page both stay legible.
import type { ChartContent } from './chart-content.ts';
import { wrapToWidth } from './text-measure.ts';

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
  nameX: number;
  nameWidth: number;
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
}

const clamp = (x: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, x));

export function legendText(content: ChartContent): string {
  if (content.legend !== null) return content.legend.text;
  const weights = content.weightsDefined ? '' : ' No weights are defined for this criterion.';
  return `Δ is the distance from the best ${content.criterionLabel}; evidence bands apply only to likelihood criteria.${weights}`;
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

export function chartLayout(content: ChartContent, width: number, requestedHeight: number | null): ChartLayout {
  const font = clamp(Math.round(width / 55), 10, 15);
  const smallFont = Math.round(font * 0.85 * 10) / 10;
  const pad = font;
  const gap = font;
  const innerWidth = width - 2 * pad;

  const nameWidth = clamp(width * 0.24, 60, 280);
  // Without weights (adjusted R²) the Δ panel takes the weight panel's room.
  const weightWidth = content.weightsDefined ? clamp(width * 0.22, 64, 300) : 0;
  const nameX = pad;
  const deltaX = nameX + nameWidth + gap;
  const weightX = width - pad - weightWidth;
  const deltaWidth = weightX - (content.weightsDefined ? gap : 0) - deltaX;

  const titleY = pad + font;
  const subtitleY = titleY + font * 1.3;
  const legendLineHeight = smallFont * 1.25;
  const legendLines = wrapToWidth(legendText(content), innerWidth, smallFont);
  const legendY = subtitleY + smallFont * 1.45;
  const panelTitleY = legendY + (legendLines.length - 1) * legendLineHeight + font * 1.6;
  const tickY = panelTitleY + smallFont * 1.3;
  const rowsTop = tickY + smallFont * 0.5;

  const stripBlock = gap * 0.6 + font * 1.4 + font * 2.8;
  const fixed = rowsTop + stripBlock + pad;
  const n = Math.max(1, content.rows.length);
  const comfortable = font * 2;
  const smallest = 6;
  const rowHeight =
    requestedHeight === null ? comfortable : clamp((requestedHeight - fixed) / n, smallest, font * 2.4);
  const rowsBottom = rowsTop + n * rowHeight;
  const rowFont = Math.round(Math.min(font, rowHeight * 0.72) * 10) / 10;

  const stripTitleY = rowsBottom + gap * 0.6 + font;
  const stripTop = stripTitleY + font * 0.5;
  const cellHeight = font * 2.6;
  const contentHeight = stripTop + cellHeight + pad;
  const cells = Math.max(1, content.cells.length);
  const cellGap = font * 0.4;
  const cellWidth = (innerWidth - (cells - 1) * cellGap) / cells;

  const height = requestedHeight ?? Math.ceil(contentHeight);
  return {
    width,
    height,
    viewHeight: Math.max(height, Math.ceil(contentHeight)),
    font,
    smallFont,
    rowFont,
    pad,
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
    nameX,
    nameWidth,
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
  };
}
