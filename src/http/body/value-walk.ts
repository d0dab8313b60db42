// The walk over the parsed body: refuses, with the path of the first offender,
// keys that could pollute prototypes (__proto__, and a constructor holding
// prototype), strings that are not well-formed UTF-16 (a lone surrogate cannot
// be stored as UTF-8 text, so the audit record would no longer hash as it was
// hashed) and U+0000 (PostgreSQL text cannot hold it); and counts the object
// keys, for the duplicate-key check. Iterative, with an explicit stack: the
// depth is bounded before parsing, but no body should be able to reach the
// call stack's limit through this walk whatever that bound is.

export type ValueRefusal = { kind: 'unsafe-key' | 'bad-text'; path: (string | number)[]; message: string };

export interface ValueWalk {
  refusal: ValueRefusal | null;
  /** Own keys over every object in the value. */
  keys: number;
}

/** A container being walked: where its walk stands, and how its parent reaches it (for the path, built only on refusal). */
interface Frame {
  value: unknown[] | Record<string, unknown>;
  /** The object's own keys; null for an array. */
  keys: string[] | null;
  next: number;
  parent: Frame | null;
  segment: string | number;
}

function pathTo(frame: Frame, last: string | number): (string | number)[] {
  const path: (string | number)[] = [last];
  for (let f: Frame | null = frame; f.parent !== null; f = f.parent) path.unshift(f.segment);
  return path;
}

function textProblem(value: string): string | null {
  if (!(value as unknown as { isWellFormed(): boolean }).isWellFormed()) return 'a string holds a lone UTF-16 surrogate, which is not text';
  if (value.includes('\u0000')) return 'a string holds the NUL character (U+0000)';
  return null;
}

/**
 * Whether any string of the parsed text could hold a lone surrogate or NUL.
 * Either can only arrive escaped (JSON forbids a raw U+0000, and text decoded
 * from UTF-8 holds no lone surrogate), so text without "\\u" that is itself
 * well-formed cannot: one native pass instead of a check per string.
 */
export function textNeedsChecks(text: string): boolean {
  return text.includes('\\u') || !(text as unknown as { isWellFormed(): boolean }).isWellFormed();
}

/** The end of a run of numbers starting at `from`. */
function numberRunEnd(array: unknown[], from: number): number {
  let i = from;
  while (i < array.length && typeof array[i] === 'number') i++;
  return i;
}

/**
 * The index of the next element that needs a look (a container, or a string
 * when strings are checked) from `from` on. Numbers are most of a request's
 * bulk; their runs are skipped by a loop of their own, which V8 keeps
 * specialised to arrays of doubles (measured: one loop for every kind of
 * element ran up to 20× slower once it had seen arrays of objects).
 */
function nextToVisit(array: unknown[], from: number, checkText: boolean): number {
  let i = from;
  while (i < array.length) {
    const v = array[i];
    if (typeof v === 'number') {
      i = numberRunEnd(array, i);
      continue;
    }
    if (v !== null && (checkText || typeof v === 'object')) return i;
    i++;
  }
  return array.length;
}

function frameOf(value: object, parent: Frame | null, segment: string | number): Frame {
  if (Array.isArray(value)) return { value, keys: null, next: 0, parent, segment };
  return { value: value as Record<string, unknown>, keys: Object.keys(value), next: 0, parent, segment };
}

/**
 * Depth first, in document order: the refusal named is the first offender in
 * the text. `checkText` false skips the string checks, for a body whose text
 * shows none can fail (see textNeedsChecks).
 */
export function walkValue(root: unknown, checkText = true): ValueWalk {
  if (typeof root === 'string' && checkText) {
    const message = textProblem(root);
    return { refusal: message === null ? null : { kind: 'bad-text', path: [], message }, keys: 0 };
  }
  if (root === null || typeof root !== 'object') return { refusal: null, keys: 0 };
  let keys = 0;
  const stack: Frame[] = [frameOf(root, null, '')];
  keys += stack[0].keys?.length ?? 0;
  while (stack.length > 0) {
    const frame = stack[stack.length - 1];
    let child: unknown;
    let segment: string | number;
    if (frame.keys === null) {
      const array = frame.value as unknown[];
      const i = nextToVisit(array, frame.next, checkText);
      if (i >= array.length) {
        stack.pop();
        continue;
      }
      frame.next = i + 1;
      child = array[i];
      segment = i;
    } else {
      if (frame.next >= frame.keys.length) {
        stack.pop();
        continue;
      }
      const key = frame.keys[frame.next++];
      child = (frame.value as Record<string, unknown>)[key];
      segment = key;
      if (key === '__proto__' || (key === 'constructor' && child !== null && typeof child === 'object' && 'prototype' in child)) {
        return { refusal: { kind: 'unsafe-key', path: pathTo(frame, key), message: `the key "${key}" is refused: it could alter object prototypes` }, keys };
      }
      const badKey = checkText ? textProblem(key) : null;
      if (badKey !== null) return { refusal: { kind: 'bad-text', path: pathTo(frame, key), message: badKey }, keys };
    }
    if (typeof child === 'string') {
      const message = checkText ? textProblem(child) : null;
      if (message !== null) return { refusal: { kind: 'bad-text', path: pathTo(frame, segment), message }, keys };
    } else if (child !== null && typeof child === 'object') {
      const inner = frameOf(child, frame, segment);
      keys += inner.keys?.length ?? 0;
      stack.push(inner);
    }
  }
  return { refusal: null, keys };
}
