// The chart's labels at every size it offers: every bar and every strip box
// names one model unambiguously (its key, and the full name beside it or in
// the model key note), every bar carries its band's words or the chart says
// why not, the best model reads "best", the strip counts the verdict's
// criteria, and a record that failed its integrity check is marked.
import t from 'tap';
import { DEFAULT_POLICY } from '../../src/core/scoring/policy.ts';
import { parseChartOptions, sizePresets } from '../../src/render/chart-options.ts';
import { renderChartSvg } from '../../src/render/chart-svg.ts';
import { modelKeyAt, modelKeys } from '../../src/render/model-keys.ts';
import type { StoredComparisonView } from '../../src/render/types.ts';
import { defaultPolicyBands, fixtureRecord, kilnRecord } from './fixture-record.ts';
import { summariseSvg, type SvgSummary } from './parse-with-python.ts';

function draw(record: StoredComparisonView, query: Record<string, unknown> = {}): SvgSummary {
  const options = parseChartOptions(query, record);
  if (!options.ok) throw new Error(JSON.stringify(options.issues));
  return summariseSvg(renderChartSvg(record, options.options));
}

const marked = (p: SvgSummary, cls: string) => (p.marked ?? []).filter((m) => m.class === cls);

/** Long names that share their first twenty characters, as real candidate names do. */
function lookalikeRecord(): StoredComparisonView {
  return fixtureRecord([
    { name: 'curve+moisture+kiln', rss: 2.71, parameters: 6 },
    { name: 'curve+moisture+kiln+hold', rss: 2.70, parameters: 7 },
    { name: 'curve+moisture+kiln+hold+hold×kiln', rss: 2.69, parameters: 8 },
    { name: 'temperature', rss: 24.7, parameters: 3 },
  ], { n: 116, tss: 65, bands: defaultPolicyBands, label: 'tile shrinkage (test data)' });
}

const sizes: Record<string, Record<string, string>> = {
  ...Object.fromEntries(Object.keys(sizePresets).map((size) => [size, { size }])),
  narrowest: { width: '240' },
};

t.test('model keys: A to Z, then AA; in the record\'s model order', async (t) => {
  t.same([0, 1, 25, 26, 27, 51, 52, 701, 702].map(modelKeyAt), ['A', 'B', 'Z', 'AA', 'AB', 'AZ', 'BA', 'ZZ', 'AAA']);
  const keys = modelKeys(kilnRecord());
  t.same([...keys], [['linear', 'A'], ['quadratic', 'B'], ['by-kiln', 'C'], ['with-moisture', 'D'], ['hold-only', 'E']]);
});

for (const [size, query] of Object.entries(sizes)) {
  for (const criterion of ['aicc', 'bic', 'adjustedR2']) {
    t.test(`${size}, ${criterion}: every bar and strip box names one model unambiguously`, async (t) => {
      const record = lookalikeRecord();
      const parsed = draw(record, { ...query, criterion });
      t.ok(parsed.wellFormed, parsed.error ?? 'well-formed');
      const keys = modelKeys(record);
      const rows = marked(parsed, 'model-row');
      t.equal(rows.length, record.result.models.length);
      t.equal(new Set(rows.map((r) => r.data.key)).size, rows.length, 'one key per model');
      const note = marked(parsed, 'model-key')[0]?.text.replace(/\u00a0/g, ' ') ?? null;
      for (const row of rows) {
        t.equal(row.data.key, keys.get(row.data.model), `${row.data.model} carries its key`);
        const name = marked(parsed, 'model-name').find((n) => n.title === `${row.data.key} ${row.data.model}`)!;
        t.ok(name, `the name group of ${row.data.model} is titled with key and name`);
        const shown = name.text.slice(row.data.key.length);
        if (shown !== row.data.model) {
          t.ok(shown.endsWith('…'), `a shortened name is marked: ${shown}`);
          t.ok(note?.includes(`${row.data.key} ${row.data.model}`), `the model key spells out ${row.data.key}`);
        }
      }
      for (const cell of marked(parsed, 'strip-cell')) {
        t.equal(cell.data.key, keys.get(cell.data.model), `the ${cell.data.criterion} box names ${cell.data.model} by its key`);
        t.ok(cell.text.includes(cell.data.key), 'the key is written in the box');
      }
    });
  }
}

t.test('band words: beside, inside or under every bar at the default size; a note when left out', async (t) => {
  for (const criterion of ['aicc', 'aic', 'bic', 'hqc']) {
    const parsed = draw(lookalikeRecord(), { criterion });
    const bars = marked(parsed, 'delta-bar');
    t.same(bars.filter((b) => !['after', 'inside', 'below'].includes(b.data.words)).map((b) => b.data.model), [], `${criterion}: every bar carries its words`);
    t.equal(marked(parsed, 'words-note').length, 0, 'no note needed');
  }
  // The narrowest chart cannot hold them all: the chart says how many it left out.
  const narrow = draw(lookalikeRecord(), { width: '240', height: '200' });
  const omitted = marked(narrow, 'delta-bar').filter((b) => b.data.words === 'omitted').length;
  t.ok(omitted > 0, 'some words left out at 240 × 200');
  t.match(marked(narrow, 'words-note')[0].text.replace(/\s+/g, ' '), new RegExp(`Band words left out beside ${omitted} bars? for lack of room`));
});

t.test('the best model reads "best", never a band against itself', async (t) => {
  const parsed = draw(kilnRecord('kiln trial, March', defaultPolicyBands), { criterion: 'bic' });
  const best = marked(parsed, 'delta-bar').find((b) => b.data.delta === '0.00')!;
  t.match(best.text, /best/);
  t.notMatch(best.text, /barely worth a mention/);
  t.match(parsed.desc, /quadratic: Δ 0\.00 \(best\)/);
  // The policy's band for Δ 0 is still the first BIC band (src/core/scoring/policy.ts); the picture words the best model apart.
  t.equal(kilnRecord('x', defaultPolicyBands).result.rankings.bic![0].band, DEFAULT_POLICY.bicBands[0].wording);
});

t.test('the strip counts the criteria of the verdict, not leave-one-out', async (t) => {
  const record = kilnRecord();
  record.result.rankings.loo = record.result.rankings.aicc!.map((e, i) => ({ ...e, value: 0.16 + i / 100, delta: i / 100, weight: null, evidenceRatio: null, cumulativeWeight: null }));
  const parsed = draw(record);
  t.same(marked(parsed, 'strip-cell').map((c) => c.data.criterion), ['aicc', 'aic', 'bic', 'hqc', 'adjustedR2']);
  t.ok(parsed.texts?.includes("Best by each of the verdict's 5 criteria: 2 different models"));
  // Leave-one-out can still be drawn on its own.
  t.equal(draw(record, { criterion: 'loo' }).rootAttributes?.['data-criterion'], 'loo');
});

t.test('a record that failed its integrity check is marked across the top; an intact one only in its data', async (t) => {
  const broken = { ...kilnRecord(), integrity: { ok: false, reason: 'hash_mismatch', detail: 'Record 17 no longer hashes to its stored hash: its content was changed after it was written. Do not rely on this record.' } };
  const parsed = draw(broken);
  t.equal(parsed.rootAttributes?.['data-integrity'], 'failed');
  const warning = marked(parsed, 'integrity-warning');
  t.equal(warning.length, 1);
  t.match(warning[0].text.replace(/\s+/g, ' '), /Integrity check failed \(hash_mismatch\): Record 17 no longer hashes to its stored hash: its content was changed after it was written\. Do not rely on this picture; run GET \/v1\/audit\/verify\./);
  t.match(parsed.desc, /^Integrity check failed/);
  for (const size of Object.keys(sizePresets)) t.equal(marked(draw(broken, { size }), 'integrity-warning').length, 1, `marked at ${size}`);

  const intact = draw({ ...kilnRecord(), integrity: { ok: true, reason: null, detail: 'Record 17 hashes to its stored hash.' } });
  t.equal(intact.rootAttributes?.['data-integrity'], 'ok');
  t.equal(marked(intact, 'integrity-warning').length, 0);
  t.equal(draw(kilnRecord()).rootAttributes?.['data-integrity'], undefined, 'not checked: nothing said');
});
