// Below the model rows: the strip naming the model each criterion of the
// verdict prefers (the criteria the verdict's sentence counts, so the two tell
// one story), and the notes the labels called for (chart-labels.ts).
import type { ChartContent } from './chart-content.ts';
import { cellNameGeometry, wrapNotes, type ChartLayout } from './chart-layout.ts';
import type { CellLabel, ChartNote } from './chart-labels.ts';
import { keyBadge } from './chart-panels.ts';
import { palette } from './palette.ts';
import { element, textElement } from './svg-markup.ts';
import { truncateToWidth } from './text-measure.ts';

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
  const n = content.cells.length;
  if (n <= 1) return 'Best by the verdict\'s criterion';
  const counted = `Best by each of the verdict's ${n} criteria`;
  return content.distinctPreferred <= 1 ? `${counted}: all agree` : `${counted}: ${content.distinctPreferred} different models`;
}

export function drawStrip(content: ChartContent, layout: ChartLayout, prefix: string, labels: readonly CellLabel[]): string {
  const heading = truncateToWidth(stripHeading(content), layout.width - 2 * layout.pad, layout.font * 0.95);
  const parts = [textElement('text', { x: layout.pad, y: layout.stripTitleY, 'font-size': layout.font * 0.95, 'font-weight': 'bold', fill: palette.ink }, heading)];
  content.cells.forEach((cell, i) => {
    const x = layout.pad + i * (layout.cellWidth + layout.cellGap);
    const y = layout.stripTop;
    const swatchFill = cell.group <= 0 ? (cell.group === 0 ? palette.ink : palette.faintRule) : `url(#${prefix}-swatch-${cell.group})`;
    const model = cell.model ?? 'no model';
    const textX = x + layout.font * 0.4;
    const { badgeWidth, nameFont } = cellNameGeometry(layout, cell.key ?? '');
    const nameLine = y + layout.font * 2.3;
    const nameX = cell.key === null ? textX : textX + badgeWidth + nameFont * 0.35;
    const label = labels[i];
    parts.push(element('g', { class: 'strip-cell', 'data-criterion': cell.criterion, 'data-model': model, 'data-key': cell.key, 'data-group': cell.group, 'data-shortened': label.shortened ? 'yes' : 'no' }, [
      textElement('title', {}, `${cell.criterionLabel} prefers ${cell.key === null ? '' : `${cell.key} `}${model}`),
      element('rect', { x, y, width: layout.cellWidth, height: layout.cellHeight, fill: palette.paper, stroke: palette.rule, 'stroke-width': 0.8 }),
      element('rect', { x, y, width: layout.cellWidth, height: layout.font * 0.45, fill: swatchFill, stroke: palette.ink, 'stroke-width': 0.5 }),
      textElement('text', { x: textX, y: y + layout.font * 1.35, 'font-size': nameFont * 0.92, fill: palette.mutedInk }, truncateToWidth(cell.criterionLabel, layout.cellWidth - layout.font * 0.8, nameFont * 0.92)),
      cell.key === null ? '' : keyBadge(cell.key, textX, nameLine, nameFont, badgeWidth),
      textElement('text', { class: 'name-text', x: nameX, y: nameLine, 'font-size': nameFont, 'font-weight': 'bold', fill: palette.ink }, label.shownName),
    ]));
  });
  return parts.join('');
}

/** The notes the labels called for, one text element each: the model key spelled out, band words left out. */
export function drawNotes(layout: ChartLayout, notes: readonly ChartNote[]): string {
  let y = layout.notesY;
  return wrapNotes(notes, layout.notesWidth, layout.smallFont).map((note) => {
    const lines = note.lines.map((line, i) => {
      // The space kept at the end of wrapped lines lets copied or spoken text read on.
      const tspan = textElement('tspan', { x: layout.pad, y }, i < note.lines.length - 1 ? `${line} ` : line);
      y += layout.notesLineHeight;
      return tspan;
    });
    y += layout.notesLineHeight * 0.3;
    return element('text', { class: note.kind === 'model-key' ? 'model-key' : 'words-note', 'font-size': layout.smallFont, fill: palette.ink }, lines);
  }).join('');
}
