// SUMMARY_UPLOADS_PER_CALLER: streamed uploads in flight at once per caller.
// Each upload holds a socket and a share of the CPU for as long as its rows
// stream (minutes, for gigabytes), so one caller opening many at once would
// crowd everyone else out; past the limit a new one is refused at once, before
// its body is read.
export class UploadsInFlight {
  readonly #counts = new Map<string, number>();

  constructor(readonly perCaller: number) {}

  /** Takes a place for the caller; false when it already has perCaller uploads in flight. */
  enter(caller: string): boolean {
    const count = this.#counts.get(caller) ?? 0;
    if (count >= this.perCaller) return false;
    this.#counts.set(caller, count + 1);
    return true;
  }

  leave(caller: string): void {
    const count = (this.#counts.get(caller) ?? 1) - 1;
    if (count <= 0) this.#counts.delete(caller);
    else this.#counts.set(caller, count);
  }

  inFlight(caller: string): number {
    return this.#counts.get(caller) ?? 0;
  }
}
