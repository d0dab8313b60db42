// The price of a request: its estimated work, memory and answer size, and the
// parts they come from (so a refusal can say which part to change). Work is
// counted in multiply-adds, estimated from the request's shape before anything
// is allocated; scripts/bench-pricing.ts measures how many nanoseconds one
// costs for each kind of work, so the caps can be read as time.
import type { IssuePath } from '../issues.ts';

export interface PricePart {
  /** What the part is, for people: 'candidate "wide"', 'the subset scoring'. */
  what: string;
  /** Where in the request it comes from. */
  path: IssuePath;
  /** Estimated multiply-adds. */
  work: number;
  /** Bytes the part keeps until the request is answered (designs, fits). */
  heldBytes: number;
  /** Bytes the part needs only while it runs (factorisation workspace). */
  passingBytes: number;
  /** Bytes the part adds to the answer (and so to the audit record). */
  resultBytes: number;
  /** Design columns of a model the part fits; null for parts that fit none. */
  designColumns: number | null;
  /** What would make the part cheaper, in words a caller can act on. */
  remedy: string;
}

export interface RequestPrice {
  work: number;
  /** Peak working memory: everything held, plus the largest passing need. */
  memoryBytes: number;
  resultBytes: number;
  /** The widest design of any model the request fits (0 when it fits none). */
  designColumns: number;
  parts: PricePart[];
}

/** A cap and the setting that sets it, so a refusal can name both. */
export interface Cap {
  limit: number;
  setting: string;
}

export interface PriceCaps {
  work: Cap;
  memoryBytes: Cap;
  resultBytes: Cap;
  /** Design columns of any one model: a hard cap whatever the rows. */
  designColumns: Cap;
}

export function totalPrice(parts: PricePart[]): RequestPrice {
  let work = 0;
  let held = 0;
  let passing = 0;
  let resultBytes = 0;
  let designColumns = 0;
  for (const p of parts) {
    work += p.work;
    held += p.heldBytes;
    passing = Math.max(passing, p.passingBytes);
    resultBytes += p.resultBytes;
    designColumns = Math.max(designColumns, p.designColumns ?? 0);
  }
  return { work, memoryBytes: held + passing, resultBytes, designColumns, parts };
}
