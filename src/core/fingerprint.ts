// The dataset fingerprint: SHA-256 over a byte serialisation simple enough to
// rebuild in any language (README: "Dataset fingerprint"). Numbers are hashed as
// IEEE 754 binary64 big-endian bytes rather than as text, because no two
// languages print doubles the same way; hashing is deterministic, so the core
// stays pure.
import { createHash } from 'node:crypto';
import type { Columns } from './types.ts';
import { compareCodePoints } from './design/code-point-order.ts';

export const FINGERPRINT_HEADER = 'parsimetry-dataset-v1\n';

export interface FingerprintInput {
  columns: Columns;
  response: string;
  weights: string | null;
  /** Columns the candidates use besides the response and weights (order irrelevant). */
  used: readonly string[];
  /** The rows the comparison uses, in data order. */
  rows: readonly number[];
}

// The HTTP body parser refuses lone UTF-16 surrogates (src/http/json-body.ts),
// but the core does not rely on its callers: Buffer.from(text, 'utf8') would
// turn a lone surrogate into U+FFFD, so "\uD800" and "\uFFFD" would hash alike.
// Text is encoded as WTF-8 (S. Sapin, "The WTF-8 encoding"): UTF-8 for every
// well-formed string, byte for byte, so no published fingerprint changes, and
// a lone surrogate as the three bytes of its code point — bytes ED A0..BF xx
// that UTF-8 never produces, so the encoding stays one-to-one.
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

export function textBytes(text: string): Buffer {
  if (!LONE_SURROGATE.test(text)) return Buffer.from(text, 'utf8');
  const parts: Buffer[] = [];
  let start = 0;
  for (let i = 0; i < text.length; i++) {
    const unit = text.charCodeAt(i);
    if (unit < 0xd800 || unit > 0xdfff) continue;
    const next = i + 1 < text.length ? text.charCodeAt(i + 1) : 0;
    if (unit <= 0xdbff && next >= 0xdc00 && next <= 0xdfff) {
      i++; // a pair: UTF-8 below
      continue;
    }
    parts.push(Buffer.from(text.slice(start, i), 'utf8'));
    parts.push(Buffer.from([0xe0 | (unit >> 12), 0x80 | ((unit >> 6) & 0x3f), 0x80 | (unit & 0x3f)]));
    start = i + 1;
  }
  parts.push(Buffer.from(text.slice(start), 'utf8'));
  return Buffer.concat(parts);
}

function u32(n: number): Buffer {
  const b = Buffer.alloc(4);
  b.writeUInt32BE(n);
  return b;
}

function columnBytes(role: 'R' | 'W' | 'X', name: string, values: ReadonlyArray<number | string | null>, rows: readonly number[]): Buffer[] {
  const nameBytes = textBytes(name);
  const numeric = rows.every((r) => typeof values[r] === 'number');
  const parts: Buffer[] = [Buffer.from(role, 'ascii'), u32(nameBytes.length), nameBytes, Buffer.from(numeric ? 'n' : 't', 'ascii')];
  if (numeric) {
    const block = Buffer.alloc(8 * rows.length);
    rows.forEach((r, i) => {
      const v = values[r] as number;
      // -0 and 0 are the same measurement.
      block.writeDoubleBE(v === 0 ? 0 : v, 8 * i);
    });
    parts.push(block);
  } else {
    for (const r of rows) {
      const text = textBytes(String(values[r]));
      parts.push(u32(text.length), text);
    }
  }
  return parts;
}

export function datasetFingerprint(input: FingerprintInput): string {
  const hash = createHash('sha256');
  hash.update(FINGERPRINT_HEADER, 'ascii');
  const count = Buffer.alloc(8);
  count.writeBigUInt64BE(BigInt(input.rows.length));
  hash.update(count);
  const others = [...new Set(input.used)]
    .filter((name) => name !== input.response && name !== input.weights)
    .sort(compareCodePoints);
  const ordered: Array<['R' | 'W' | 'X', string]> = [['R', input.response]];
  if (input.weights) ordered.push(['W', input.weights]);
  for (const name of others) ordered.push(['X', name]);
  for (const [role, name] of ordered) {
    for (const part of columnBytes(role, name, input.columns[name], input.rows)) hash.update(part);
  }
  return `sha256:${hash.digest('hex')}`;
}
