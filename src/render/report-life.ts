// The report's life-data section: survival probabilities of the life models
// without terms (options.survivalAt), and the picture stored with a
// comparison that has life models (the same SVG as
// GET /v1/comparisons/{id}/life.svg at the report's width), with what it
// shows in words. Each part is absent when the record has none.
import { fragment, raw, tag, type Html } from './html-markup.ts';
import { finiteOrNull, formatPercent, formatSignificant } from './number-format.ts';
import { breakableName, table, type Column } from './report-table.ts';
import { renderLifeChartSvg } from './life-chart.ts';
import { storedLifePicture } from './life-view.ts';
import type { StoredComparisonView } from './types.ts';

interface SurvivalRow { model: string; time: number | null; estimate: number | null; lower: number | null; upper: number | null }

function survivalTable(record: StoredComparisonView): Html | null {
  const rows: SurvivalRow[] = (record.result.models ?? []).flatMap((m) => {
    const listed = (m as { survival?: unknown }).survival;
    return (Array.isArray(listed) ? listed : []).filter((s) => s !== null && typeof s === 'object').map((s) => ({
      model: m.name, time: finiteOrNull(s.time), estimate: finiteOrNull(s.estimate), lower: finiteOrNull(s.lower), upper: finiteOrNull(s.upper),
    }));
  });
  if (rows.length === 0) return null;
  const columns: Column<SurvivalRow>[] = [
    { heading: 'model', cell: (r) => breakableName(r.model), className: 'name' },
    { heading: 'time', cell: (r) => formatSignificant(r.time) },
    { heading: 'surviving', cell: (r) => (r.estimate === null ? 'n/a' : formatPercent(r.estimate)) },
    { heading: 'lower', cell: (r) => (r.lower === null ? 'n/a' : formatPercent(r.lower)) },
    { heading: 'upper', cell: (r) => (r.upper === null ? 'n/a' : formatPercent(r.upper)) },
  ];
  return table('Survival: the share of units still working at each time, with its interval', columns, rows, (r) => ({ 'data-model': r.model }), { id: 'survival' });
}

export function lifePictureSection(record: StoredComparisonView): Html | null {
  const survival = survivalTable(record);
  const picture = storedLifePicture(record.result as unknown as Record<string, unknown>);
  if (!picture) return survival;
  const svg = renderLifeChartSvg({ title: 'Fraction failed: the data against the fitted life models', picture, width: 720, height: 440 });
  const averaged = picture.curves.filter((c) => c.reference === 'rowAverage').map((c) => c.model);
  const how = picture.estimate.method === 'kaplanMeier'
    ? 'The step line is the Kaplan–Meier estimate from the data (every row exact or right-censored), with its band; ticks mark right-censored units.'
    : "The line is Turnbull's estimate from the data (some rows left- or interval-censored); inside each shaded box it is not determined.";
  return fragment(
    survival,
    tag('h3', { id: 'life-picture' }, 'Life data against the fitted distributions'),
    tag('p', { class: 'note' }, `${how} Each other line is a fitted distribution's fraction failed${averaged.length > 0 ? `; ${averaged.join(', ')} ${averaged.length === 1 ? 'has' : 'have'} terms and ${averaged.length === 1 ? 'is' : 'are'} drawn averaged over the comparison's rows` : ''}. A picture of fit, like the criteria, does not validate a life model.`),
    tag('figure', { class: 'chart life-chart', style: 'margin:0' }, raw(svg.trim())),
  );
}
