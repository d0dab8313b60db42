// A nonlinear candidate as the request states it: every problem is an issue
// with the field's path, the offset in the expression where there is one,
// and a plain sentence naming both.
import t from 'tap';
import { prepareNonlinearCandidate, expressionColumnValues, MAX_PARAMETERS } from '../../../../src/core/models/nonlinear/index.ts';
import type { NonlinearCandidateSpec } from '../../../../src/core/models/nonlinear/index.ts';
import { issuePointer } from '../../../../src/core/issues.ts';

const AT = ['candidates', 3];
const hasColumn = (name: string) => ['temp', 'hours', 'kiln'].includes(name);

function issuesOf(spec: Partial<NonlinearCandidateSpec>) {
  const result = prepareNonlinearCandidate({ name: 'curve', expression: 'a*exp(-k*hours)', start: { a: 1, k: 0.1 }, ...spec }, hasColumn, AT);
  return 'issues' in result ? result.issues : [];
}

t.test('a valid candidate compiles, parameters in the order of start, columns in order of use', async (t) => {
  const result = prepareNonlinearCandidate(
    { name: 'arrhenius', expression: 'k0*exp(-ea/(8.314*(temp + 273.15))) * hours^n', start: { n: 1, ea: 5e4, k0: 1e6 } },
    hasColumn, AT,
  );
  if ('issues' in result) throw new Error(result.issues[0].message);
  t.same(result.candidate.parameters, ['n', 'ea', 'k0']);
  t.same(result.candidate.columns, ['temp', 'hours']);
  t.same(result.candidate.columnOffsets, [19, 38]);
  t.equal(result.candidate.starts.length, 1);
  t.same(Array.from(result.candidate.lower), [-Infinity, -Infinity, -Infinity]);
});

t.test('expression problems name the offset and what was expected', async (t) => {
  const [syntax] = issuesOf({ expression: 'a*exp(-k*hours' });
  t.match(syntax, { code: 'expression_syntax', path: [...AT, 'expression'], offset: 14 });
  t.match(syntax.message, /^candidates\/3\/expression cannot be read at offset 14: expected '\)' to close the '\(' at offset 5, found the end of the expression\.$/);
  const [unknownFn] = issuesOf({ expression: 'a*expo(-k*hours)' });
  t.match(unknownFn, { code: 'expression_unknown_function', offset: 2, name: 'expo' });
  t.match(unknownFn.message, /exp, log, log10, sqrt, abs, sin, cos, tan, atan/);
  const [column] = issuesOf({ expression: 'a*exp(-k*hours) + humidity' });
  t.match(column, { code: 'expression_unknown_column', offset: 18, column: 'humidity' });
  t.match(column.message, /neither a parameter \(a key of start\) nor a column of the data/);
  const [long] = issuesOf({ expression: 'a+'.repeat(1500) + 'k*hours' });
  t.match(long, { code: 'expression_too_long', limit: 2000 });
  const [deep] = issuesOf({ expression: '('.repeat(50) + 'a*k*hours' + ')'.repeat(50) });
  t.match(deep, { code: 'expression_too_deep', limit: 40, offset: 40 });
  const [unused] = issuesOf({ start: { a: 1, k: 0.1, c: 2 } });
  t.match(unused, { code: 'parameter_unused', path: [...AT, 'start', 'c'], parameter: 'c' });
});

t.test('start values: one vector or several, the same parameters, finite, spellable names', async (t) => {
  t.match(issuesOf({ start: undefined }), [{ code: 'start_missing', given: 'neither', path: AT }]);
  t.match(issuesOf({ starts: [{ a: 1, k: 0.1 }] }), [{ code: 'start_missing', given: 'both' }]);
  t.match(issuesOf({ start: undefined, starts: [] }), [{ code: 'start_missing' }]);
  t.match(issuesOf({ start: {} }), [{ code: 'start_missing' }]);
  t.match(issuesOf({ start: undefined, starts: [{ a: 1, k: 0.1 }, { a: 2, c: 1 }] }), [
    { code: 'starts_parameters_differ', path: [...AT, 'starts', 1], missing: ['k'], extra: ['c'] },
  ]);
  t.match(issuesOf({ start: { a: Number.NaN, k: Infinity } }), [
    { code: 'start_value_not_finite', path: [...AT, 'start', 'a'] },
    { code: 'start_value_not_finite', path: [...AT, 'start', 'k'] },
  ]);
  t.match(issuesOf({ expression: 'pi*exp(-k*hours)', start: { pi: 1, k: 1 } }), [{ code: 'parameter_name_invalid', parameter: 'pi' }]);
  t.match(issuesOf({ start: { a: 1, k: 1, 'rate-1': 2 } }), [{ code: 'parameter_name_invalid', parameter: 'rate-1' }]);
  // A parameter called like a function makes "exp*hours" unreadable: the name is reported, not the syntax it breaks.
  const named = issuesOf({ expression: 'exp*hours', start: { exp: 1 } });
  t.match(named, [{ code: 'parameter_name_invalid', path: [...AT, 'start', 'exp'], parameter: 'exp' }]);
  t.equal(named.length, 1, 'no syntax issue beside it');
  t.match(issuesOf({ expression: 'a*exp(-k*hours', start: { a: 1, k: 1 } }), [{ code: 'expression_syntax' }], 'with spellable names the syntax issue stands');
  const many = Object.fromEntries(Array.from({ length: MAX_PARAMETERS + 1 }, (_, j) => [`p${j}`, 1]));
  t.match(issuesOf({ expression: Object.keys(many).join('+') + '+hours', start: many }), [{ code: 'parameters_too_many', limit: MAX_PARAMETERS }]);
});

t.test('bounds', async (t) => {
  const ok = prepareNonlinearCandidate({ name: 'b', expression: 'a*exp(-k*hours)', start: { a: 1, k: 0.1 }, bounds: { k: [0, null], a: [null, 10] } }, hasColumn, AT);
  if ('issues' in ok) throw new Error('bounds');
  t.same(Array.from(ok.candidate.lower), [-Infinity, 0]);
  t.same(Array.from(ok.candidate.upper), [10, Infinity]);
  t.match(issuesOf({ bounds: { rate: [0, 1] } }), [{ code: 'bound_unknown_parameter', path: [...AT, 'bounds', 'rate'] }]);
  t.match(issuesOf({ bounds: { k: [1, 1] } }), [{ code: 'bound_invalid', lower: 1, upper: 1 }]);
  t.match(issuesOf({ bounds: { k: [2, 1] } }), [{ code: 'bound_invalid' }]);
  const [outside] = issuesOf({ bounds: { k: [0.5, null] } });
  t.match(outside, { code: 'start_outside_bounds', path: [...AT, 'start', 'k'], value: 0.1, lower: 0.5, upper: null });
  t.match(outside.message, /starts "k" at 0.1, outside its bounds \[0.5, null\]/);
});

t.test('every issue message starts with its path', async (t) => {
  const all = [
    ...issuesOf({ expression: 'a*(' }), ...issuesOf({ start: { a: 1, k: 1, z: 1 } }), ...issuesOf({ bounds: { k: [3, 2] } }),
  ];
  t.ok(all.length >= 3);
  for (const i of all) t.ok(i.message.startsWith(issuePointer(i.path)), i.message);
});

t.test('columns must be numeric on the rows used', async (t) => {
  const prepared = prepareNonlinearCandidate({ name: 'c', expression: 'a + b*kiln', start: { a: 1, b: 1 } }, hasColumn, AT);
  if ('issues' in prepared) throw new Error('prepare');
  const values = expressionColumnValues(prepared.candidate, { kiln: [1, 2, 'west', 4] }, [0, 1, 2, 3], AT);
  t.match(values, { issues: [{ code: 'expression_column_not_numeric', column: 'kiln', offset: 6, row: 2, value: 'west', path: [...AT, 'expression'] }] });
  const fine = expressionColumnValues(prepared.candidate, { kiln: [1, 2, 'west', 4] }, [0, 1, 3], AT);
  t.same('values' in fine ? Array.from(fine.values[0]) : null, [1, 2, 4], 'only the rows used are read');
});
