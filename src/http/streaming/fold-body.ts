// A streamed body of NDJSON or CSV rows folded into a data summary as it
// arrives: one chunk and one line in memory at a time, the summary in O(p²).
import { forEachLine } from './line-splitter.ts';
import { RowError } from './row-error.ts';
import { csvReader, ndjsonReader, type RowReader } from './row-parsers.ts';
import { SummaryFolder } from './summary-folder.ts';
import type { DataSummary } from '../../core/summary/index.ts';

export type RowFormat = 'ndjson' | 'csv';

export interface FoldOptions {
  format: RowFormat;
  columns: readonly string[];
  weights?: string;
  maxBodyBytes: number;
  /** Longest line accepted (default 1 MiB). */
  maxLineBytes?: number;
}

export interface FoldResult {
  summary: DataSummary | null;
  rowsRead: number;
  rowsDropped: number;
  bytes: number;
}

export const DEFAULT_MAX_LINE_BYTES = 1024 * 1024;

export async function foldRows(body: AsyncIterable<Buffer | string>, options: FoldOptions): Promise<FoldResult> {
  const listed = options.weights ? [...options.columns, options.weights] : [...options.columns];
  const folder = new SummaryFolder(options.columns, options.weights !== undefined);
  const values = new Float64Array(listed.length);
  const p = options.columns.length;
  let read: RowReader | null = options.format === 'ndjson' ? ndjsonReader(listed) : null;
  let rowsRead = 0;
  let rowsDropped = 0;
  // Turn the event loop after every block summarised: other callers and
  // /healthz wait at most one block's work (summary-folder.ts sizes it).
  let blocksAtLastTurn = 0;
  const shouldYield = () => {
    if (folder.blocksFolded === blocksAtLastTurn) return false;
    blocksAtLastTurn = folder.blocksFolded;
    return true;
  };
  const bytes = await forEachLine(body, { maxBodyBytes: options.maxBodyBytes, maxLineBytes: options.maxLineBytes ?? DEFAULT_MAX_LINE_BYTES, shouldYield }, (line, lineNumber) => {
    if (read === null) {
      read = csvReader(line, listed);
      return;
    }
    if (line.trim() === '') return;
    rowsRead++;
    if (!read(line, lineNumber, values)) {
      rowsDropped++;
      return;
    }
    if (options.weights !== undefined && !(values[p] > 0)) {
      // A zero weight leaves the row out, as in a comparison; a negative one has no meaning.
      if (values[p] === 0) {
        rowsDropped++;
        return;
      }
      throw new RowError(lineNumber, `the weight ${JSON.stringify(options.weights)} is ${values[p]}; weights must be positive (0 leaves a row out)`);
    }
    folder.add(values);
  });
  if (options.format === 'csv' && read === null) throw new RowError(1, 'the body is empty; CSV needs a header row');
  return { summary: folder.finish(), rowsRead, rowsDropped, bytes };
}
