// Failed authentications per client address (AUTH_FAILURES_PER_MINUTE): once an
// address has failed that many times within its current minute, every request
// from it that needs a key is refused with 429 until the minute is over, a
// right key included. Letting a right key through would let a guesser learn
// which guess was right at full speed; the price is that callers sharing an
// address with a guesser wait out the minute too, which the README says.
//
// Fixed one-minute windows per address, held in a bounded map: an attacker
// cycling through many addresses (IPv6 makes that cheap) cannot grow it past
// MAX_ADDRESSES; the oldest windows are dropped first.

const WINDOW_MS = 60_000;
export const MAX_ADDRESSES = 100_000;

interface Window {
  startedAt: number;
  failures: number;
}

export class FailedAuthentications {
  readonly #windows = new Map<string, Window>();

  constructor(
    readonly perMinute: number,
    private readonly now: () => number = Date.now,
    private readonly maxAddresses: number = MAX_ADDRESSES,
  ) {}

  /** Whole seconds until the address may try again; 0 when it may now. */
  retryAfterSeconds(address: string): number {
    const window = this.#current(address);
    if (!window || window.failures < this.perMinute) return 0;
    return Math.max(1, Math.ceil((window.startedAt + WINDOW_MS - this.now()) / 1000));
  }

  record(address: string): void {
    const window = this.#current(address);
    if (window) {
      window.failures++;
      return;
    }
    if (this.#windows.size >= this.maxAddresses) this.#forgetOldest();
    this.#windows.set(address, { startedAt: this.now(), failures: 1 });
  }

  get addresses(): number {
    return this.#windows.size;
  }

  #current(address: string): Window | null {
    const window = this.#windows.get(address);
    if (!window) return null;
    if (this.now() - window.startedAt >= WINDOW_MS) {
      this.#windows.delete(address);
      return null;
    }
    return window;
  }

  /** Insertion order is age order (an expired window is deleted before its address starts a new one). */
  #forgetOldest(): void {
    for (const address of this.#windows.keys()) {
      if (this.#windows.size < this.maxAddresses) return;
      this.#windows.delete(address);
    }
  }
}
