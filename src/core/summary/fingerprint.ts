// A fingerprint of a data summary, the counterpart of the rows' dataset
// fingerprint (src/core/fingerprint.ts) for requests that send data.summary:
// SHA-256 over a header, then rows, the listed column names (UTF-8, each
// length-prefixed), the means and the centred cross products row by row, and
// the weight sums when weighted, every number as IEEE 754 binary64
// big-endian. Numbers are hashed as bytes, not text, so any language can
// rebuild it. Two summaries of the same rows made by different engines
// differ in rounding, and so in fingerprint: it identifies the summary sent.
// -0 is hashed as 0, as the rows' fingerprint does: the same measurement.
import { createHash } from 'node:crypto';
import type { DataSummary } from './types.ts';

export const SUMMARY_FINGERPRINT_HEADER = 'parsimetry-summary-v1\n';

export function summaryFingerprint(s: DataSummary): string {
  const hash = createHash('sha256');
  hash.update(SUMMARY_FINGERPRINT_HEADER, 'utf8');
  const f64 = (values: readonly number[]) => {
    const b = Buffer.alloc(8 * values.length);
    values.forEach((v, i) => b.writeDoubleBE(v === 0 ? 0 : v, 8 * i));
    hash.update(b);
  };
  const u32 = (n: number) => {
    const b = Buffer.alloc(4);
    b.writeUInt32BE(n);
    hash.update(b);
  };
  f64([s.rows]);
  u32(s.columns.length);
  for (const c of s.columns) {
    const bytes = Buffer.from(c, 'utf8');
    u32(bytes.length);
    hash.update(bytes);
  }
  f64(s.means);
  for (const row of s.centredCrossProducts) f64(row);
  hash.update(s.weights ? 'W' : 'U', 'utf8');
  if (s.weights) f64([s.weights.sum, s.weights.sumLog]);
  return `sha256:${hash.digest('hex')}`;
}
