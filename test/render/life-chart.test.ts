// The life-data picture, read back by an outside XML parser (Python's
// xml.dom.minidom, test/render/parse-with-python.ts): well formed, one
// curve per fitted model in order, the nonparametric estimate drawn the way
// its method needs, hostile model names inert, no non-numbers in the markup.
import t from 'tap';
import { fitLifetime, lifePicture } from '../../src/core/models/lifetime/index.ts';
import { lifeCurve } from '../../src/core/models/lifetime/life-picture.ts';
import { renderLifeChartSvg } from '../../src/render/life-chart.ts';
import { summariseSvg } from './parse-with-python.ts';
import { design, response, solderJoints } from '../core/models/lifetime/fixtures.ts';

const columns = solderJoints();
const hostile = '<script>alert(1)</script> & "weibull"';

function picture(time: string, censoring: { status: string; upper?: string }, names: string[]) {
  const r = response(columns, time, censoring);
  const curves = names.map((name) => {
    const distribution = name === hostile ? 'weibull' : name;
    const f = fitLifetime({ name, distribution, design: design(columns, []) }, r);
    if ('issues' in f) throw new Error('fit');
    return (times: readonly number[]) => lifeCurve(f, false, times);
  });
  const stored = lifePicture(r, curves, 0.9);
  return { estimate: stored.estimate, svg: renderLifeChartSvg({ title: 'Solder joints: cycles to a cracked joint', picture: stored }) };
}

t.test('Kaplan–Meier picture: band, censoring marks and one curve per model', async (t) => {
  const { svg } = picture('rightOnlyCycles', { status: 'rightOnlyStatus' }, [hostile, 'lognormal', 'gamma']);
  const parsed = summariseSvg(svg);
  t.ok(parsed.wellFormed, parsed.error ?? 'well-formed XML');
  t.equal(parsed.root, 'svg');
  t.equal(parsed.rootAttributes?.['data-estimate'], 'kaplanMeier');
  const marked = parsed.marked ?? [];
  t.same(marked.filter((m) => m.class === 'fitted-curve').map((m) => m.data.model), [hostile, 'lognormal', 'gamma']);
  t.same(marked.filter((m) => m.class === 'legend-entry').map((m) => m.data.model), [hostile, 'lognormal', 'gamma']);
  t.ok(marked.some((m) => m.class === 'estimate-band'));
  t.ok(marked.some((m) => m.class === 'censored-marks'));
  t.notOk(parsed.tags?.includes('script'), 'a hostile model name stays text');
  t.notOk(/NaN|Infinity/.test(svg), 'no non-numbers in the markup');
  t.match(parsed.texts?.join(' '), /90% interval/);
});

t.test('Turnbull picture: boxes where the estimate is not determined', async (t) => {
  const { svg, estimate } = picture('cycles', { status: 'status', upper: 'upper' }, ['weibull', 'exponential']);
  const parsed = summariseSvg(svg);
  t.ok(parsed.wellFormed, parsed.error ?? 'well-formed XML');
  t.equal(parsed.rootAttributes?.['data-estimate'], 'turnbull');
  t.equal(estimate.method, 'turnbull');
  t.ok((parsed.marked ?? []).some((m) => m.class === 'undetermined'), 'the mass beyond the end of the test is a box');
  t.notOk(/NaN|Infinity/.test(svg));
});
