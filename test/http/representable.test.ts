// The last check before a comparison is recorded: non-finite numbers become
// null with a caution naming where; a result of plain finite data passes as it
// is (no copy is made of it).
import t from 'tap';
import { z } from 'zod';
import { representableResult } from '../../src/http/representable.ts';

const Schema = z.object({
  cautions: z.array(z.object({ code: z.string(), message: z.string() })),
  models: z.array(z.object({ name: z.string(), press: z.number().nullable(), weights: z.array(z.number().nullable()) })),
});

t.test('plain finite data passes unchanged, and is not copied', async (t) => {
  const result = { cautions: [], models: [{ name: 'a', press: 1.5, weights: [0.25, -0, 1e-300] }] };
  const checked = representableResult(Schema, result, {}, true);
  t.ok('result' in checked && checked.result === result);
  t.strictSame(result.cautions, []);
});

t.test('an overflowed number is reported as null with a caution naming where', async (t) => {
  const result = { cautions: [] as { code: string; message: string }[], models: [{ name: 'a', press: Infinity, weights: [0.5, NaN] }] };
  const checked = representableResult(Schema, result, {}, true);
  if (!('result' in checked)) throw new Error('expected a result');
  t.strictSame(checked.result.models, [{ name: 'a', press: null, weights: [0.5, null] }]);
  t.equal(checked.result.cautions.length, 1);
  t.equal(checked.result.cautions[0].code, 'value_not_representable');
  t.match(checked.result.cautions[0].message, /^2 values .*\(models\/0\/press, models\/0\/weights\/1\)/);
  t.equal(result.models[0].press, Infinity, 'the computed result itself is left as it was');
});

t.test('a result that still does not fit its schema is refused, never recorded', async (t) => {
  const checked = representableResult(Schema, { cautions: [], models: [{ name: 'a', press: 1, weights: 'many' }] } as never, {}, true);
  t.ok('problem' in checked);
});

t.test('with the schema check off (production), numbers are still made representable and the shape is trusted', async (t) => {
  const result = { cautions: [] as { code: string; message: string }[], models: [{ name: 'a', press: NaN, weights: [0.5] }] };
  const checked = representableResult(Schema, result, {}, false);
  if (!('result' in checked)) throw new Error('expected a result');
  t.strictSame(checked.result.models, [{ name: 'a', press: null, weights: [0.5] }]);
  t.equal(checked.result.cautions[0]?.code, 'value_not_representable');
  const misshapen = { cautions: [], models: [{ name: 'a', press: 1, weights: 'many' }] };
  const trusted = representableResult(Schema, misshapen as never, {}, false);
  t.ok('result' in trusted && trusted.result === misshapen, 'not parsed: the tests, which run with the check on, hold the code to the schema');
});
