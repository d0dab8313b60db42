// What the service knows about its chain when it starts: the head, and for an
// SQLite store whether that head is behind the one last seen (head-witness.ts).
// server.ts logs it, /readyz shows a finding and /metrics counts it.
import type { RecordedHead } from './chain.ts';
import { compareWithWitness, readWitness, witnessPath, writeWitness, type HeadFinding } from './head-witness.ts';
import type { AuditStore } from './store.ts';
import { withHeadWitness } from './witnessed-store.ts';

export interface ChainAtStart {
  head: RecordedHead;
  finding: HeadFinding | null;
  /** The side file, or null when the store keeps none (PostgreSQL, :memory:). */
  witnessFile: string | null;
}

export async function checkChainAtStart(
  store: AuditStore,
  auditDb: string,
  onWitnessError: (error: unknown) => void,
): Promise<{ store: AuditStore; chain: ChainAtStart }> {
  const head = await store.head();
  if (store.backend !== 'sqlite' || auditDb === ':memory:') return { store, chain: { head, finding: null, witnessFile: null } };
  const path = witnessPath(auditDb);
  const lastSeen = await readWitness(path);
  const finding = compareWithWitness(head, lastSeen);
  let witnessedSeq = lastSeen?.seq ?? -1;
  if (!finding && head.seq > witnessedSeq) {
    try {
      await writeWitness(path, head, new Date().toISOString());
      witnessedSeq = head.seq;
    } catch (error) {
      onWitnessError(error);
    }
  }
  return { store: withHeadWitness(store, path, { witnessedSeq, onError: onWitnessError }), chain: { head, finding, witnessFile: path } };
}

/** The finding in words, for the log line and /readyz. */
export function describeFinding(finding: HeadFinding, witnessFile: string | null): string {
  const where = witnessFile ? ` (${witnessFile})` : '';
  const seen = `seq ${finding.lastSeen.seq}, hash ${finding.lastSeen.hash.slice(0, 16)}…, seen ${finding.lastSeen.seenAt}`;
  if (finding.kind === 'behind') {
    return `the audit chain ends at seq ${finding.current.seq}, ${finding.missing} record(s) behind the head last seen${where}: ${seen}. ` +
      'Records acknowledged to callers are missing (a lost write-ahead log, or an older copy of the database): see README "Lost records".';
  }
  return `the audit chain head at seq ${finding.current.seq} has hash ${finding.current.hash.slice(0, 16)}…, not the one last seen${where}: ${seen}. ` +
    'The newest records were replaced: see README "Lost records".';
}
