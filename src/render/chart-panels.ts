// The three parts of the chart: the Δ panel with its band zones and lines,
// the weight panel beside it (sharing the model rows), and the strip of the
// model each criterion prefers.
import type { ChartContent, ChartRow } from './chart-content.ts';
import type { ChartLayout } from './chart-layout.ts';
import { bandRange } from './band-legend.ts';
import { formatCriterionDelta, formatPercent } from './number-format.ts';
import { palette } from './palette.ts';
import { element, px, textElement } from './svg-markup.ts';
import { estimateTextWidth, truncateToWidth } from './text-measure.ts';

const zoneFill: Partial<Record<string, string>> = { weaker: palette.zoneWeaker, negligible: palette.zoneNegligible };

function deltaToX(layout: ChartLayout, delta: number): number {
  return layout.deltaX + (Math.min(delta, layout.axisMax) / layout.axisMax) * layout.deltaScaleWidth;
}

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
    for (const at of legend.lines) {
      const x = deltaToX(layout, at);
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
      parts.push(element('g', { class: 'band-line', 'data-at': at }, [title, line, label]));
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
    textElement('text', { ...common, x: layout.nameX + layout.nameWidth, 'text-anchor': 'end' }, 'model'),
    textElement('text', { ...common, x: layout.deltaX }, truncateToWidth(`Δ ${content.criterionLabel} from best`, layout.deltaWidth, layout.font * 0.95)),
    content.weightsDefined ? textElement('text', { ...common, x: layout.weightX }, truncateToWidth(weightHeading(content), layout.weightWidth, layout.font * 0.95)) : '',
  ].join('');
}

function rowTitle(row: ChartRow, content: ChartContent): string {
  const band = row.bandWording ? `, ${row.bandWording}` : '';
  const weight = row.weight === null ? '' : `, weight ${formatPercent(row.weight)}`;
  return `${row.name}: Δ ${content.criterionLabel} ${formatCriterionDelta(content.criterion, row.delta)}${band}${weight}`;
}

function drawDeltaBar(row: ChartRow, content: ChartContent, layout: ChartLayout, y: number, baseline: number): string {
  const children = [textElement('title', {}, rowTitle(row, content))];
  if (row.delta === null) {
    children.push(textElement('text', { x: layout.deltaX + layout.rowFont * 0.4, y: baseline, 'font-size': layout.rowFont, 'font-style': 'italic', fill: palette.mutedInk }, 'no value'));
  } else {
    const end = deltaToX(layout, row.delta);
    // A zero difference still gets a sliver, so the best model's bar is visibly there.
    const barWidth = Math.max(1.5, end - layout.deltaX);
    const barHeight = layout.rowHeight * 0.6;
    children.push(element('rect', { x: layout.deltaX, y: y + layout.rowHeight * 0.2, width: barWidth, height: barHeight, fill: palette.deltaBar }));
    if (row.delta > layout.axisMax) {
      // A paper-coloured slant across the bar's end says "broken: longer than drawn".
      const bx = layout.deltaX + barWidth - layout.rowFont * 0.9;
      const by = y + layout.rowHeight * 0.2;
      children.push(element('path', {
        class: 'axis-break',
        d: `M${px(bx)} ${px(by + barHeight + 1)}L${px(bx + 3)} ${px(by - 1)}L${px(bx + 6)} ${px(by - 1)}L${px(bx + 3)} ${px(by + barHeight + 1)}Z`,
        fill: palette.paper,
      }));
    }
    const valueX = layout.deltaX + barWidth + layout.rowFont * 0.35;
    const value = formatCriterionDelta(content.criterion, row.delta);
    const withBand = row.bandWording ? `${value} · ${row.bandWording}` : value;
    const room = layout.deltaX + layout.deltaWidth - valueX;
    const label = estimateTextWidth(withBand, layout.rowFont * 0.9) <= room ? withBand : value;
    // A thin paper-coloured halo keeps the value legible where it crosses a band line.
    children.push(textElement('text', { x: valueX, y: baseline, 'font-size': layout.rowFont * 0.9, fill: palette.ink, stroke: palette.paper, 'stroke-width': 2.5, 'stroke-linejoin': 'round', 'paint-order': 'stroke' }, label));
  }
  return element('g', { class: 'delta-bar', 'data-model': row.name, 'data-delta': row.delta === null ? 'none' : formatCriterionDelta(content.criterion, row.delta) }, children);
}

function drawWeightBar(row: ChartRow, layout: ChartLayout, y: number, baseline: number): string {
  if (row.weight === null) {
    return element('g', { class: 'weight-bar', 'data-model': row.name }, textElement('text', { x: layout.weightX + layout.rowFont * 0.4, y: baseline, 'font-size': layout.rowFont * 0.9, 'font-style': 'italic', fill: palette.mutedInk }, 'n/a'));
  }
  const weight = Math.min(1, Math.max(0, row.weight));
  const barWidth = Math.max(weight > 0 ? 1 : 0, weight * layout.weightScaleWidth);
  const track = element('rect', { x: layout.weightX, y: y + layout.rowHeight * 0.3, width: layout.weightScaleWidth, height: layout.rowHeight * 0.4, fill: 'none', stroke: palette.faintRule, 'stroke-width': 0.8 });
  const bar = element('rect', { x: layout.weightX, y: y + layout.rowHeight * 0.3, width: barWidth, height: layout.rowHeight * 0.4, fill: palette.weightBar });
  const text = textElement('text', { x: layout.weightX + layout.weightScaleWidth + layout.rowFont * 0.35, y: baseline, 'font-size': layout.rowFont * 0.9, fill: palette.ink }, formatPercent(row.weight));
  return element('g', { class: 'weight-bar', 'data-model': row.name }, [track, bar, text]);
}

export function drawRows(content: ChartContent, layout: ChartLayout): string {
  return content.rows
    .map((row, i) => {
      const y = layout.rowsTop + i * layout.rowHeight;
      const baseline = y + layout.rowHeight / 2 + layout.rowFont * 0.35;
      const shown = truncateToWidth(row.name, layout.nameWidth, layout.rowFont);
      const name = element('text', { x: layout.nameX + layout.nameWidth, y: baseline, 'text-anchor': 'end', 'font-size': layout.rowFont, fill: palette.ink }, [
        textElement('title', {}, row.name),
        textElement('tspan', {}, shown),
      ]);
      const parts = [name, drawDeltaBar(row, content, layout, y, baseline)];
      if (content.weightsDefined) parts.push(drawWeightBar(row, layout, y, baseline));
      return element('g', { class: 'model-row', 'data-model': row.name }, parts);
    })
    .join('');
}

/** Fills for the strip's swatches: solid, then patterns that stay distinct in grey. */
export function swatchPatterns(prefix: string, groups: number): string {
  const size = 6;
  const shapes = [
    element('rect', { width: 2.4, height: size, fill: palette.ink }),
    element('circle', { cx: 3, cy: 3, r: 1.4, fill: palette.ink }),
    element('rect', { width: size, height: 2, fill: palette.ink }),
    [element('rect', { width: 1.6, height: size, fill: palette.ink }), element('rect', { width: size, height: 1.6, fill: palette.ink })].join(''),
  ];
  const defs: string[] = [];
  for (let g = 1; g < groups; g++) {
    const shape = shapes[(g - 1) % shapes.length];
    const rotate = (g - 1) % shapes.length === 0 || (g - 1) % shapes.length === 3 ? 'rotate(45)' : null;
    defs.push(element('pattern', { id: `${prefix}-swatch-${g}`, width: size, height: size, patternUnits: 'userSpaceOnUse', patternTransform: rotate }, [
      element('rect', { width: size, height: size, fill: palette.paper }),
      shape,
    ]));
  }
  return defs.length === 0 ? '' : element('defs', {}, defs);
}

export function stripHeading(content: ChartContent): string {
  if (content.cells.length <= 1) return 'Preferred model';
  return content.distinctPreferred <= 1
    ? 'Preferred model by criterion: all agree'
    : `Preferred model by criterion: ${content.distinctPreferred} different models`;
}

export function drawStrip(content: ChartContent, layout: ChartLayout, prefix: string): string {
  const parts = [textElement('text', { x: layout.pad, y: layout.stripTitleY, 'font-size': layout.font * 0.95, 'font-weight': 'bold', fill: palette.ink }, stripHeading(content))];
  content.cells.forEach((cell, i) => {
    const x = layout.pad + i * (layout.cellWidth + layout.cellGap);
    const y = layout.stripTop;
    const swatchFill = cell.group <= 0 ? (cell.group === 0 ? palette.ink : palette.faintRule) : `url(#${prefix}-swatch-${cell.group})`;
    const model = cell.model ?? 'no model';
    const nameFont = layout.smallFont;
    const textX = x + layout.font * 0.4;
    const textWidth = layout.cellWidth - layout.font * 0.8;
    parts.push(element('g', { class: 'strip-cell', 'data-criterion': cell.criterion, 'data-model': model, 'data-group': cell.group }, [
      textElement('title', {}, `${cell.criterionLabel} prefers ${model}`),
      element('rect', { x, y, width: layout.cellWidth, height: layout.cellHeight, fill: palette.paper, stroke: palette.rule, 'stroke-width': 0.8 }),
      element('rect', { x, y, width: layout.cellWidth, height: layout.font * 0.45, fill: swatchFill, stroke: palette.ink, 'stroke-width': 0.5 }),
      textElement('text', { x: textX, y: y + layout.font * 1.35, 'font-size': nameFont * 0.92, fill: palette.mutedInk }, truncateToWidth(cell.criterionLabel, textWidth, nameFont * 0.92)),
      textElement('text', { x: textX, y: y + layout.font * 2.3, 'font-size': nameFont, 'font-weight': 'bold', fill: palette.ink }, truncateToWidth(model, textWidth, nameFont * 1.08)),
    ]));
  });
  return parts.join('');
}
