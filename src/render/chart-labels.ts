// What each label of the chart says at a given size, decided before drawing,
// so the notes under the chart can say what was shortened or left out.
// - Names: each row and each strip box shows the model's key (A, B, …) and as
//   much of its name as fits on one line. The key alone names the model
//   unambiguously; the rows say which name each key stands for, and whenever
//   a row's name is shortened, a note spells out every key with its full name.
// - Band words: after the bar's value when they fit there; else inside the bar
//   (the value stays after it) when the bar is long enough. When some bar's
//   words fit neither, the rows get a second line and every bar's words go
//   under it, where the width of both panels is theirs; only where even that is
//   impossible (a fixed height too small for two lines, words wider than the
//   panel) are they left out, and a note says how many, since the dashed lines
//   and shading still place each bar in its band. The bar's tooltip and the
//   chart's description always carry the words.
import type { ChartContent } from './chart-content.ts';
import { barWidthOf, cellNameGeometry, valueXOf, type ChartLayout } from './chart-layout.ts';
import { formatCriterionDelta } from './number-format.ts';
import { estimateTextWidth, truncateToWidth } from './text-measure.ts';

export type WordsPlace = 'after' | 'inside' | 'below' | 'omitted' | 'none';

export interface RowLabel {
  /** The name as drawn (possibly shortened with an ellipsis). */
  shownName: string;
  shortened: boolean;
  /** The Δ as text; null for a model without a value. */
  value: string | null;
  words: string | null;
  wordsAt: WordsPlace;
}

export interface CellLabel {
  shownName: string;
  shortened: boolean;
}

export interface ChartNote {
  kind: 'model-key' | 'band-words';
  text: string;
}

export interface ChartLabels {
  rows: RowLabel[];
  cells: CellLabel[];
  notes: ChartNote[];
}

/** Size of the text after and inside bars, relative to the row font. */
export const valueFontScale = 0.9;
export const insideFontScale = 0.85;

/** Room for the name beside its key badge in a row. */
export function rowNameRoom(layout: ChartLayout): number {
  return layout.nameWidth - layout.keyWidth - layout.rowFont * 0.4;
}

/** Room inside a bar for words, clear of its ends (and of the break mark of a broken bar). */
export function insideRoom(layout: ChartLayout, delta: number): number {
  const broken = delta > layout.axisMax ? layout.rowFont * 1.2 : 0;
  return barWidthOf(layout, delta) - layout.rowFont * 0.8 - broken;
}

function rowLabel(content: ChartContent, layout: ChartLayout, index: number): RowLabel {
  const row = content.rows[index];
  const shownName = truncateToWidth(row.name, rowNameRoom(layout), layout.rowFont);
  const shortened = shownName !== row.name;
  if (row.delta === null) return { shownName, shortened, value: null, words: null, wordsAt: 'none' };
  const value = formatCriterionDelta(content.criterion, row.delta);
  const words = row.bandWording;
  if (words === null) return { shownName, shortened, value, words, wordsAt: 'none' };
  if (layout.wordLine) {
    // The line under the bar runs on under the weight panel, which only uses the bar's line.
    const fits = estimateTextWidth(words, layout.rowFont * insideFontScale) <= layout.width - layout.pad - layout.deltaX;
    return { shownName, shortened, value, words, wordsAt: fits ? 'below' : 'omitted' };
  }
  const after = layout.deltaX + layout.deltaWidth - valueXOf(layout, row.delta);
  if (estimateTextWidth(`${value} · ${words}`, layout.rowFont * valueFontScale) <= after) return { shownName, shortened, value, words, wordsAt: 'after' };
  if (estimateTextWidth(words, layout.rowFont * insideFontScale) <= insideRoom(layout, row.delta)) return { shownName, shortened, value, words, wordsAt: 'inside' };
  return { shownName, shortened, value, words, wordsAt: 'omitted' };
}

function cellLabel(content: ChartContent, layout: ChartLayout, index: number): CellLabel {
  const cell = content.cells[index];
  if (cell.model === null) return { shownName: 'no model', shortened: false };
  const { nameFont, nameWidth } = cellNameGeometry(layout, cell.key ?? '');
  // Bold type runs about 8% wider than the estimate's regular glyphs.
  const shownName = truncateToWidth(cell.model, nameWidth, nameFont * 1.08);
  return { shownName, shortened: shownName !== cell.model };
}

/** The model key spelled out: "A temperature · B curved-temperature · …". */
export function keyNote(content: ChartContent): string {
  return `Models: ${[...content.keys].map(([name, key]) => `${key}\u00a0${name}`).join(' · ')}`;
}

export function chartLabels(content: ChartContent, layout: ChartLayout): ChartLabels {
  const rows = content.rows.map((_, i) => rowLabel(content, layout, i));
  const cells = content.cells.map((_, i) => cellLabel(content, layout, i));
  const notes: ChartNote[] = [];
  if (rows.some((r) => r.shortened)) notes.push({ kind: 'model-key', text: keyNote(content) });
  const omitted = rows.filter((r) => r.wordsAt === 'omitted').length;
  if (omitted > 0) {
    notes.push({ kind: 'band-words', text: `Band words left out beside ${omitted} bar${omitted === 1 ? '' : 's'} for lack of room: the dashed lines and shading place each bar in its band.` });
  }
  return { rows, cells, notes };
}

/**
 * The notes to draw after the second pass: the model key whenever room was
 * made for it (always true, and the room is there), and the band-words note
 * only as the final labels need it (its count must be theirs).
 */
export function settledNotes(drafted: readonly ChartNote[], final: readonly ChartNote[]): ChartNote[] {
  return [...drafted.filter((n) => n.kind === 'model-key'), ...final.filter((n) => n.kind === 'band-words')];
}
