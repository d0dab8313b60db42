// A number outside its allowed range is refused with a message that names the
// range, not with the finiteness message every number schema carries; and an
// unknown column's message reads as sentences. (Found by trying the request
// forms as a new user would.)
import t, { type Test } from 'tap';
import { buildTestApp } from '../helper.ts';

const columns = { y: [1.2, 2.3, 2.9, 4.1, 5.2, 5.8, 7.1, 8.3], x: [1, 2, 3, 4, 5, 6, 7, 8] };

async function refusal(t: Test, payload: Record<string, unknown>) {
  const { app } = await buildTestApp(t);
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload });
  return { status: res.statusCode, body: res.json() as { errors?: { path: string; message: string }[] } };
}

t.test('Box–Cox λ beyond ±5: the range is named', async (t) => {
  const { status, body } = await refusal(t, { data: { columns }, response: 'y', candidates: [{ name: 'a', terms: ['x'], response: { fn: 'boxcox', lambda: 9 } }] });
  t.equal(status, 400);
  const e = body.errors!.find((x) => x.path.endsWith('lambda'));
  t.match(e?.message, /must be at most 5/);
  t.notMatch(e?.message, /finite/);
});

t.test('a negative overdispersion factor: must be greater than 0', async (t) => {
  const { status, body } = await refusal(t, {
    data: { columns: { ...columns, n: [1, 3, 2, 5, 4, 6, 8, 7] } }, response: 'n',
    candidates: [{ name: 'p', terms: ['x'], family: 'poisson' }], options: { overdispersion: { cHat: -1 } },
  });
  t.equal(status, 400);
  t.ok(body.errors!.some((x) => /options\/overdispersion\/cHat/.test(x.path) && /greater than 0/.test(x.message)), JSON.stringify(body.errors));
});

t.test('an unknown column without a near name: two sentences', async (t) => {
  const { status, body } = await refusal(t, { data: { columns }, response: 'y', candidates: [{ name: 'a', terms: ['zzz'] }] });
  t.equal(status, 422);
  t.match(body.errors![0].message, /which the data does not have\. The data's columns: "y", "x"\./);
});
