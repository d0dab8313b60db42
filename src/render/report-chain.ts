// Where the record sits in the tamper-evident audit chain, and how a reader
// can check it without trusting this page. The exact hashing rule belongs to
// the audit store (src/audit/chain.ts); it is a parameter, defaulting to the
// store's rule in words, so the route can pass the store's own wording.
import { fragment, tag, type Html } from './html-markup.ts';
import { integrityFact } from './report-integrity.ts';
import type { StoredComparisonView } from './types.ts';

export interface ChainVerification {
  /** Path of the whole-chain check, e.g. "/v1/audit/verify". */
  verifyPath: string;
  /** Name of the hash function, e.g. "SHA-256". */
  algorithm: string;
  /**
   * What is hashed, completing "the hash is {algorithm} over …", e.g.
   * "the previous record's hash followed by the canonical JSON of this record (without its own hash)".
   */
  hashedInput: string;
  /** How the hash is written, e.g. "lower-case hexadecimal with the prefix sha256:". */
  encoding: string;
}

/** The rule of src/audit/chain.ts (its header comment), in words for a reader. */
export const defaultChainVerification: ChainVerification = {
  verifyPath: '/v1/audit/verify',
  algorithm: 'SHA-256',
  hashedInput:
    "the UTF-8 bytes of the previous record's hash (64 lower-case hex characters; 64 zeros before the first record) followed by the canonical JSON of this record without its prevHash and hash fields (object keys sorted, no whitespace, numbers and strings as JSON.stringify writes them: RFC 8785 for these values)",
  encoding: 'lower-case hexadecimal',
};

/** The store starts its chain from 64 zeros; older or foreign records may say null. */
const genesis = /^0{64}$/;

function integrityLine(record: StoredComparisonView): Html[] {
  const fact = integrityFact(record);
  return fact === null ? [] : [tag('dt', {}, fact[0]), tag('dd', { 'data-integrity': record.integrity?.ok ? 'ok' : 'failed' }, fact[1])];
}

export function chainSection(record: StoredComparisonView, rule: ChainVerification): Html {
  const first = record.prevHash === null || record.prevHash === undefined || record.prevHash === '' || genesis.test(record.prevHash);
  return fragment(
    tag('h2', { id: 'chain' }, 'Audit chain'),
    tag('dl', { class: 'facts', 'data-section': 'chain' },
      tag('dt', {}, 'position'), tag('dd', { 'data-seq': String(record.seq) }, `record ${record.seq}`),
      tag('dt', {}, 'hash'), tag('dd', { class: 'hash' }, String(record.hash)),
      tag('dt', {}, 'previous hash'), tag('dd', { class: 'hash' }, first ? 'none: this is the first record' : String(record.prevHash)),
      ...integrityLine(record),
    ),
    tag('p', {},
      'To check the whole chain, ask the service: ',
      tag('code', {}, `GET ${rule.verifyPath}`),
      ' re-hashes every stored record in order and reports whether the chain is intact and, if not, where it first breaks.',
    ),
    tag('p', {},
      `To check this record yourself: its hash is ${rule.algorithm} over ${rule.hashedInput}, written in ${rule.encoding}. `,
      'Recompute it from the record exactly as stored (',
      tag('code', {}, `GET /v1/audit/records/${record.id}`),
      first
        ? '); it must equal the hash above, and the next record must name it as its previous hash.'
        : '); it must equal the hash above, its previous hash must equal the hash of the record before it, and the next record must name this hash as its previous one.',
    ),
  );
}
