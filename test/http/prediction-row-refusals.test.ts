// A prediction row outside a term's domain is refused at that prediction row,
// in the prediction rows' own numbering, and the message says the same row as
// the path (it once said the row's place after the data: "row 40"). Invented
// tile data, as the demo's scenario.
import t from 'tap';
import { buildTestApp } from '../helper.ts';

const columns = {
  shrinkage: [6.1, 6.4, 5.9, 6.8, 7.0, 6.2, 6.6, 7.1, 5.8, 6.5],
  kelvin: [1423, 1448, 1413, 1473, 1488, 1433, 1458, 1493, 1408, 1453],
};
const reciprocal = { kind: 'transform', of: 'kelvin', fn: 'reciprocal' };

/** The comparison of the two kelvin models, predicting at the given kelvin values. */
async function predictAt(t: Parameters<typeof buildTestApp>[0], kelvin: (number | null)[]) {
  const { app } = await buildTestApp(t);
  return app.inject({
    method: 'POST',
    url: '/v1/comparisons',
    payload: {
      data: { columns },
      response: 'shrinkage',
      candidates: [{ name: 'arrhenius', terms: [reciprocal] }, { name: 'linear', terms: ['kelvin'] }],
      options: { predict: { columns: { kelvin } } },
    },
  });
}

t.test('a reciprocal of 0 at prediction row 1 is named at options/predict/columns/kelvin/1, row 1', async (t) => {
  const res = await predictAt(t, [1440, 0]);
  t.equal(res.statusCode, 422, res.body.slice(0, 300));
  const [first] = res.json().errors;
  t.same([first.path, first.code, first.row], ['options/predict/columns/kelvin/1', 'transform_domain', 1]);
  t.match(first.message, /^options\/predict\/columns\/kelvin\/1 takes reciprocal of column "kelvin", whose value at row 1 is 0/);
  t.notMatch(first.message, /row 10|candidates\//, 'neither the row after the data nor the candidate\'s path');
});

t.test('a null at a prediction row is called a prediction row, not "a row the comparison uses"', async (t) => {
  const res = await predictAt(t, [1440, null]);
  t.equal(res.statusCode, 422, res.body.slice(0, 300));
  const [first] = res.json().errors;
  t.same([first.path, first.code, first.row], ['options/predict/columns/kelvin/1', 'value_missing', 1]);
  t.match(first.message, /missing a value at prediction row 1;/);
  t.notMatch(first.message, /a row the comparison uses/, 'no model was fitted on a prediction row');
});
