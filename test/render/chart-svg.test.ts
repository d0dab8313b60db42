import t from 'tap';
import { parseChartOptions } from '../../src/render/chart-options.ts';
import { renderChartSvg } from '../../src/render/chart-svg.ts';
import type { StoredComparisonView } from '../../src/render/types.ts';
import { DEFAULT_POLICY } from '../../src/core/scoring/policy.ts';
import { defaultPolicyBands, fixtureRecord, kilnRecord, type FixtureModel } from './fixture-record.ts';
import { summariseSvg, type SvgSummary } from './parse-with-python.ts';

function draw(record: StoredComparisonView, query: Record<string, unknown> = {}): { svg: string; parsed: SvgSummary } {
  const options = parseChartOptions(query, record);
  if (!options.ok) throw new Error(JSON.stringify(options.issues));
  const svg = renderChartSvg(record, options.options);
  return { svg, parsed: summariseSvg(svg) };
}

const marked = (p: SvgSummary, cls: string) => (p.marked ?? []).filter((m) => m.class === cls);

t.test('parses as XML, titled and described in words', async (t) => {
  const { parsed } = draw(kilnRecord());
  t.ok(parsed.wellFormed, parsed.error ?? 'well-formed');
  t.equal(parsed.root, 'svg');
  t.equal(parsed.rootAttributes?.xmlns, 'http://www.w3.org/2000/svg');
  t.equal(parsed.firstChild, 'title', 'the title comes first, as SVG 2 accessibility asks');
  t.equal(parsed.title, 'Ranking by AICc: kiln trial, March');
  t.match(parsed.desc, /Best by AICc: quadratic\./);
  t.match(parsed.desc, /linear: Δ 3\.29 \(between bands\), weight 10\.8%/);
  t.match(parsed.desc, /BIC prefers quadratic; HQC prefers quadratic; adjusted R² prefers by-kiln\. The criteria disagree: 2 different models/);
  t.equal(parsed.rootAttributes?.role, 'img');
});

t.test('one Δ bar and one weight bar per model, in ranking order, values written as text', async (t) => {
  const record = kilnRecord();
  const { parsed } = draw(record);
  const bars = marked(parsed, 'delta-bar');
  t.same(bars.map((b) => b.data.model), record.result.rankings.aicc!.map((e) => e.name));
  t.equal(bars.length, record.result.models.length);
  t.same(bars.map((b) => b.data.delta), record.result.rankings.aicc!.map((e) => e.delta!.toFixed(2)));
  t.equal(marked(parsed, 'weight-bar').length, record.result.models.length);
  t.ok(parsed.texts?.includes('55.7%'), 'the best weight as text');
  t.ok(parsed.texts?.some((s) => s.startsWith('3.29')), 'a Δ value as text');
  // Δ of hold-only (38.14) is beyond the axis: drawn broken, value still written.
  t.equal(marked(parsed, 'axis-break').length, 1);
  t.ok(parsed.texts?.includes('38.14'));
});

t.test('band lines at 2, 4, 7 and 10 with their wording; none for adjusted R²', async (t) => {
  // A record without bands (older than bands in results): our own wording.
  const { parsed } = draw(kilnRecord());
  t.same(marked(parsed, 'band-line').map((l) => l.data.at), ['2', '4', '7', '10']);
  const legend = marked(parsed, 'band-legend')[0].text.replace(/\u00a0/g, ' ');
  t.match(legend, /Dashed lines at Δ 2, 4, 7 and 10\./);
  t.match(legend, /Δ ≤ 2: about as good as the best/);
  t.match(legend, /4 ≤ Δ ≤ 7: clearly weaker/);
  t.match(legend, /Δ > 10: hardly any support/);
  t.match(legend, /2 < Δ < 4: between bands/);
  const adjusted = draw(kilnRecord(), { criterion: 'adjustedR2' }).parsed;
  t.equal(marked(adjusted, 'band-line').length, 0);
  t.equal(marked(adjusted, 'weight-bar').length, 0, 'adjusted R² has no weights to draw');
  t.equal(marked(adjusted, 'delta-bar').length, 5);
  t.match(marked(adjusted, 'band-legend')[0].text, /No weights are defined/);
});

// The default team policy (src/core/scoring/policy.ts DEFAULT_POLICY): Burnham & Anderson's
// rule of thumb for AIC-type Δ, Kass & Raftery's scale for ΔBIC. A record whose
// entries carry its words shows those words, beside the bars and in the legend.
t.test('a record carrying the default policy\'s bands: the bars and legend use its words', async (t) => {
  const record = kilnRecord('kiln trial, March', defaultPolicyBands);
  const { parsed } = draw(record);
  const legend = marked(parsed, 'band-legend')[0].text.replace(/\u00a0/g, ' ');
  t.match(legend, /In the words of policy “parsimetry-default”: Δ ≤ 2: substantial support · 2 < Δ < 4: between substantial and considerably less support · 4 ≤ Δ ≤ 7: considerably less support · 7 < Δ ≤ 10: between considerably less and essentially no support · Δ > 10: essentially no support\./);
  t.notMatch(legend, /about as good as the best|clearly weaker|hardly any support/, 'none of our own words');
  t.match(parsed.desc, /linear: Δ 3\.29 \(between substantial and considerably less support\)/);
  const bar = marked(parsed, 'delta-bar').find((b) => b.data.model === 'with-moisture')!;
  t.match(bar.title, /considerably less support/);
  for (const entry of record.result.rankings.aicc!) t.match(parsed.desc, `(${entry.band})`, `${entry.name}: the JSON's words`);
});

t.test('BIC: lines at 2, 6 and 10 (Kass & Raftery), worded as the record\'s BIC bands', async (t) => {
  const banded = draw(kilnRecord('kiln trial, March', defaultPolicyBands), { criterion: 'bic' }).parsed;
  t.same(marked(banded, 'band-line').map((l) => l.data.at), ['2', '6', '10']);
  const legend = marked(banded, 'band-legend')[0].text.replace(/\u00a0/g, ' ');
  t.match(legend, /Dashed lines at Δ 2, 6 and 10\./);
  t.match(legend, /Δ ≤ 2: evidence against it barely worth a mention · 2 < Δ ≤ 6: positive evidence against it · 6 < Δ ≤ 10: strong evidence against it · Δ > 10: very strong evidence against it/);
  t.match(banded.desc, /with-moisture: Δ 8\.68 \(strong evidence against it\)/);
  t.same(marked(banded, 'band-zone').map((z) => z.data.band), ['strong', 'very-strong'], 'zones shaded from 6 and from 10');
  // Without bands in the record, BIC still gets its own edges, in our words.
  const bare = draw(kilnRecord(), { criterion: 'bic' }).parsed;
  t.same(marked(bare, 'band-line').map((l) => l.data.at), ['2', '6', '10']);
  t.match(bare.desc, /with-moisture: Δ 8\.68 \(strong evidence against it\)/);
  t.match(bare.desc, /linear: Δ 2\.07 \(some evidence against it\)/);
});

t.test('a team policy with words of its own: the bars carry its words, the legend says whose they are', async (t) => {
  const teamPolicy = {
    ...DEFAULT_POLICY,
    name: 'glaze-line',
    akaikeBands: [
      { maxDelta: 3, includeMax: true, wording: 'keep in view' },
      { maxDelta: null, includeMax: false, wording: 'set aside' },
    ],
  };
  const { parsed } = draw(kilnRecord('kiln trial, March', { policy: teamPolicy }));
  const legend = marked(parsed, 'band-legend')[0].text.replace(/\u00a0/g, ' ');
  t.match(legend, /The words beside the bars are those of policy “glaze-line”/);
  t.notMatch(legend, /substantial support|about as good as the best/, 'no wording the bars do not use');
  t.match(parsed.desc, /by-kiln: Δ 1\.25 \(keep in view\)/);
  t.match(parsed.desc, /linear: Δ 3\.29 \(set aside\)/);
});

t.test('the strip names the model each criterion prefers and marks disagreement without colour', async (t) => {
  const { parsed } = draw(kilnRecord());
  const cells = marked(parsed, 'strip-cell');
  t.same(cells.map((c) => [c.data.criterion, c.data.model]), [
    ['aicc', 'quadratic'], ['aic', 'by-kiln'], ['bic', 'quadratic'], ['hqc', 'quadratic'], ['adjustedR2', 'by-kiln'],
  ]);
  // Same model, same swatch; a different model, a different patterned swatch.
  t.same(cells.map((c) => c.data.group), ['0', '1', '0', '0', '1']);
  t.ok(parsed.tags?.includes('pattern'), 'the second model gets a pattern, which survives grey printing');
  t.ok(parsed.texts?.includes("Best by each of the verdict's 5 criteria: 2 different models"));

  const agreeing = fixtureRecord([
    { name: 'linear', rss: 3.0, parameters: 3 },
    { name: 'quadratic', rss: 2.98, parameters: 4 },
  ]);
  const calm = draw(agreeing).parsed;
  t.same(marked(calm, 'strip-cell').map((c) => c.data.group), ['0', '0', '0', '0', '0']);
  t.notOk(calm.tags?.includes('pattern'));
  t.ok(calm.texts?.includes("Best by each of the verdict's 5 criteria: all agree"));
});

t.test('identical bytes for the same record and options, also from a copy of the record', async (t) => {
  const a = draw(kilnRecord()).svg;
  t.equal(draw(kilnRecord()).svg, a);
  t.equal(renderChartSvg(structuredClone(kilnRecord()), { criterion: 'aicc', width: 720, height: null }), a);
  t.not(draw(kilnRecord(), { criterion: 'bic' }).svg, a, 'another criterion is another picture');
});

t.test('a model with no finite criterion is drawn as "no value"', async (t) => {
  // n = 8 observations and k = 7: n - k - 1 = 0, so AICc does not exist (api.md conventions).
  const record = fixtureRecord([
    { name: 'linear', rss: 3.1, parameters: 3 },
    { name: 'saturated', rss: 0.4, parameters: 7 },
  ], { n: 8 });
  t.equal(record.result.models[1].aicc, null);
  const { parsed } = draw(record, { criterion: 'aicc' });
  const bars = marked(parsed, 'delta-bar');
  t.same(bars.map((b) => b.data.model), ['linear', 'saturated']);
  t.equal(bars[1].data.delta, 'none');
  t.equal(bars[1].text, 'no value');
  t.equal(bars[1].rects.length, 0, 'no bar drawn for a missing value');
  t.match(parsed.desc, /saturated: Δ no value/);
});

t.test('one model', async (t) => {
  const { parsed } = draw(fixtureRecord([{ name: 'linear', rss: 3.1, parameters: 3 }]), { size: 'tile' });
  t.ok(parsed.wellFormed);
  t.equal(marked(parsed, 'delta-bar').length, 1);
  t.ok(parsed.texts?.includes('100.0%'));
});

t.test('fifty models fit the requested height, every bar inside the drawing', async (t) => {
  const models: FixtureModel[] = Array.from({ length: 50 }, (_, i) => ({ name: `subset-${String(i + 1).padStart(2, '0')}`, rss: 3 + i * 0.05, parameters: 3 + (i % 5) }));
  for (const height of [600, 200]) {
    const { parsed } = draw(fixtureRecord(models), { width: '800', height: String(height) });
    t.ok(parsed.wellFormed);
    t.equal(marked(parsed, 'delta-bar').length, 50);
    const viewBox = parsed.rootAttributes!.viewBox.split(' ').map(Number);
    t.equal(Number(parsed.rootAttributes!.height), height, 'the requested height is kept');
    const lowest = Math.max(...marked(parsed, 'delta-bar').flatMap((b) => b.rects.map((r) => r.y + r.height)));
    t.ok(lowest <= viewBox[3], `bars end at ${lowest}, inside ${viewBox[3]}`);
  }
});

t.test('a long name is shortened with an ellipsis, the full name kept in the bar\'s title', async (t) => {
  const long = 'peakTemp + holdMinutes + moisture + kiln + peakTemp:kiln + moisture:holdMinutes + peakTemp^2';
  const { parsed } = draw(fixtureRecord([{ name: long, rss: 3.1, parameters: 9 }, { name: 'linear', rss: 3.3, parameters: 3 }]), { size: 'tile' });
  const row = marked(parsed, 'model-row').find((r) => r.data.model === long)!;
  t.ok(row, 'row found by its full name');
  const bar = marked(parsed, 'delta-bar').find((b) => b.data.model === long)!;
  t.match(bar.title, new RegExp(`^A ${long.replace(/[+^]/g, '\\$&')}: Δ AICc`), 'the title names the key and the full name');
  const shown = parsed.texts!.find((s) => s.startsWith('peakTemp + ') && s.endsWith('…'));
  t.ok(shown, `truncated label ${shown}`);
  t.ok(shown!.length < long.length);
});

t.test('names carrying markup are text, never elements', async (t) => {
  const names = ['<script>alert(1)</script>', '"><image href="x"/>', 'a & b', "it's\u0001odd"];
  const record = fixtureRecord(names.map((name, i) => ({ name, rss: 3 + i * 0.2, parameters: 3 })), { label: '<b>label</b> & co' });
  const { svg, parsed } = draw(record);
  t.ok(parsed.wellFormed, parsed.error ?? 'well-formed');
  t.notOk(parsed.tags?.includes('script'));
  t.notOk(parsed.tags?.includes('image'));
  t.notOk(parsed.tags?.includes('b'));
  t.notMatch(svg, /<script/);
  t.same(marked(parsed, 'delta-bar').map((b) => b.data.model).sort(), ['"><image href="x"/>', '<script>alert(1)</script>', 'a & b', "it's\uFFFDodd"].sort());
  t.equal(parsed.title, 'Ranking by AICc: <b>label</b> & co');
});

t.test('axis numbers never touch: at the narrowest width the crowded ones are left out, their lines kept', async (t) => {
  /** Each band line's axis number and where it is centred, or null when left out. */
  const axisNumbers = (svg: string) => [...svg.matchAll(/<g class="band-line" data-at="([^"]+)">(.*?)<\/g>/g)]
    .map(([, at, inner]) => {
      const label = /<text x="([^"]+)"[^>]*>([^<]+)<\/text>/.exec(inner);
      return { at, x: label === null ? null : Number(label[1]) };
    });
  const wide = axisNumbers(draw(kilnRecord(), { size: 'panel' }).svg);
  t.same(wide.map((n) => n.at), ['2', '4', '7', '10']);
  t.ok(wide.every((n) => n.x !== null), 'at 720 px every line has its number');

  const narrow = axisNumbers(draw(kilnRecord(), { width: 240 }).svg);
  t.same(narrow.map((n) => n.at), ['2', '4', '7', '10'], 'every line is still drawn');
  const shown = narrow.filter((n): n is { at: string; x: number } => n.x !== null);
  t.ok(shown.length < narrow.length, `some numbers left out at 240 px (${shown.map((n) => n.at).join(', ')} shown)`);
  // Centres at least a digit-pair apart: two numbers of up to two digits at this size cannot meet.
  const fontSize = Number(/<g class="band-line"[^>]*>.*?<text[^>]*font-size="([^"]+)"/.exec(draw(kilnRecord(), { width: 240 }).svg)?.[1] ?? 'NaN');
  for (let i = 1; i < shown.length; i++) t.ok(shown[i].x - shown[i - 1].x >= fontSize * 1.2, `${shown[i - 1].at} and ${shown[i].at} are apart`);
});
