// The parse tree compiled to a tape: a list of operations in evaluation
// order, each reading earlier entries. Equal subexpressions share one entry
// (hash-consing; + and * are commutative in IEEE arithmetic, so their
// operands are put in a canonical order without changing any value), and
// every subexpression free of rows and parameters is folded to a
// double-double constant once (so 2*pi/12 keeps pi's 32 digits in the
// extended evaluation). Each entry records whether it depends on the rows
// and on the parameters: data-only entries (cos(2*pi*x/12)) are computed once
// per fit, parameter-only ones (1/b3) once per parameter vector, and only
// entries that depend on both are evaluated row by row at every iteration.
import { ddAdd, ddDiv, ddMul, ddSqrtDD, type DD } from '../../../numeric/double-double.ts';
import { DD_PI, ddAtanDD, ddExpDD, ddLog10DD, ddLogDD, ddPowDD, ddPowIntDD, ddSinCos, ddTanDD } from '../../../numeric/dd-elementary.ts';
import type { ExpressionNode, FunctionName } from './syntax.ts';

export type UnaryCode = 'neg' | FunctionName;
export type BinaryCode = 'add' | 'sub' | 'mul' | 'div' | 'pow';

export type TapeOp =
  | { code: 'const'; hi: number; lo: number }
  | { code: 'param'; index: number }
  | { code: 'column'; index: number }
  | { code: UnaryCode; a: number }
  | { code: BinaryCode; a: number; b: number }
  /** a^n for a constant integer n: binary powering, exact derivative n a^(n-1). */
  | { code: 'powi'; a: number; n: number };

export interface Tape {
  ops: TapeOp[];
  /** Per entry: depends on the data rows. */
  rows: boolean[];
  /** Per entry: depends on the parameters. */
  params: boolean[];
  /** The entry holding the expression's value. */
  output: number;
  parameters: readonly string[];
  columns: readonly string[];
}

/** Integer exponents up to this size are applied by repeated multiplication. */
const MAX_INTEGER_EXPONENT = 1024;

const BINARY: Record<'+' | '-' | '*' | '/' | '^', BinaryCode> = { '+': 'add', '-': 'sub', '*': 'mul', '/': 'div', '^': 'pow' };

/** The double-double value of an operation on constant operands. */
export function applyDD(code: UnaryCode | BinaryCode, a: DD, b: DD = [0, 0]): DD {
  switch (code) {
    case 'neg': return [-a[0], -a[1]];
    case 'add': return ddAdd(a[0], a[1], b[0], b[1]);
    case 'sub': return ddAdd(a[0], a[1], -b[0], -b[1]);
    case 'mul': return ddMul(a[0], a[1], b[0], b[1]);
    case 'div': return ddDiv(a[0], a[1], b[0], b[1]);
    case 'pow': return ddPowDD(a[0], a[1], b[0], b[1]);
    case 'exp': return ddExpDD(a[0], a[1]);
    case 'log': return ddLogDD(a[0], a[1]);
    case 'log10': return ddLog10DD(a[0], a[1]);
    case 'sqrt': return a[0] < 0 ? [NaN, 0] : ddSqrtDD(a[0], a[1]);
    case 'abs': return a[0] < 0 || (a[0] === 0 && a[1] < 0) ? [-a[0], -a[1]] : a;
    case 'sin': return ddSinCos(a[0], a[1]).sin;
    case 'cos': return ddSinCos(a[0], a[1]).cos;
    case 'tan': return ddTanDD(a[0], a[1]);
    case 'atan': return ddAtanDD(a[0], a[1]);
  }
}

export function powIntDD(a: DD, n: number): DD {
  return ddPowIntDD(a[0], a[1], n);
}

/** A key equal for equal operations; constants by exact value, -0 and NaN included. */
function opKey(op: TapeOp): string {
  if (op.code !== 'const') return JSON.stringify(op);
  const text = (v: number) => (Object.is(v, -0) ? '-0' : String(v));
  return `const ${text(op.hi)} ${text(op.lo)}`;
}

class TapeBuilder {
  readonly ops: TapeOp[] = [];
  readonly rows: boolean[] = [];
  readonly params: boolean[] = [];
  private readonly index = new Map<string, number>();

  constructor(
    private readonly parameterIndex: ReadonlyMap<string, number>,
    private readonly columnIndex: ReadonlyMap<string, number>,
  ) {}

  private add(op: TapeOp, rows: boolean, params: boolean): number {
    const key = opKey(op);
    const known = this.index.get(key);
    if (known !== undefined) return known;
    this.ops.push(op);
    this.rows.push(rows);
    this.params.push(params);
    this.index.set(key, this.ops.length - 1);
    return this.ops.length - 1;
  }

  private constant(value: DD): number {
    return this.add({ code: 'const', hi: value[0], lo: value[1] }, false, false);
  }

  private constValue(k: number): DD | null {
    const op = this.ops[k];
    return op.code === 'const' ? [op.hi, op.lo] : null;
  }

  private unary(code: UnaryCode, a: number): number {
    const c = this.constValue(a);
    if (c) return this.constant(applyDD(code, c));
    return this.add({ code, a }, this.rows[a], this.params[a]);
  }

  private binary(code: BinaryCode, a: number, b: number): number {
    const ca = this.constValue(a);
    const cb = this.constValue(b);
    if (ca && cb) return this.constant(applyDD(code, ca, cb));
    if (code === 'pow' && cb && cb[1] === 0 && Number.isInteger(cb[0]) && Math.abs(cb[0]) <= MAX_INTEGER_EXPONENT) {
      return this.add({ code: 'powi', a, n: cb[0] }, this.rows[a], this.params[a]);
    }
    if ((code === 'add' || code === 'mul') && b < a) [a, b] = [b, a];
    return this.add({ code, a, b }, this.rows[a] || this.rows[b], this.params[a] || this.params[b]);
  }

  build(node: ExpressionNode): number {
    switch (node.kind) {
      case 'number': return this.constant([node.value, 0]);
      case 'pi': return this.constant(DD_PI);
      case 'name': {
        const p = this.parameterIndex.get(node.name);
        if (p !== undefined) return this.add({ code: 'param', index: p }, false, true);
        return this.add({ code: 'column', index: this.columnIndex.get(node.name)! }, true, false);
      }
      case 'negate': return this.unary('neg', this.build(node.arg));
      case 'call': return this.unary(node.fn, this.build(node.arg));
      case 'binary': {
        const a = this.build(node.left);
        const b = this.build(node.right);
        return this.binary(BINARY[node.op], a, b);
      }
    }
  }
}

/**
 * Compiles a parse tree whose every name is a parameter or a column (the
 * caller has checked). Parameter and column indices follow the given orders.
 */
export function compileTape(tree: ExpressionNode, parameters: readonly string[], columns: readonly string[]): Tape {
  const builder = new TapeBuilder(
    new Map(parameters.map((name, i) => [name, i])),
    new Map(columns.map((name, i) => [name, i])),
  );
  const output = builder.build(tree);
  return { ...pruned(builder, output), parameters, columns };
}

/** Keeps only the entries the output reads (folding can orphan some), renumbered in order. */
function pruned(b: TapeBuilder, output: number): Pick<Tape, 'ops' | 'rows' | 'params' | 'output'> {
  const live = new Array<boolean>(b.ops.length).fill(false);
  live[output] = true;
  for (let k = output; k >= 0; k--) {
    if (!live[k]) continue;
    const op = b.ops[k];
    if ('a' in op) live[op.a] = true;
    if ('b' in op) live[op.b] = true;
  }
  const renumber = new Array<number>(b.ops.length).fill(-1);
  const ops: TapeOp[] = [];
  const rows: boolean[] = [];
  const params: boolean[] = [];
  b.ops.forEach((op, k) => {
    if (!live[k]) return;
    renumber[k] = ops.length;
    const copy = { ...op } as TapeOp;
    if ('a' in copy) copy.a = renumber[copy.a];
    if ('b' in copy) copy.b = renumber[copy.b];
    ops.push(copy);
    rows.push(b.rows[k]);
    params.push(b.params[k]);
  });
  return { ops, rows, params, output: renumber[output] };
}
