// Properties of the parser and of the derivatives over random expressions
// (fast-check): printing a tree with the fewest parentheses and parsing it
// back gives the same tree; the tape's double evaluation agrees with a plain
// recursive evaluation of the tree; its reverse-mode Jacobian agrees with
// central differences of the double-double evaluation (step 1e-7 relative,
// so truncation ~1e-14 and rounding ~1e-25: an independent check of every
// derivative rule to about 1e-8).
import t from 'tap';
import fc from 'fast-check';
import { parseExpression } from '../../../../src/core/models/nonlinear/expression/parse.ts';
import { compileTape } from '../../../../src/core/models/nonlinear/expression/tape.ts';
import { TapeEvaluator } from '../../../../src/core/models/nonlinear/expression/evaluate.ts';
import { valuesDD } from '../../../../src/core/models/nonlinear/expression/evaluate-dd.ts';
import { FUNCTIONS, type ExpressionNode } from '../../../../src/core/models/nonlinear/expression/syntax.ts';

const PARAMETERS = ['b1', 'b2', 'b3'];
const COLUMNS = ['x', 'z'];

type Tree = ExpressionNode;
const at = 0;

const treeArb: fc.Arbitrary<Tree> = fc.letrec<{ node: Tree }>((tie) => ({
  node: fc.oneof(
    { depthSize: 'medium', withCrossShrink: true },
    fc.constantFrom(...PARAMETERS, ...COLUMNS).map((name): Tree => ({ kind: 'name', name, at })),
    fc.constantFrom(0.5, 1, 2, 3, 1.25, 10).map((value): Tree => ({ kind: 'number', value, at })),
    fc.constant<Tree>({ kind: 'pi', at }),
    tie('node').map((arg): Tree => ({ kind: 'negate', arg, at })),
    fc.tuple(fc.constantFrom(...FUNCTIONS), tie('node')).map(([fn, arg]): Tree => ({ kind: 'call', fn, arg, at })),
    fc.tuple(fc.constantFrom('+', '-', '*', '/', '^' as const), tie('node'), tie('node'))
      .map(([op, left, right]): Tree => ({ kind: 'binary', op, left, right, at })),
  ),
})).node;

const PRECEDENCE = { '+': 1, '-': 1, '*': 2, '/': 2, negate: 3, '^': 4, primary: 5 } as const;

function precedence(node: Tree): number {
  if (node.kind === 'binary') return PRECEDENCE[node.op];
  if (node.kind === 'negate') return PRECEDENCE.negate;
  return PRECEDENCE.primary;
}

/** The tree printed with only the parentheses the grammar needs to read it back as the same tree. */
function print(node: Tree): string {
  const wrap = (child: Tree, needs: number) => (precedence(child) >= needs ? print(child) : `(${print(child)})`);
  switch (node.kind) {
    case 'number': return String(node.value);
    case 'name': return node.name;
    case 'pi': return 'pi';
    case 'call': return `${node.fn}(${print(node.arg)})`;
    case 'negate': return `-${wrap(node.arg, PRECEDENCE.negate)}`;
    case 'binary': {
      const own = PRECEDENCE[node.op];
      if (node.op === '^') return `${wrap(node.left, PRECEDENCE.primary)}^${wrap(node.right, PRECEDENCE.negate)}`;
      return `${wrap(node.left, own)} ${node.op} ${wrap(node.right, own + 1)}`;
    }
  }
}

function withoutOffsets(node: Tree): unknown {
  return JSON.parse(JSON.stringify(node, (key, v) => (key === 'at' ? undefined : v)));
}

/** A plain recursive evaluation of the tree with Math's functions. */
function evaluate(node: Tree, env: Record<string, number>): number {
  switch (node.kind) {
    case 'number': return node.value;
    case 'name': return env[node.name];
    case 'pi': return Math.PI;
    case 'negate': return -evaluate(node.arg, env);
    case 'call': {
      const a = evaluate(node.arg, env);
      const fns: Record<string, (v: number) => number> = {
        exp: Math.exp, log: Math.log, log10: Math.log10, sqrt: Math.sqrt, abs: Math.abs,
        sin: Math.sin, cos: Math.cos, tan: Math.tan, atan: Math.atan,
      };
      return fns[node.fn](a);
    }
    case 'binary': {
      const a = evaluate(node.left, env);
      const b = evaluate(node.right, env);
      switch (node.op) {
        case '+': return a + b;
        case '-': return a - b;
        case '*': return a * b;
        case '/': return a / b;
        case '^': return Math.pow(a, b);
      }
    }
  }
}

// Decimal-like points off the special values (0, subnormals) where random
// expressions meet their kinks and poles.
const coordinate = (min: number, max: number) => fc.integer({ min: min * 1000, max: max * 1000 }).map((k) => k / 1000 + 1 / 7919);
const pointArb = fc.record({
  b1: coordinate(0.2, 3),
  b2: coordinate(-2, 2),
  b3: coordinate(0.5, 1.5),
  x: coordinate(0.1, 4),
  z: coordinate(-3, 3),
});

function compiled(tree: Tree) {
  const parsed = parseExpression(print(tree));
  if ('failure' in parsed) throw new Error(`unparsable: ${print(tree)}`);
  return compileTape(parsed.tree, PARAMETERS, COLUMNS);
}

/** Close to within `tolerance` relative to the larger magnitude, or both non-finite. */
function agree(a: number, b: number, tolerance: number): boolean {
  if (!Number.isFinite(a) || !Number.isFinite(b)) return !Number.isFinite(a) && !Number.isFinite(b);
  return Math.abs(a - b) <= tolerance * Math.max(Math.abs(a), Math.abs(b), 1e-300);
}

t.test('printing with minimal parentheses and parsing back gives the same tree', async () => {
  fc.assert(fc.property(treeArb, (tree) => {
    const parsed = parseExpression(print(tree));
    if ('failure' in parsed) return false;
    return JSON.stringify(withoutOffsets(parsed.tree)) === JSON.stringify(withoutOffsets(tree));
  }), { numRuns: 500 });
});

t.test('the tape evaluates as a plain recursive evaluation of the tree', async (t) => {
  // The tape folds constants in double-double, so where a random expression
  // cancels catastrophically (log10(sin(pi))) it is right and a plain double
  // evaluation is not. Points where the plain evaluation and the extended one
  // disagree are ill-conditioned and skipped; the rest must agree, and most
  // points must be of that kind.
  let compared = 0;
  let skipped = 0;
  fc.assert(fc.property(treeArb, pointArb, (tree, point) => {
    const columns = [Float64Array.of(point.x), Float64Array.of(point.z)];
    const b = [point.b1, point.b2, point.b3];
    const direct = evaluate(tree, point);
    const tape = compiled(tree);
    const out = new Float64Array(1);
    new TapeEvaluator(tape, columns, 1).values(b, out);
    const ddh = new Float64Array(1);
    const ddl = new Float64Array(1);
    valuesDD(tape, columns, 1, b, ddh, ddl);
    if (!agree(direct, ddh[0], 1e-8)) {
      skipped++;
      return true;
    }
    compared++;
    return agree(out[0], ddh[0], 1e-8);
  }), { numRuns: 500 });
  t.ok(compared >= 0.8 * (compared + skipped), `compared ${compared}, skipped ${skipped} ill-conditioned points`);
});

/** Central difference of the double-double evaluation in parameter j with relative step h. */
function centralDifference(tape: ReturnType<typeof compiled>, columns: Float64Array[], b: number[], j: number, h: number): number {
  const step = h * Math.max(1, Math.abs(b[j]));
  const up = [...b];
  const down = [...b];
  up[j] = b[j] + step;
  down[j] = b[j] - step;
  const width = up[j] - down[j]; // the step actually taken (exact)
  const uh = new Float64Array(1);
  const ul = new Float64Array(1);
  const dh = new Float64Array(1);
  const dl = new Float64Array(1);
  valuesDD(tape, columns, 1, up, uh, ul);
  valuesDD(tape, columns, 1, down, dh, dl);
  return (uh[0] - dh[0] + (ul[0] - dl[0])) / width;
}

t.test('reverse-mode derivatives agree with central differences of the extended evaluation', async (t) => {
  // A difference is trusted where it is stable: at relative steps 1e-6 and
  // 2.5e-7 it must agree to 1e-6, which rules out points within a step of a
  // kink or pole (counted and skipped); Richardson extrapolation of the two
  // then leaves an error of order h^4 ~ 1e-24 plus double-double rounding.
  let compared = 0;
  let skipped = 0;
  fc.assert(fc.property(treeArb, pointArb, (tree, point) => {
    const tape = compiled(tree);
    const columns = [Float64Array.of(point.x), Float64Array.of(point.z)];
    const b = [point.b1, point.b2, point.b3];
    const f = new Float64Array(1);
    const jac = new Float64Array(3);
    new TapeEvaluator(tape, columns, 1).valuesAndJacobian(b, f, jac);
    if (!Number.isFinite(f[0])) return true; // outside the expression's domain: nothing to differentiate
    for (let j = 0; j < 3; j++) {
      const coarse = centralDifference(tape, columns, b, j, 1e-6);
      const fine = centralDifference(tape, columns, b, j, 2.5e-7);
      const scale = Math.max(Math.abs(fine), Math.abs(f[0]), 1);
      // Unstable differences, and a derivative the rules leave undefined
      // (z^(b - b) at z < 0 is 1 for b - b = 0 only), are counted as skipped.
      if (!Number.isFinite(coarse) || !Number.isFinite(fine) || Math.abs(coarse - fine) > 1e-6 * scale || !Number.isFinite(jac[j])) {
        skipped++;
        continue;
      }
      // Richardson extrapolation removes the h² term of both differences.
      const extrapolated = (16 * fine - coarse) / 15;
      if (!(Math.abs(extrapolated - jac[j]) <= 1e-9 * scale)) return false;
      if (jac[j] !== 0) compared++; // a parameter the expression lacks proves little
    }
    return true;
  }), { numRuns: 1500 });
  t.ok(compared >= 10 * skipped && compared >= 300, `compared ${compared} nonzero derivatives, skipped ${skipped} near a kink or pole`);
});
