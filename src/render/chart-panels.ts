// The model rows of the chart: the Δ panel with its band zones and lines,
// the weight panel beside it (sharing the rows), each row named by its key
// and name. The strip and notes below them: chart-strip.ts.
import type { ChartContent, ChartRow } from './chart-content.ts';
import { barWidthOf, deltaToX, rowGeometry, valueXOf, type ChartLayout } from './chart-layout.ts';
import { insideFontScale, rowNameRoom, valueFontScale, type RowLabel } from './chart-labels.ts';
import { bandRange } from './band-legend.ts';
import { formatCriterionDelta, formatPercent } from './number-format.ts';
import { palette } from './palette.ts';
import { element, px, textElement } from './svg-markup.ts';
import { estimateTextWidth, truncateToWidth } from './text-measure.ts';

const zoneFill: Partial<Record<string, string>> = { weaker: palette.zoneWeaker, negligible: palette.zoneNegligible };

/** Shaded zones, the dashed band lines and the axis numbers. */
export function drawBands(content: ChartContent, layout: ChartLayout): string {
  const parts: string[] = [];
  const top = layout.rowsTop;
  const height = layout.rowsBottom - layout.rowsTop;
  const legend = content.legend;
  if (legend !== null) {
    legend.rules.forEach((band, i) => {
      const fill = zoneFill[band.shade];
      const from = i === 0 ? 0 : (legend.rules[i - 1].maxDelta ?? 0);
      if (!fill || from >= layout.axisMax) return;
      const x0 = deltaToX(layout, from);
      const x1 = deltaToX(layout, Math.min(band.maxDelta ?? Infinity, layout.axisMax));
      parts.push(element('rect', { class: 'band-zone', 'data-band': band.band, x: x0, y: top, width: x1 - x0, height, fill }));
    });
    // An axis number that would touch the one before it is left out (its
    // line stays, and its tooltip still names it): at the narrowest widths
    // "0 2 4 7 10" would otherwise run together.
    const gap = layout.smallFont * 0.4;
    let labelledTo = layout.deltaX + estimateTextWidth('0', layout.smallFont) / 2;
    for (const at of legend.lines) {
      const x = deltaToX(layout, at);
      const half = estimateTextWidth(String(at), layout.smallFont) / 2;
      const roomy = x - half >= labelledTo + gap;
      if (roomy) labelledTo = x + half;
      const line = element('line', {
        x1: x, y1: layout.tickY + layout.smallFont * 0.3, x2: x, y2: layout.rowsBottom,
        stroke: palette.mutedInk, 'stroke-width': 0.8, 'stroke-dasharray': '3 2',
      });
      const label = textElement('text', { x, y: layout.tickY, 'text-anchor': 'middle', 'font-size': layout.smallFont, fill: palette.mutedInk }, String(at));
      // The line's tooltip names the band it opens, in the legend's words.
      const opened = legend.rules.findIndex((r) => r.maxDelta === at) + 1;
      const words = opened > 0 && opened < legend.rules.length && legend.words !== 'team-policy'
        ? `${bandRange(legend.rules, opened)}: ${legend.rules[opened].wording}`
        : `Δ = ${at}`;
      const title = textElement('title', {}, words);
      parts.push(element('g', { class: 'band-line', 'data-at': at }, roomy ? [title, line, label] : [title, line]));
    }
  }
  parts.push(textElement('text', { x: layout.deltaX, y: layout.tickY, 'text-anchor': 'middle', 'font-size': layout.smallFont, fill: palette.mutedInk }, '0'));
  if (!content.bandsApply) {
    const end = layout.deltaX + layout.deltaScaleWidth;
    parts.push(textElement('text', { x: end, y: layout.tickY, 'text-anchor': 'middle', 'font-size': layout.smallFont, fill: palette.mutedInk }, formatCriterionDelta(content.criterion, layout.axisMax)));
    parts.push(element('line', { x1: end, y1: top, x2: end, y2: layout.rowsBottom, stroke: palette.faintRule, 'stroke-width': 0.8 }));
  }
  parts.push(element('line', { x1: layout.deltaX, y1: top, x2: layout.deltaX, y2: layout.rowsBottom, stroke: palette.ink, 'stroke-width': 1 }));
  return parts.join('');
}

export function weightHeading(content: ChartContent): string {
  if (!content.weightsDefined) return 'weight: not defined';
  if (content.criterion === 'aic' || content.criterion === 'aicc') return 'Akaike weight';
  return `${content.criterionLabel} weight`;
}

export function drawPanelTitles(content: ChartContent, layout: ChartLayout): string {
  const common = { y: layout.panelTitleY, 'font-size': layout.font * 0.95, fill: palette.ink, 'font-weight': 'bold' };
  return [
    textElement('text', { ...common, x: layout.nameX }, 'model'),
    textElement('text', { ...common, x: layout.deltaX }, truncateToWidth(`Δ ${content.criterionLabel} from best`, layout.deltaWidth, layout.font * 0.95)),
    content.weightsDefined ? textElement('text', { ...common, x: layout.weightX }, truncateToWidth(weightHeading(content), layout.weightWidth, layout.font * 0.95)) : '',
  ].join('');
}

function rowTitle(row: ChartRow, content: ChartContent): string {
  const band = row.bandWording ? `, ${row.bandWording}` : '';
  const weight = row.weight === null ? '' : `, weight ${formatPercent(row.weight)}`;
  return `${row.key} ${row.name}: Δ ${content.criterionLabel} ${formatCriterionDelta(content.criterion, row.delta)}${band}${weight}`;
}

/** A halo in the paper's colour keeps text legible where it crosses a band line. */
const halo = { stroke: palette.paper, 'stroke-width': 2.5, 'stroke-linejoin': 'round', 'paint-order': 'stroke' } as const;

function drawDeltaBar(row: ChartRow, label: RowLabel, content: ChartContent, layout: ChartLayout, index: number): string {
  const { barTop, barHeight, baseline, wordsBaseline } = rowGeometry(layout, index);
  const children = [textElement('title', {}, rowTitle(row, content))];
  if (row.delta === null) {
    children.push(textElement('text', { x: layout.deltaX + layout.rowFont * 0.4, y: baseline, 'font-size': layout.rowFont, 'font-style': 'italic', fill: palette.mutedInk }, 'no value'));
  } else {
    const barWidth = barWidthOf(layout, row.delta);
    children.push(element('rect', { x: layout.deltaX, y: barTop, width: barWidth, height: barHeight, fill: palette.deltaBar }));
    if (row.delta > layout.axisMax) {
      // A paper-coloured slant across the bar's end says "broken: longer than drawn".
      const bx = layout.deltaX + barWidth - layout.rowFont * 0.9;
      const by = barTop;
      children.push(element('path', {
        class: 'axis-break',
        d: `M${px(bx)} ${px(by + barHeight + 1)}L${px(bx + 3)} ${px(by - 1)}L${px(bx + 6)} ${px(by - 1)}L${px(bx + 3)} ${px(by + barHeight + 1)}Z`,
        fill: palette.paper,
      }));
    }
    const after = label.wordsAt === 'after' ? `${label.value} · ${label.words}` : String(label.value);
    children.push(textElement('text', { class: 'delta-value', x: valueXOf(layout, row.delta), y: baseline, 'font-size': layout.rowFont * valueFontScale, fill: palette.ink, ...halo }, after));
    if (label.wordsAt === 'inside') {
      children.push(textElement('text', { class: 'band-words', x: layout.deltaX + layout.rowFont * 0.4, y: baseline, 'font-size': layout.rowFont * insideFontScale, fill: palette.paper }, String(label.words)));
    } else if (label.wordsAt === 'below') {
      children.push(textElement('text', { class: 'band-words', x: layout.deltaX + layout.rowFont * 0.2, y: wordsBaseline, 'font-size': layout.rowFont * insideFontScale, fill: palette.mutedInk, ...halo }, String(label.words)));
    }
  }
  return element('g', {
    class: 'delta-bar', 'data-model': row.name, 'data-key': row.key,
    'data-delta': row.delta === null ? 'none' : formatCriterionDelta(content.criterion, row.delta),
    'data-words': label.wordsAt,
  }, children);
}

function drawWeightBar(row: ChartRow, layout: ChartLayout, index: number): string {
  const { barTop, barHeight, baseline } = rowGeometry(layout, index);
  const y = barTop + barHeight * 0.15;
  const height = barHeight * 0.7;
  if (row.weight === null) {
    return element('g', { class: 'weight-bar', 'data-model': row.name }, textElement('text', { x: layout.weightX + layout.rowFont * 0.4, y: baseline, 'font-size': layout.rowFont * 0.9, 'font-style': 'italic', fill: palette.mutedInk }, 'n/a'));
  }
  const weight = Math.min(1, Math.max(0, row.weight));
  const barWidth = Math.max(weight > 0 ? 1 : 0, weight * layout.weightScaleWidth);
  const track = element('rect', { x: layout.weightX, y, width: layout.weightScaleWidth, height, fill: 'none', stroke: palette.faintRule, 'stroke-width': 0.8 });
  const bar = element('rect', { x: layout.weightX, y, width: barWidth, height, fill: palette.weightBar });
  const text = textElement('text', { x: layout.weightX + layout.weightScaleWidth + layout.rowFont * 0.35, y: baseline, 'font-size': layout.rowFont * 0.9, fill: palette.ink }, formatPercent(row.weight));
  return element('g', { class: 'weight-bar', 'data-model': row.name }, [track, bar, text]);
}

/** A model's key in a small outlined box: the same mark in its row and in the strip. */
export function keyBadge(key: string, x: number, baseline: number, font: number, width: number): string {
  const height = font * 1.25;
  return [
    element('rect', { x, y: baseline - font * 0.95, width, height, rx: font * 0.2, fill: palette.paper, stroke: palette.ink, 'stroke-width': 0.7 }),
    textElement('text', { x: x + width / 2, y: baseline, 'text-anchor': 'middle', 'font-size': font * 0.8, 'font-weight': 'bold', fill: palette.ink }, key),
  ].join('');
}

function drawName(row: ChartRow, label: RowLabel, layout: ChartLayout, baseline: number): string {
  const font = layout.rowFont;
  const nameX = layout.nameX + layout.keyWidth + font * 0.4;
  return element('g', { class: 'model-name', 'data-shortened': label.shortened ? 'yes' : 'no', 'data-room': px(rowNameRoom(layout)) }, [
    textElement('title', {}, `${row.key} ${row.name}`),
    keyBadge(row.key, layout.nameX, baseline, font, layout.keyWidth - font * 0.15),
    textElement('text', { class: 'name-text', x: nameX, y: baseline, 'font-size': font, fill: palette.ink }, label.shownName),
  ]);
}

export function drawRows(content: ChartContent, layout: ChartLayout, labels: readonly RowLabel[]): string {
  return content.rows
    .map((row, i) => {
      const { baseline } = rowGeometry(layout, i);
      const parts = [drawName(row, labels[i], layout, baseline), drawDeltaBar(row, labels[i], content, layout, i)];
      if (content.weightsDefined) parts.push(drawWeightBar(row, layout, i));
      return element('g', { class: 'model-row', 'data-model': row.name, 'data-key': row.key }, parts);
    })
    .join('');
}
