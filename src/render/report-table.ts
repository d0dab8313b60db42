// One way to write the report's tables, and one way to write a model's name
// in them: names are usually one long word ("curve+moisture+kiln+hold"), so
// they may break only after the characters people join their parts with,
// never inside a part (the style sheet breaks a part only when it alone is
// wider than its column).
import { fragment, raw, tag, text, type Html } from './html-markup.ts';

export interface Column<Row> {
  heading: string;
  cell: (row: Row) => string | Html;
  className?: string;
}

export function table<Row>(
  caption: string | null,
  columns: Column<Row>[],
  rows: readonly Row[],
  rowAttrs: (row: Row) => Record<string, string | null>,
  attrs: Record<string, string> = {},
): Html {
  const head = tag('thead', {}, tag('tr', {}, ...columns.map((c) => tag('th', { scope: 'col', class: c.className }, c.heading))));
  const body = tag('tbody', {}, ...rows.map((r) => tag('tr', rowAttrs(r), ...columns.map((c) => tag('td', { class: c.className }, c.cell(r))))));
  return tag('div', { class: 'table-wrap' }, tag('table', attrs, caption === null ? null : tag('caption', {}, caption), head, body));
}

/** A name with a line-break opportunity (<wbr>) after each joining character: + _ / . , ; : × and after spaces. */
export function breakableName(name: unknown): Html {
  const parts = String(name).match(/[^+_/.,;:×\s]*(?:[+_/.,;:×\s]+|$)/gu)?.filter((p) => p !== '') ?? [String(name)];
  return fragment(...parts.flatMap((part, i) => (i < parts.length - 1 ? [text(part), raw('<wbr>')] : [text(part)])));
}

/** A list of facts (a term and its value per line), as the report's header and sections use. */
export function factsList(entries: [string, Html | string][], attrs: Record<string, string> = {}): Html {
  return tag('dl', { class: 'facts', ...attrs }, ...entries.flatMap(([k, v]) => [tag('dt', {}, k), tag('dd', {}, v)]));
}
