// The report's life-data section: the picture stored with a comparison that
// has life models (the same SVG as GET /v1/comparisons/{id}/life.svg at the
// report's width), with what it shows in words. Absent without a picture.
import { fragment, raw, tag, type Html } from './html-markup.ts';
import { renderLifeChartSvg } from './life-chart.ts';
import { storedLifePicture } from './life-view.ts';
import type { StoredComparisonView } from './types.ts';

export function lifePictureSection(record: StoredComparisonView): Html | null {
  const picture = storedLifePicture(record.result as unknown as Record<string, unknown>);
  if (!picture) return null;
  const svg = renderLifeChartSvg({ title: 'Fraction failed: the data against the fitted life models', picture, width: 720, height: 440 });
  const averaged = picture.curves.filter((c) => c.reference === 'rowAverage').map((c) => c.model);
  const how = picture.estimate.method === 'kaplanMeier'
    ? 'The step line is the Kaplan–Meier estimate from the data (every row exact or right-censored), with its band; ticks mark right-censored units.'
    : "The line is Turnbull's estimate from the data (some rows left- or interval-censored); inside each shaded box it is not determined.";
  return fragment(
    tag('h3', { id: 'life-picture' }, 'Life data against the fitted distributions'),
    tag('p', { class: 'note' }, `${how} Each other line is a fitted distribution's fraction failed${averaged.length > 0 ? `; ${averaged.join(', ')} ${averaged.length === 1 ? 'has' : 'have'} terms and ${averaged.length === 1 ? 'is' : 'are'} drawn averaged over the comparison's rows` : ''}. A picture of fit, like the criteria, does not validate a life model.`),
    tag('figure', { class: 'chart life-chart', style: 'margin:0' }, raw(svg.trim())),
  );
}
