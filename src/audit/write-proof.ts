// When the store last proved it can write. Readiness says yes only on such a
// proof: a store reopened on a full disk answers every read and refuses every
// write, so a readiness check that only reads would say ready while every
// POST gets 503. A write is probed when none has been proven since the store
// opened, after a failed one, and when the last proof is older than
// PROBE_AFTER_MS (a disk can fill while nothing is appended).
export const PROBE_AFTER_MS = 30_000;

export class WriteProof {
  private provenAt: number | null = null;

  constructor(private readonly now: () => number = Date.now) {}

  succeeded(): void {
    this.provenAt = this.now();
  }

  failed(): void {
    this.provenAt = null;
  }

  get needsProbe(): boolean {
    return this.provenAt === null || this.now() - this.provenAt > PROBE_AFTER_MS;
  }
}
