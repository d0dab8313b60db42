// The words of the expression grammar and its parse tree. One place, so the
// parser, the derivative code and the messages name the same functions.

/** The functions the grammar knows, each of one argument (radians for the trigonometric ones). */
export const FUNCTIONS = ['exp', 'log', 'log10', 'sqrt', 'abs', 'sin', 'cos', 'tan', 'atan'] as const;
export type FunctionName = (typeof FUNCTIONS)[number];

/** Names that are neither parameters nor columns: the functions and the constant pi. */
export const RESERVED_NAMES: ReadonlySet<string> = new Set<string>([...FUNCTIONS, 'pi']);

export function isFunctionName(name: string): name is FunctionName {
  return (FUNCTIONS as readonly string[]).includes(name);
}

/** A name the grammar can spell: a letter or underscore, then letters, digits or underscores. */
export const NAME_PATTERN = /^[A-Za-z_][A-Za-z0-9_]*$/;

export type BinaryOperator = '+' | '-' | '*' | '/' | '^';

/** A node of the parse tree; `at` is the offset of its first character (UTF-16 units). */
export type ExpressionNode =
  | { kind: 'number'; value: number; at: number }
  | { kind: 'name'; name: string; at: number }
  | { kind: 'pi'; at: number }
  | { kind: 'negate'; arg: ExpressionNode; at: number }
  | { kind: 'binary'; op: BinaryOperator; left: ExpressionNode; right: ExpressionNode; at: number }
  | { kind: 'call'; fn: FunctionName; arg: ExpressionNode; at: number };

/**
 * Limits that keep a hostile expression from exhausting the stack or the
 * work: the longest NIST StRD model (ENSO) has 122 characters and the deepest
 * (Misra1b, -c, -d) nest 4 levels, so these leave room for any model a person
 * writes by hand. Each level costs the parser a few stack frames, far from
 * the engine's limit.
 */
export const EXPRESSION_LIMITS = {
  /** Characters in the expression. */
  maxLength: 2000,
  /** Nesting of parentheses, function calls, unary minus and powers together. */
  maxDepth: 40,
} as const;
