// A recursive-descent parser of the expression grammar, written for this
// purpose: nothing here can reach JavaScript (no eval, no Function, no
// property lookups by user-supplied names). Grammar, by increasing precedence:
//
//   sum     := product (('+' | '-') product)*
//   product := unary (('*' | '/') unary)*
//   unary   := '-' unary | power
//   power   := primary ('^' unary)?        right-associative: a^b^c = a^(b^c)
//   primary := number | 'pi' | name | function '(' sum ')' | '(' sum ')'
//
// '^' binds tighter than unary minus (-x^2 is -(x^2)) and its exponent may
// carry a minus (x^-2), the usual mathematical reading (common practice;
// R and the NIST StRD model files read them the same way).
import { EXPRESSION_LIMITS, isFunctionName, type BinaryOperator, type ExpressionNode } from './syntax.ts';

/** Why an expression could not be read, at a 0-based offset into it (UTF-16 units). */
export type ParseFailure =
  | { reason: 'syntax'; at: number; expected: string; found: string }
  | { reason: 'unknown_function'; at: number; name: string }
  | { reason: 'too_long'; at: number; length: number; limit: number }
  | { reason: 'too_deep'; at: number; limit: number };

type Token =
  | { kind: 'number'; value: number; text: string; at: number }
  | { kind: 'name'; name: string; at: number }
  | { kind: 'symbol'; symbol: '+' | '-' | '*' | '/' | '^' | '(' | ')'; at: number }
  | { kind: 'end'; at: number }
  /** What the lexer could not read; the parser reports it only on reaching it, so errors come in reading order. */
  | { kind: 'invalid'; at: number; failure: ParseFailure };

const NUMBER = /(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?/y;
const NAME = /[A-Za-z_][A-Za-z0-9_]*/y;
const SYMBOLS = '+-*/^()';

class Failure {
  constructor(readonly failure: ParseFailure) {}
}

function describe(token: Token): string {
  switch (token.kind) {
    case 'number': return `the number ${token.text}`;
    case 'name': return `the name ${JSON.stringify(token.name)}`;
    case 'symbol': return `'${token.symbol}'`;
    case 'end': return 'the end of the expression';
    case 'invalid': return 'an unreadable token';
  }
}

function tokenize(text: string): Token[] {
  const tokens: Token[] = [];
  let i = 0;
  while (i < text.length) {
    const c = text[i];
    if (c === ' ' || c === '\t' || c === '\n' || c === '\r') {
      i++;
      continue;
    }
    NUMBER.lastIndex = i;
    const number = NUMBER.exec(text);
    if (number) {
      const value = Number(number[0]);
      if (!Number.isFinite(value)) {
        tokens.push({ kind: 'invalid', at: i, failure: { reason: 'syntax', at: i, expected: 'a number within the range of a double (below 1.8e308)', found: number[0] } });
        return tokens;
      }
      tokens.push({ kind: 'number', value, text: number[0], at: i });
      i += number[0].length;
      continue;
    }
    NAME.lastIndex = i;
    const name = NAME.exec(text);
    if (name) {
      tokens.push({ kind: 'name', name: name[0], at: i });
      i += name[0].length;
      continue;
    }
    if (SYMBOLS.includes(c)) {
      tokens.push({ kind: 'symbol', symbol: c as '+', at: i });
      i++;
      continue;
    }
    const char = String.fromCodePoint(text.codePointAt(i)!);
    tokens.push({
      kind: 'invalid', at: i,
      failure: { reason: 'syntax', at: i, found: `the character ${JSON.stringify(char)}`, expected: 'a number, a name, one of + - * / ^ ( ) or a space' },
    });
    return tokens;
  }
  tokens.push({ kind: 'end', at: text.length });
  return tokens;
}

const OPERAND = "a number, a name, '(' or '-'";

class Parser {
  private index = 0;
  private depth = 0;
  constructor(private readonly tokens: Token[]) {}

  parse(): ExpressionNode {
    const tree = this.sum();
    const next = this.peek();
    if (next.kind !== 'end') {
      const expected = next.kind === 'symbol' && next.symbol === ')'
        ? "an operator or the end of the expression (this ')' closes nothing)"
        : 'an operator (+ - * / ^) or the end of the expression';
      this.fail(next, expected);
    }
    return tree;
  }

  private peek(): Token {
    const token = this.tokens[this.index];
    if (token.kind === 'invalid') throw new Failure(token.failure);
    return token;
  }

  private next(): Token {
    const token = this.peek();
    this.index++;
    return token;
  }

  private isSymbol(token: Token, ...symbols: string[]): token is Extract<Token, { kind: 'symbol' }> {
    return token.kind === 'symbol' && symbols.includes(token.symbol);
  }

  private fail(token: Token, expected: string): never {
    throw new Failure({ reason: 'syntax', at: token.at, expected, found: describe(token) });
  }

  /** Counts nesting so that no input can recurse deeper than the stated limit. */
  private enter(at: number): void {
    if (++this.depth > EXPRESSION_LIMITS.maxDepth) {
      throw new Failure({ reason: 'too_deep', at, limit: EXPRESSION_LIMITS.maxDepth });
    }
  }

  private sum(): ExpressionNode {
    return this.leftAssociative(() => this.product(), '+', '-');
  }

  private product(): ExpressionNode {
    return this.leftAssociative(() => this.unary(), '*', '/');
  }

  /** operand (op operand)* for operators of one precedence, grouped from the left: 1-2-3 is (1-2)-3. */
  private leftAssociative(operand: () => ExpressionNode, ...symbols: BinaryOperator[]): ExpressionNode {
    let left = operand();
    for (let next = this.peek(); this.isSymbol(next, ...symbols); next = this.peek()) {
      this.next();
      left = { kind: 'binary', op: next.symbol as BinaryOperator, left, right: operand(), at: left.at };
    }
    return left;
  }

  private unary(): ExpressionNode {
    const token = this.peek();
    if (!this.isSymbol(token, '-')) return this.power();
    this.next();
    this.enter(token.at);
    const arg = this.unary();
    this.depth--;
    return { kind: 'negate', arg, at: token.at };
  }

  private power(): ExpressionNode {
    const base = this.primary();
    const caret = this.peek();
    if (!this.isSymbol(caret, '^')) return base;
    this.next();
    this.enter(caret.at);
    const exponent = this.unary();
    this.depth--;
    return { kind: 'binary', op: '^', left: base, right: exponent, at: base.at };
  }

  private primary(): ExpressionNode {
    const token = this.next();
    if (token.kind === 'number') return { kind: 'number', value: token.value, at: token.at };
    if (token.kind === 'name') {
      const opens = this.isSymbol(this.peek(), '(');
      if (token.name === 'pi') {
        if (opens) this.fail(this.peek(), "an operator after pi (pi is a constant, not a function)");
        return { kind: 'pi', at: token.at };
      }
      if (isFunctionName(token.name)) {
        if (!opens) this.fail(this.peek(), `'(' after ${token.name} (a function, as in ${token.name}(x))`);
        const arg = this.group(this.next().at);
        return { kind: 'call', fn: token.name, arg, at: token.at };
      }
      if (opens) throw new Failure({ reason: 'unknown_function', at: token.at, name: token.name });
      return { kind: 'name', name: token.name, at: token.at };
    }
    if (this.isSymbol(token, '(')) return this.group(token.at);
    this.fail(token, OPERAND);
  }

  /** The rest of a parenthesised sum, after its '(' (which opened at `at`). */
  private group(at: number): ExpressionNode {
    this.enter(at);
    const inner = this.sum();
    const close = this.peek();
    if (!this.isSymbol(close, ')')) {
      const expected = close.kind === 'end'
        ? `')' to close the '(' at offset ${at}`
        : `an operator or ')' to close the '(' at offset ${at}`;
      this.fail(close, expected);
    }
    this.next();
    this.depth--;
    return inner;
  }
}

/** The parse tree, or where and why the expression cannot be read. */
export function parseExpression(text: string): { tree: ExpressionNode } | { failure: ParseFailure } {
  if (text.length > EXPRESSION_LIMITS.maxLength) {
    return { failure: { reason: 'too_long', at: EXPRESSION_LIMITS.maxLength, length: text.length, limit: EXPRESSION_LIMITS.maxLength } };
  }
  try {
    const tokens = tokenize(text);
    if (tokens[0].kind === 'end') {
      return { failure: { reason: 'syntax', at: 0, expected: 'an expression', found: 'an empty expression' } };
    }
    return { tree: new Parser(tokens).parse() };
  } catch (e) {
    if (e instanceof Failure) return { failure: e.failure };
    throw e;
  }
}

/** Every name the tree uses (parameters and columns), with the offset of its first use. */
export function namesUsed(tree: ExpressionNode): Map<string, number> {
  const names = new Map<string, number>();
  const visit = (node: ExpressionNode): void => {
    switch (node.kind) {
      case 'name':
        if (!names.has(node.name) || names.get(node.name)! > node.at) names.set(node.name, node.at);
        return;
      case 'negate':
      case 'call':
        visit(node.arg);
        return;
      case 'binary':
        visit(node.left);
        visit(node.right);
        return;
      default:
        return;
    }
  };
  visit(tree);
  return names;
}
