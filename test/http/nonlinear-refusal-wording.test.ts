// A nonlinear fit refused for values with no finite result says which data row
// only when it knows one: never "data row -1". Invented drying data (a tile
// blank's moisture over hours in the dryer).
import t from 'tap';
import { buildTestApp } from '../helper.ts';

const hours = Array.from({ length: 20 }, (_, i) => 0.8 + 2.4 * i);
const moisture = hours.map((h, i) => 6 + 34 * Math.exp(-0.04 * h) + ((i * 7) % 5 - 2) * 0.3);

t.test('a start vector at the edge of the doubles: refused with no row -1 in the message', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({
    method: 'POST',
    url: '/v1/comparisons',
    payload: {
      data: { columns: { hours, moisture } },
      response: 'moisture',
      candidates: [
        { name: 'decay', expression: 'm0*exp(-k*hours)', start: { m0: 1e308, k: 1e308 } },
        { name: 'line', terms: ['hours'] },
      ],
    },
  });
  t.equal(res.statusCode, 422, res.body.slice(0, 300));
  const [first] = res.json().errors;
  t.equal(first.path, 'candidates/0');
  t.equal(first.code, 'nonlinear_non_finite');
  t.notMatch(first.message, /row -1/, 'no negative row');
  t.match(first.message, /no finite value and could not step around them/);
});
