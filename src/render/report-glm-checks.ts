// The checks that belong to a generalised linear model's family — overdispersion
// (Pearson χ² / residual df) and standardised deviance residuals — as one table
// beside the residual diagnostics, a row per generalised linear model, each
// check's note said once below it.
import { fragment, tag, type Html } from './html-markup.ts';
import { finiteOrNull, formatPValue, formatSignificant } from './number-format.ts';
import type { ModelView } from './types.ts';

type Obj = Record<string, unknown>;
const isObject = (v: unknown): v is Obj => v !== null && typeof v === 'object' && !Array.isArray(v);
const part = (d: Obj, key: string): Obj => (isObject(d[key]) ? (d[key] as Obj) : {});
const screening = (value: unknown): string => formatSignificant(value, 'n/a', 3);

function cell(value: string, passed: unknown): Html {
  if (passed === false) return tag('td', { class: 'flagged' }, `${value} · flagged`);
  return tag('td', {}, value);
}

function overdispersionCell(o: Obj): Html {
  const ratio = finiteOrNull(o.ratio);
  if (ratio === null) return tag('td', {}, 'n/a');
  const limit = finiteOrNull(o.threshold);
  return cell(limit === null ? screening(ratio) : `${screening(ratio)} (limit ${screening(limit)})`, o.passed);
}

function residualCell(r: Obj): Html {
  const largest = finiteOrNull(r.maxAbsolute);
  if (largest === null) return tag('td', {}, 'n/a');
  const row = finiteOrNull(r.maxAbsoluteRow);
  return cell(row === null ? screening(largest) : `${screening(largest)} (row ${row})`, r.passed);
}

/** The family's checks of every generalised linear model that has them; null when none has. */
export function glmChecksTable(models: readonly ModelView[]): Html | null {
  const withChecks = models.flatMap((m) => {
    const d = m.diagnostics;
    return isObject(d) && isObject(d.glm) ? [[m, d.glm as Obj] as const] : [];
  });
  if (withChecks.length === 0) return null;
  const rows = withChecks.map(([m, g]) => {
    const o = part(g, 'overdispersion');
    const r = part(g, 'devianceResiduals');
    const beyond = finiteOrNull(r.largeRows);
    return tag('tr', { 'data-model': m.name },
      tag('td', { class: 'name' }, m.name),
      overdispersionCell(o),
      tag('td', {}, formatPValue(o.pValue)),
      residualCell(r),
      tag('td', {}, beyond === null ? 'n/a' : `${beyond} beyond ±${screening(r.threshold)}`),
    );
  });
  const notes = [...new Set(withChecks.flatMap(([, g]) => [part(g, 'overdispersion').note, part(g, 'devianceResiduals').note])
    .filter((n): n is string => typeof n === 'string' && n !== ''))];
  return fragment(
    tag('h3', {}, 'Checks of the family (generalised linear models)'),
    tag('div', { class: 'table-wrap' }, tag('table', { 'data-section': 'glm-checks' },
      tag('thead', {}, tag('tr', {},
        tag('th', { scope: 'col', class: 'name' }, 'model'),
        tag('th', { scope: 'col' }, 'Pearson χ² / df'),
        tag('th', { scope: 'col' }, 'goodness-of-fit p'),
        tag('th', { scope: 'col' }, 'largest |standardised deviance residual|'),
        tag('th', { scope: 'col' }, 'rows beyond'),
      )),
      tag('tbody', {}, ...rows),
    )),
    notes.length === 0 ? null : tag('ul', { class: 'cautions', 'data-section': 'glm-check-notes' }, ...notes.map((n) => tag('li', {}, n))),
  );
}
