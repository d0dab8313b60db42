// Splits a byte stream into lines (LF or CRLF) without holding more than the
// current chunk and one unfinished line. Lines are handed to a synchronous
// callback chunk by chunk, so tens of millions of lines cost one await per
// chunk, not per line, plus a turn of the event loop whenever the caller asks
// for one (after a block of work). The unfinished line is bounded by maxLineBytes.
import { StringDecoder } from 'node:string_decoder';
import { BodyLimitError, RowError } from './row-error.ts';

export interface LineOptions {
  maxLineBytes: number;
  maxBodyBytes: number;
  /** Asked after each line: true to let the event loop turn before the next (a chunk may hold a whole body). */
  shouldYield?: () => boolean;
}

const turnOfTheLoop = () => new Promise<void>((resolve) => setImmediate(resolve));

/** Calls onLine(text, lineNumber) for every line (1-based); returns the bytes read. */
export async function forEachLine(body: AsyncIterable<Buffer | string>, options: LineOptions, onLine: (line: string, lineNumber: number) => void): Promise<number> {
  const decoder = new StringDecoder('utf8');
  let pending = '';
  let lineNumber = 0;
  let bytes = 0;
  const emit = (line: string) => {
    lineNumber++;
    onLine(line.endsWith('\r') ? line.slice(0, -1) : line, lineNumber);
  };
  for await (const chunk of body) {
    const buffer = typeof chunk === 'string' ? Buffer.from(chunk) : chunk;
    bytes += buffer.length;
    if (bytes > options.maxBodyBytes) throw new BodyLimitError(options.maxBodyBytes);
    const text = pending + decoder.write(buffer);
    let start = 0;
    for (let nl = text.indexOf('\n'); nl >= 0; nl = text.indexOf('\n', start)) {
      emit(text.slice(start, nl));
      start = nl + 1;
      if (options.shouldYield?.()) await turnOfTheLoop();
    }
    pending = text.slice(start);
    // Characters, not bytes, bound the pending line here: UTF-8 needs at most 3 bytes per UTF-16 unit.
    if (pending.length * 3 > options.maxLineBytes && Buffer.byteLength(pending) > options.maxLineBytes) {
      throw new RowError(lineNumber + 1, `the line is longer than ${options.maxLineBytes} bytes`);
    }
  }
  const rest = pending + decoder.end();
  if (rest.length > 0) emit(rest);
  return bytes;
}
