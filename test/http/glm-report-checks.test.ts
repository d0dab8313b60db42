// The HTML report shows the family's checks of each generalised linear model
// (overdispersion and standardised deviance residuals) as the stored record
// states them: the numbers in the table are the record's, rounded as the
// report rounds screening numbers (three significant digits). The numbers
// themselves are checked against R in glm-after-ranking.test.ts.
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import { referenceCase } from '../core/models/glm/reference-data.ts';
import { formatSignificant } from '../../src/render/number-format.ts';

const seams = referenceCase('seams-poisson-offset');

t.test('the report has a table of the family checks, one row per generalised linear model', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({
    method: 'POST', url: '/v1/comparisons',
    payload: {
      data: { columns: seams.data }, response: 'defects',
      candidates: [
        { name: 'current', terms: ['current'], family: 'poisson', offset: 'logLength' },
        { name: 'current-gas', terms: ['current', 'gas'], family: 'poisson', offset: 'logLength' },
      ],
    },
  });
  t.equal(res.statusCode, 200, res.body.slice(0, 400));
  const body = res.json();
  const report = await app.inject({ method: 'GET', url: `/v1/comparisons/${body.id}/report` });
  t.equal(report.statusCode, 200);
  const html = report.body;
  t.match(html, /data-section="glm-checks"/, 'the table is there');
  for (const model of body.models as { name: string; diagnostics: { glm: { overdispersion: { ratio: number }; devianceResiduals: { maxAbsolute: number } } } }[]) {
    const glmRow = [...html.matchAll(new RegExp(`<tr data-model="${model.name}">((?:(?!</tr>).)*)</tr>`, 'gs'))]
      .map((m) => m[1]).find((r) => r.includes('limit') || r.includes('beyond'));
    t.ok(glmRow, `a row for ${model.name}`);
    t.match(glmRow!, formatSignificant(model.diagnostics.glm.overdispersion.ratio, 'n/a', 3), 'Pearson χ²/df as stored');
    t.match(glmRow!, formatSignificant(model.diagnostics.glm.devianceResiduals.maxAbsolute, 'n/a', 3), 'largest deviance residual as stored');
  }
});
