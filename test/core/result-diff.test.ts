// diffResults: every leaf compared, entries matched by name rather than by
// position, paths written as RFC 6901 JSON Pointers.
import t from 'tap';
import fc from 'fast-check';
import { diffResults, type JsonValue } from '../../src/core/result-diff.ts';

t.test('identical values: no changes, every leaf counted', async (t) => {
  const value = { a: 1, b: [true, null, 'x'], c: { d: -0.5 } };
  const diff = diffResults(value, structuredClone(value));
  t.same(diff.changes, []);
  t.equal(diff.leavesCompared, 5, 'a, b/0, b/1, b/2, c/d');
});

t.test('a changed number carries absolute and relative change', async (t) => {
  // Relative change (now − stored)/|stored|: common practice.
  const { changes } = diffResults({ models: [{ name: 'm', aicc: -40 }] }, { models: [{ name: 'm', aicc: -38 }] });
  t.same(changes, [{ path: 'models/0/aicc', change: 'value', stored: -40, now: -38, absoluteChange: 2, relativeChange: 0.05 }]);
});

t.test('stored zero: the relative change does not exist (null), the absolute one does', async (t) => {
  const { changes } = diffResults({ delta: 0 }, { delta: 0.25 });
  t.equal(changes[0].absoluteChange, 0.25);
  t.equal(changes[0].relativeChange, null);
});

t.test('strings, booleans and nulls are compared too, with no numeric change', async (t) => {
  const { changes } = diffResults(
    { chosen: 'a', agree: true, aicc: null, value: 3 },
    { chosen: 'b', agree: false, aicc: 12.5, value: null },
  );
  t.same(changes.map((c) => c.path), ['chosen', 'agree', 'aicc', 'value']);
  for (const c of changes) {
    t.equal(c.change, 'value');
    t.equal(c.absoluteChange, null, `${c.path}: no numeric change between a number and a non-number`);
  }
});

t.test('a reordered ranking reads as rank changes, not as every entry changing', async (t) => {
  const stored = { aicc: [
    { rank: 1, name: 'linear', value: 10, delta: 0 },
    { rank: 2, name: 'quadratic', value: 11, delta: 1 },
    { rank: 3, name: 'cubic', value: 15, delta: 5 },
  ] };
  const now = { aicc: [
    { rank: 1, name: 'quadratic', value: 9, delta: 0 },
    { rank: 2, name: 'linear', value: 10, delta: 1 },
    { rank: 3, name: 'cubic', value: 15, delta: 6 },
  ] };
  const { changes } = diffResults(stored, now);
  const byPath = Object.fromEntries(changes.map((c) => [c.path, c]));
  t.same(Object.keys(byPath).sort(), ['aicc/0/delta', 'aicc/0/rank', 'aicc/1/delta', 'aicc/1/rank', 'aicc/1/value', 'aicc/2/delta'].sort());
  t.same(byPath['aicc/0/rank'], { path: 'aicc/0/rank', change: 'value', nowPath: 'aicc/1/rank', stored: 1, now: 2, absoluteChange: 1, relativeChange: 1 },
    'linear fell from rank 1 to 2; nowPath says where it sits today');
  t.equal(byPath['aicc/1/value'].now, 9);
  t.notOk('nowPath' in byPath['aicc/2/delta'], 'cubic did not move: no nowPath');
  t.notOk(changes.some((c) => c.path.endsWith('/name')), 'names are the match key, never a change');
});

t.test('entries present on one side only are reported once, whole', async (t) => {
  const { changes } = diffResults(
    { models: [{ name: 'a', k: 2 }, { name: 'gone', k: 3 }] },
    { models: [{ name: 'a', k: 2 }, { name: 'new', k: 4 }] },
  );
  t.same(changes, [
    { path: 'models/1', change: 'removed', stored: { name: 'gone', k: 3 }, now: null, absoluteChange: null, relativeChange: null },
    { path: 'models/1', change: 'added', stored: null, now: { name: 'new', k: 4 }, absoluteChange: null, relativeChange: null },
  ]);
});

t.test('a key present on one side only is added or removed', async (t) => {
  const { changes } = diffResults({ a: 1, old: 2 }, { a: 1, fresh: 3 });
  t.same(changes.map((c) => [c.path, c.change]), [['old', 'removed'], ['fresh', 'added']]);
});

t.test('arrays without a unique identifying key are compared by position', async (t) => {
  // Two cautions with one code: matching by code would be ambiguous.
  const { changes } = diffResults(
    { cautions: [{ code: 'x', message: 'one' }, { code: 'x', message: 'two' }], aliased: ['p', 'q'] },
    { cautions: [{ code: 'x', message: 'two' }, { code: 'x', message: 'one' }], aliased: ['q'] },
  );
  t.same(changes.map((c) => [c.path, c.change]), [
    ['cautions/0/message', 'value'], ['cautions/1/message', 'value'], ['aliased/0', 'value'], ['aliased/1', 'removed'],
  ]);
});

t.test('coefficients match by term, cautions by code', async (t) => {
  const { changes } = diffResults(
    { coefficients: [{ term: 'intercept', estimate: 1 }, { term: 'x', estimate: 2 }], cautions: [{ code: 'a', message: 'm' }, { code: 'b', message: 'n' }] },
    { coefficients: [{ term: 'x', estimate: 2 }, { term: 'intercept', estimate: 1 }], cautions: [{ code: 'b', message: 'n' }, { code: 'a', message: 'm' }] },
  );
  t.same(changes, [], 'the same entries in another order are no change');
});

t.test('paths escape "/" and "~" in names as RFC 6901 does', async (t) => {
  // RFC 6901 section 3: "~" is written "~0" and "/" is written "~1".
  const { changes } = diffResults({ 'a/b': { 'c~d': 1 } }, { 'a/b': { 'c~d': 2 } });
  t.equal(changes[0].path, 'a~1b/c~0d');
});

t.test('a container against a leaf is one change for the whole value', async (t) => {
  const { changes, leavesCompared } = diffResults({ tiesForFirst: { aicc: ['a', 'b'] } }, { tiesForFirst: null });
  t.same(changes, [{ path: 'tiesForFirst', change: 'value', stored: { aicc: ['a', 'b'] }, now: null, absoluteChange: null, relativeChange: null }]);
  t.equal(leavesCompared, 2);
});

t.test('property: a value never differs from a copy of itself, and one changed leaf is found exactly', async (t) => {
  const json = fc.jsonValue({ maxDepth: 4 }) as fc.Arbitrary<JsonValue>;
  t.doesNotThrow(() => fc.assert(fc.property(json, (value) => diffResults(value, structuredClone(value)).changes.length === 0)), 'self-diff is empty');
  t.doesNotThrow(() => fc.assert(fc.property(fc.array(fc.double({ noNaN: true, noDefaultInfinity: true }), { minLength: 1, maxLength: 20 }), fc.nat(), fc.double({ noNaN: true, noDefaultInfinity: true }), (values, at, replacement) => {
    const i = at % values.length;
    const now = [...values];
    now[i] = replacement;
    const { changes } = diffResults(values, now);
    const expected = values[i] === replacement ? 0 : 1;
    return changes.length === expected && (expected === 0 || changes[0].path === String(i));
  })), 'one changed leaf, found at its index');
});
