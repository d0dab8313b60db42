// The chart of a comparison ranked by QAIC: drawn like any other ranking
// (Akaike reference lines, since Δ QAIC reads as Δ AIC: Burnham & Anderson
// 2002), chosen by ?criterion=qaic or qaicc, and by default the criterion
// the verdict chose by; the strip of preferred models counts QAIC as the
// verdict does.
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import { referenceCase } from '../core/models/glm/reference-data.ts';
import { summariseSvg, type SvgSummary } from '../render/parse-with-python.ts';

const seams = referenceCase('seams-poisson-offset');
const marked = (p: SvgSummary, cls: string) => (p.marked ?? []).filter((m) => m.class === cls);

function payload(options: Record<string, unknown>) {
  return {
    data: { columns: seams.data }, response: seams.response,
    candidates: [
      { name: 'current-and-gas', terms: seams.terms, family: 'poisson', offset: 'logLength' },
      { name: 'current-only', terms: ['current'], family: 'poisson', offset: 'logLength' },
    ],
    options,
  };
}

t.test('chart.svg of a QAIC ranking', async (t) => {
  const { app } = await buildTestApp(t);
  const posted = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: payload({ overdispersion: { cHat: 1.8 }, rankBy: 'qaic' }) });
  t.equal(posted.statusCode, 200, posted.body.slice(0, 300));
  const body = posted.json();

  const drawn = await app.inject({ method: 'GET', url: `/v1/comparisons/${body.id}/chart.svg` });
  t.equal(drawn.statusCode, 200);
  const svg = summariseSvg(drawn.body);
  t.ok(svg.wellFormed);
  t.match(svg.title, /^Ranking by QAIC/, 'by default the verdict\'s rankBy');
  t.same(marked(svg, 'band-line').map((l) => l.data.at), ['2', '4', '7', '10'], 'Akaike reference lines');
  t.same(marked(svg, 'delta-bar').map((b) => b.data.model), body.rankings.qaic.map((e: { name: string }) => e.name), 'one bar per model, in QAIC order');
  for (const e of body.rankings.qaic as { name: string; delta: number }[]) t.ok(svg.desc?.includes(`${e.name}: Δ `), `${e.name} in the description`);
  t.ok(marked(svg, 'strip-cell').some((c) => c.data.criterion === 'qaic'), 'the strip counts QAIC, as the verdict does');

  const qaicc = summariseSvg((await app.inject({ method: 'GET', url: `/v1/comparisons/${body.id}/chart.svg?criterion=qaicc` })).body);
  t.match(qaicc.title, /^Ranking by QAICc/);
  const aicc = summariseSvg((await app.inject({ method: 'GET', url: `/v1/comparisons/${body.id}/chart.svg?criterion=aicc` })).body);
  t.match(aicc.title, /^Ranking by AICc/, 'the other rankings still draw');

  const plain = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: payload({}) })).json();
  const refused = await app.inject({ method: 'GET', url: `/v1/comparisons/${plain.id}/chart.svg?criterion=qaic` });
  t.equal(refused.statusCode, 400);
  t.equal(refused.json().errors[0].code, 'criterion_not_ranked');
  t.equal(refused.json().errors[0].path, 'criterion');
  t.match(summariseSvg((await app.inject({ method: 'GET', url: `/v1/comparisons/${plain.id}/chart.svg` })).body).title, /^Ranking by AICc/);
});
