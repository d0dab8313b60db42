// NaN, Infinity and -Infinity are not JSON, but Python's json.dumps, pandas'
// to_json and JavaScript's own number printing write them, so a body that
// fails to parse often fails on one. This finds the first such token outside
// strings, and the path it sits at: each token is swapped for a marker string
// and the body parsed again, so the refusal names the field (and says to send
// null for a missing value) instead of a character offset.
import { toPointer } from './problems.ts';

const TOKENS = ['-Infinity', 'Infinity', 'NaN'];

/** Offsets and spellings of bare NaN / ±Infinity tokens (outside strings). */
function bareTokens(text: string, limit: number): { at: number; token: string }[] {
  const found: { at: number; token: string }[] = [];
  let inString = false;
  for (let i = 0; i < text.length && found.length < limit; i++) {
    const c = text[i];
    if (inString) {
      if (c === '\\') i++;
      else if (c === '"') inString = false;
      continue;
    }
    if (c === '"') {
      inString = true;
      continue;
    }
    if (c !== 'N' && c !== 'I' && c !== '-') continue;
    const token = TOKENS.find((t) => text.startsWith(t, i));
    if (token) {
      found.push({ at: i, token });
      i += token.length - 1;
    }
  }
  return found;
}

function findMarker(value: unknown, marker: string, path: (string | number)[]): (string | number)[] | null {
  if (typeof value === 'string') return value === marker ? path : null;
  if (value === null || typeof value !== 'object') return null;
  const entries: [string | number, unknown][] = Array.isArray(value) ? value.map((v, i) => [i, v]) : Object.entries(value);
  for (const [key, child] of entries) {
    const hit = findMarker(child, marker, [...path, key]);
    if (hit) return hit;
  }
  return null;
}

/**
 * The first bare NaN / ±Infinity token and its path (a JSON Pointer without
 * the leading slash), or null when the body fails to parse for another reason.
 */
export function nonJsonNumber(text: string): { token: string; path: string | null } | null {
  const tokens = bareTokens(text, 1000);
  if (tokens.length === 0) return null;
  const marker = `\u0001parsimetry-non-json-number-${text.length}`;
  let rebuilt = '';
  let from = 0;
  tokens.forEach(({ at, token }, k) => {
    rebuilt += text.slice(from, at) + JSON.stringify(k === 0 ? marker : null);
    from = at + token.length;
  });
  rebuilt += text.slice(from);
  try {
    const path = findMarker(JSON.parse(rebuilt), marker, []);
    return { token: tokens[0].token, path: path ? toPointer(path) : null };
  } catch {
    // The body has other syntax errors too; say what was found without a path.
    return { token: tokens[0].token, path: null };
  }
}
