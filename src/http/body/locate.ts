// The slow path, run only on a body about to be refused: a token walk over
// the text that keeps the path to where it is (object keys and array indices),
// to name where the first duplicate key, or the first container beyond the
// depth limit, sits. Iterative, with its own stack, so no nesting overflows it.
import { skipWhitespace, stringEnd } from './text-scan.ts';

type Frame =
  | { kind: 'object'; keys: Set<string>; key: string | null; expectKey: boolean }
  | { kind: 'array'; index: number };

export type Located = { path: (string | number)[] };

function pathOf(stack: Frame[]): (string | number)[] {
  return stack.map((f) => (f.kind === 'array' ? f.index : (f.key ?? '')));
}

const SCALAR_END = /[,\]}\s]/g;

/** The end (exclusive) of a number, true, false or null starting at `from`. */
function scalarEnd(text: string, from: number): number {
  SCALAR_END.lastIndex = from;
  return SCALAR_END.test(text) ? SCALAR_END.lastIndex - 1 : text.length;
}

/**
 * Where the first object key repeats an earlier key of the same object (keys
 * compared after unescaping, so "a" and "\u0061" are the same key), or where
 * the container opening at `containerAt` sits. null when the text has neither
 * (or is not JSON).
 */
export function locateInJson(text: string, target: { duplicateKey: true } | { containerAt: number }): Located | null {
  const stack: Frame[] = [];
  let at = 0;
  while (at < text.length) {
    at = skipWhitespace(text, at);
    if (at >= text.length) break;
    const top = stack[stack.length - 1];
    const c = text[at];
    if (c === '{' || c === '[') {
      if ('containerAt' in target && target.containerAt === at) return { path: pathOf(stack) };
      stack.push(c === '{' ? { kind: 'object', keys: new Set(), key: null, expectKey: true } : { kind: 'array', index: 0 });
      at++;
    } else if (c === '}' || c === ']') {
      stack.pop();
      at++;
    } else if (c === ',') {
      if (top?.kind === 'array') top.index++;
      else if (top?.kind === 'object') top.expectKey = true;
      at++;
    } else if (c === ':') {
      at++;
    } else if (c === '"') {
      const end = stringEnd(text, at);
      if (end < 0) return null;
      if (top?.kind === 'object' && top.expectKey) {
        let key: string;
        try {
          key = JSON.parse(text.slice(at, end + 1)) as string;
        } catch {
          return null;
        }
        top.key = key;
        top.expectKey = false;
        if ('duplicateKey' in target && top.keys.has(key)) return { path: pathOf(stack) };
        top.keys.add(key);
      }
      at = end + 1;
    } else {
      at = Math.max(at + 1, scalarEnd(text, at));
    }
  }
  return null;
}
