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

function u32(n: number): Buffer {
  const b = Buffer.alloc(4);
  b.writeUInt32BE(n);
  return b;
}

function columnBytes(role: 'R' | 'W' | 'X', name: string, values: ReadonlyArray<number | string | null>, rows: readonly number[]): Buffer[] {
  const nameBytes = Buffer.from(name, 'utf8');
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
      const text = Buffer.from(String(values[r]), 'utf8');
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
