// A malformed row in a streamed body: the line it is on and what is wrong.
export class RowError extends Error {
  constructor(readonly line: number, readonly reason: string) {
    super(`line ${line}: ${reason}`);
  }
}

/** The body exceeded its byte limit while streaming. */
export class BodyLimitError extends Error {
  constructor(readonly limit: number) {
    super(`the body exceeds the limit of ${limit} bytes`);
  }
}
