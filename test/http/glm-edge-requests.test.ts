// Requests a careful new user sends at the generalised-linear features' edges:
// each gets a reply that names the field once and says nothing false. The
// counts are invented (tile defects per firing, with the log of the tiles fired
// as offset), as the demo's scenario.
import t from 'tap';
import { buildTestApp } from '../helper.ts';

const columns = {
  defects: [3, 7, 3, 1, 2, 2, 1, 1, 1, 0, 0, 3, 2, 0, 3],
  peakTemp: [1172, 1241, 1208, 1155, 1190, 1199, 1163, 1181, 1177, 1150, 1158, 1226, 1203, 1161, 1219],
  kiln: ['A', 'B', 'C', 'A', 'B', 'C', 'A', 'B', 'C', 'A', 'B', 'C', 'A', 'B', 'C'],
  logTiles: [5.9, 6.2, 5.7, 5.1, 5.5, 5.6, 5.0, 5.3, 5.2, 4.8, 4.9, 5.8, 5.4, 4.7, 5.9],
};
const candidates = [
  { name: 'temp', terms: ['peakTemp'], family: 'poisson', offset: 'logTiles' },
  { name: 'temp-kiln', terms: ['peakTemp', 'kiln'], family: 'poisson', offset: 'logTiles' },
];

t.test('options.overdispersion.cHat missing or null: the reply says a number or "estimate" is wanted', async (t) => {
  const { app } = await buildTestApp(t);
  for (const overdispersion of [{ cHat: null }, {}, { cHat: 'estimated' }]) {
    const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { data: { columns }, response: 'defects', candidates, options: { overdispersion } } });
    t.equal(res.statusCode, 400, JSON.stringify(overdispersion));
    const body = res.json();
    t.equal(body.errors[0].path, 'options/overdispersion/cHat');
    t.match(body.errors[0].message, /number greater than 0, or the string "estimate"/, 'both accepted forms named, not only "estimate"');
  }
});

t.test('a non-numeric trials column is named once, not once per binomial candidate', async (t) => {
  const { app } = await buildTestApp(t);
  const binomial = candidates.map((c) => ({ ...c, family: 'binomial', offset: undefined }));
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { data: { columns }, response: 'defects', trials: 'kiln', candidates: binomial } });
  t.equal(res.statusCode, 422, res.body.slice(0, 300));
  const body = res.json();
  t.equal(body.errors.length, 1, 'one request-level field, one problem');
  t.same([body.errors[0].path, body.errors[0].code], ['trials', 'glm_column_not_numeric']);
  t.notMatch(body.detail, /problems prevent/);
});

t.test('a prediction row far outside the data: the mean is null and its interval is open above, never [0, 0]', async (t) => {
  const { app } = await buildTestApp(t);
  const predict = { columns: { peakTemp: [1e300, 1200], kiln: ['A', 'A'], logTiles: [6, 6] } };
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { data: { columns }, response: 'defects', candidates, options: { predict } } });
  t.equal(res.statusCode, 200, res.body.slice(0, 300));
  for (const m of res.json().models) {
    const [far, near] = m.predictions;
    t.equal(far.estimate, null, `${m.name}: no finite mean at 10^300 °C`);
    t.equal(far.upper, null, `${m.name}: the upper end is open (the standard error overflowed to infinity), not cut to 0`);
    t.ok(near.lower > 0 && near.lower < near.estimate && near.estimate < near.upper, `${m.name}: an ordinary row keeps a proper interval`);
    t.ok(m.cautions.some((c: { code: string }) => c.code === 'prediction_outside_response_range'), `${m.name}: a caution names the row`);
  }
});

t.test('trials on a Poisson search: the reply says to set family to binomial, not to add a candidate a search does not have', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({
    method: 'POST',
    url: '/v1/searches',
    payload: { data: { columns: { ...columns, fired: columns.defects.map((d) => d + 40) } }, response: 'defects', pool: ['peakTemp', 'kiln'], family: 'poisson', offset: 'logTiles', trials: 'fired' },
  });
  t.equal(res.statusCode, 422, res.body.slice(0, 300));
  const [error] = res.json().errors;
  t.same([error.path, error.code], ['trials', 'trials_without_binomial']);
  t.match(error.message, /this search fits every subset \(family "poisson"\)\. Drop trials, or set family to "binomial"\./);
  t.notMatch(error.message, /candidate/);
});
