// The expression grammar: precedence and associativity as in mathematics
// (common practice; R and the NIST StRD model files read them alike),
// errors naming the offset and what was expected, and the limits on length
// and nesting.
import t from 'tap';
import { parseExpression } from '../../../../src/core/models/nonlinear/expression/parse.ts';
import { compileTape } from '../../../../src/core/models/nonlinear/expression/tape.ts';
import { TapeEvaluator } from '../../../../src/core/models/nonlinear/expression/evaluate.ts';
import { EXPRESSION_LIMITS } from '../../../../src/core/models/nonlinear/expression/syntax.ts';

/** Value of a parameter- and column-free expression, through the tape. */
function value(text: string): number {
  const parsed = parseExpression(text);
  if ('failure' in parsed) throw new Error(JSON.stringify(parsed.failure));
  const tape = compileTape(parsed.tree, [], []);
  const out = new Float64Array(1);
  new TapeEvaluator(tape, [], 1).values([], out);
  return out[0];
}

function failure(text: string) {
  const parsed = parseExpression(text);
  return 'failure' in parsed ? parsed.failure : null;
}

t.test('precedence and associativity', async (t) => {
  t.equal(value('-2^2'), -4, 'unary minus binds looser than ^');
  t.equal(value('2^-1'), 0.5, 'an exponent may carry a minus');
  t.equal(value('2^3^2'), 512, '^ is right-associative');
  t.equal(value('1-2-3'), -4, '- is left-associative');
  t.equal(value('8/4/2'), 1, '/ is left-associative');
  t.equal(value('2+3*4'), 14);
  t.equal(value('(2+3)*4'), 20);
  t.equal(value('2*-3'), -6, 'a factor may be negated');
  t.equal(value('2--3'), 5);
  t.equal(value('--2'), 2);
  t.equal(value(' 1.5e2 + .5 '), 150.5, 'numbers with exponents, a leading dot and spaces');
  t.equal(value('pi'), Math.PI);
  t.equal(value('sqrt(16) + abs(-2) + exp(0) + log(1) + log10(1000)'), 4 + 2 + 1 + 0 + 3);
  t.equal(value('atan(1)*4'), Math.PI);
  t.equal(value('sin(0) + cos(0) + tan(0)'), 1);
});

t.test('errors name the offset and what was expected', async (t) => {
  t.match(failure('b1*(x'), { reason: 'syntax', at: 5, expected: "')' to close the '(' at offset 3", found: 'the end of the expression' });
  t.match(failure('b1*x)'), { reason: 'syntax', at: 4, found: "')'" });
  t.match(failure('2x'), { reason: 'syntax', at: 1, found: 'the name "x"' });
  t.match(failure('b1 +'), { reason: 'syntax', at: 4, expected: "a number, a name, '(' or '-'" });
  t.match(failure('b1 * * x'), { reason: 'syntax', at: 5, found: "'*'" });
  t.match(failure('+x'), { reason: 'syntax', at: 0, found: "'+'" }, 'no unary plus');
  t.match(failure('foo(x)'), { reason: 'unknown_function', at: 0, name: 'foo' });
  t.match(failure('b1 * exp x'), { reason: 'syntax', at: 9, expected: "'(' after exp (a function, as in exp(x))" });
  t.match(failure('pi(2)'), { reason: 'syntax', at: 2 });
  t.match(failure('b1 + $'), { reason: 'syntax', at: 5, found: 'the character "$"' });
  t.match(failure('max(a, b)'), { reason: 'unknown_function', name: 'max' });
  t.match(failure('exp(a, b)'), { reason: 'syntax', at: 5, found: 'the character ","' });
  t.match(failure(''), { reason: 'syntax', at: 0, found: 'an empty expression' });
  t.match(failure('   '), { reason: 'syntax', found: 'an empty expression' });
  t.match(failure('1e999'), { reason: 'syntax', at: 0, expected: 'a number within the range of a double (below 1.8e308)' });
  t.match(failure('x[1]'), { reason: 'syntax', at: 1 });
  t.match(failure('constructor(x)'), { reason: 'unknown_function', name: 'constructor' }, 'no property lookups by name');
});

t.test('limits on length and nesting', async (t) => {
  const limit = EXPRESSION_LIMITS.maxDepth;
  const nested = (k: number) => '('.repeat(k) + 'x' + ')'.repeat(k);
  t.equal(failure(nested(limit)), null, `${limit} parentheses deep is accepted`);
  t.match(failure(nested(limit + 1)), { reason: 'too_deep', at: limit, limit });
  t.equal(failure('-'.repeat(limit) + 'x'), null);
  t.match(failure('-'.repeat(limit + 1) + 'x'), { reason: 'too_deep', limit });
  t.match(failure(Array(limit + 2).fill('x').join('^')), { reason: 'too_deep' }, 'a chain of powers counts too');
  t.match(failure('exp('.repeat(limit + 1) + 'x' + ')'.repeat(limit + 1)), { reason: 'too_deep' });
  // A long flat sum is fine up to the length limit: no recursion per term.
  const flat = Array(Math.floor(EXPRESSION_LIMITS.maxLength / 4)).fill('x').join(' + ');
  t.ok(flat.length <= EXPRESSION_LIMITS.maxLength);
  t.equal(failure(flat), null);
  t.match(failure('x+'.repeat(EXPRESSION_LIMITS.maxLength) + 'x'), { reason: 'too_long', limit: EXPRESSION_LIMITS.maxLength });
  // Hostile input far beyond the limits is refused before any recursion.
  t.match(failure('('.repeat(1e6)), { reason: 'too_long' });
});

t.test('the tape shares equal subexpressions and folds constants in double-double', async (t) => {
  const parsed = parseExpression('b1*exp(-b2*x) + b3*exp(-b2*x) + 2*pi/12');
  if ('failure' in parsed) throw new Error('parse');
  const tape = compileTape(parsed.tree, ['b1', 'b2', 'b3'], ['x']);
  t.equal(tape.ops.filter((op) => op.code === 'exp').length, 1, 'exp(-b2*x) once');
  const consts = tape.ops.filter((op) => op.code === 'const');
  t.equal(consts.length, 1, '2*pi/12 folded to one constant');
  // pi/6 to double-double accuracy (pi split from mpmath in dd-elementary.ts).
  t.ok(consts[0].code === 'const' && Math.abs(consts[0].hi - Math.PI / 6) <= Number.EPSILON * 0.6);
  t.same(tape.params.slice(-1), [true]);
  const bare = parseExpression('(x + 1)^2');
  if ('failure' in bare) throw new Error('parse');
  const dataOnly = compileTape(bare.tree, [], ['x']);
  t.ok(dataOnly.ops.some((op) => op.code === 'powi'), 'an integer exponent is applied by multiplication');
  t.same(dataOnly.rows.slice(-1), [true]);
  t.same(dataOnly.params.slice(-1), [false]);
});
