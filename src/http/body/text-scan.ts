// Passes over the JSON text before JSON.parse builds anything: how deep the
// containers nest (so a body of a million "[" is refused before it becomes a
// million arrays), and how many object keys can have been written (JSON.parse
// keeps only the last of two equal keys, so fewer keys in the parsed value
// than written means a duplicate: I-JSON, RFC 7493 §2.3).
//
// Speed is why it looks like this: a columnar body is mostly digits, commas
// and dots, and indexOf skips them in native code. Only when the text holds
// more brackets than the depth limit could be exceeded by does a closer scan
// (one stop per string and bracket) measure the depth. scripts/bench-json-body.ts
// measures the whole parser against plain JSON.parse.

export interface TextScan {
  /**
   * Quotes followed by a colon: every object key written, plus any string that
   * opens with a colon or holds an escaped quote before one. So never fewer than
   * the keys written; more only sends a body down the slow, exact path.
   */
  keysAtLeast: number;
  /** Offset of the first container that opens deeper than the limit, or null. */
  tooDeepAt: number | null;
}

const QUOTE = 0x22;
const BACKSLASH = 0x5c;
const COLON = 0x3a;
const OPEN_ARRAY = 0x5b;
const OPEN_OBJECT = 0x7b;

function isJsonWhitespace(c: number): boolean {
  return c === 0x20 || c === 0x09 || c === 0x0a || c === 0x0d;
}

/** The offset of the quote that closes the string opened at `open`, or -1 when it never closes. */
export function stringEnd(text: string, open: number): number {
  let at = open + 1;
  for (;;) {
    at = text.indexOf('"', at);
    if (at < 0) return -1;
    let backslashes = 0;
    for (let b = at - 1; text.charCodeAt(b) === BACKSLASH; b--) backslashes++;
    // An even run of backslashes escapes itself, not the quote.
    if (backslashes % 2 === 0) return at;
    at++;
  }
}

/** The offset of the next character that is not JSON white space. */
export function skipWhitespace(text: string, from: number): number {
  let at = from;
  while (at < text.length && isJsonWhitespace(text.charCodeAt(at))) at++;
  return at;
}

function occurrences(text: string, character: string): number {
  let count = 0;
  for (let at = text.indexOf(character); at >= 0; at = text.indexOf(character, at + 1)) count++;
  return count;
}

function quotesBeforeColon(text: string): number {
  // One native search: faster here than an indexOf loop over every quote of a
  // column of text (measured with scripts/bench-json-body.ts).
  const quoteColon = /"[ \t\n\r]*:/g;
  let count = 0;
  while (quoteColon.test(text)) count++;
  return count;
}

/** Where the first container deeper than maxDepth opens, stepping over strings; null when none does. */
function firstTooDeep(text: string, maxDepth: number): number | null {
  // test() rather than exec(): no match array is allocated per stop.
  const structural = /["[\]{}]/g;
  let depth = 0;
  while (structural.test(text)) {
    const at = structural.lastIndex - 1;
    const c = text.charCodeAt(at);
    if (c === QUOTE) {
      const end = stringEnd(text, at);
      // An unclosed string: not JSON, and JSON.parse will say so.
      if (end < 0) return null;
      structural.lastIndex = end + 1;
    } else if (c === OPEN_ARRAY || c === OPEN_OBJECT) {
      depth++;
      if (depth > maxDepth) return at;
    } else {
      depth--;
    }
  }
  return null;
}

/** The text need not be valid JSON: on invalid text the figures mean nothing, and JSON.parse refuses it next. */
export function scanJsonText(text: string, maxDepth: number): TextScan {
  // Nesting deeper than the limit needs more opening brackets than the limit.
  const opening = occurrences(text, '[') + occurrences(text, '{');
  return {
    keysAtLeast: quotesBeforeColon(text),
    tooDeepAt: opening <= maxDepth ? null : firstTooDeep(text, maxDepth),
  };
}
