// Folds rows into a data summary in constant memory: rows are gathered into
// a block of BLOCK_ROWS, the block is summarised by the corrected two-pass
// algorithm (src/core/summary/summarise.ts) and merged into the running
// summary by Chan, Golub & LeVeque's pairwise update. Blocked pairwise
// merging keeps the accuracy of two passes (rounding grows with the number
// of blocks, not rows) where a row-by-row update would not.
// Memory: (p + 1) columns × the block's rows of doubles, plus O(p²) for the
// running summary and the block's, independent of the row count: for p = 20
// about 1.4 MB.
//
// Time: summarising a block costs about rows × p(p+1)/2 multiply-adds, all in
// one stretch of the event loop. The block is sized to BLOCK_WORK so that
// stretch stays a few milliseconds however many columns are listed (8192 rows
// up to p ≈ 30; 204 rows at the 200-column limit), and the fold turns the
// loop after every block (fold-body.ts). More, smaller blocks cost a little
// accuracy in the merges, not in the rows: the rounding grows with the number
// of blocks, as above.
import { mergeSummaries, summariseRows, type DataSummary } from '../../core/summary/index.ts';

/** The most rows in a block (few columns). */
export const BLOCK_ROWS = 8192;
/** Multiply-adds per block: a few milliseconds of the loop on one core (stack-notes: ~2 GFLOP/s at best). */
export const BLOCK_WORK = 2 ** 22;

/** Rows per block for p columns: as many as BLOCK_WORK allows, between 64 and BLOCK_ROWS. */
export function blockRowsFor(p: number): number {
  const perRow = (p * (p + 1)) / 2 + 2 * p;
  return Math.max(64, Math.min(BLOCK_ROWS, Math.floor(BLOCK_WORK / Math.max(1, perRow))));
}

export class SummaryFolder {
  private readonly block: Float64Array[];
  private readonly weightBlock: Float64Array | null;
  private filled = 0;
  private running: DataSummary | null = null;
  private readonly blockRows: number;
  /** Blocks summarised so far: the fold turns the event loop when this moves. */
  blocksFolded = 0;

  constructor(
    private readonly columns: readonly string[],
    weighted: boolean,
  ) {
    this.blockRows = blockRowsFor(columns.length);
    this.block = columns.map(() => new Float64Array(this.blockRows));
    this.weightBlock = weighted ? new Float64Array(this.blockRows) : null;
  }

  /** Adds one row: values[j] for column j, and values[p] the weight when weighted. */
  add(values: Float64Array): void {
    const i = this.filled;
    for (let j = 0; j < this.block.length; j++) this.block[j][i] = values[j];
    if (this.weightBlock) this.weightBlock[i] = values[this.block.length];
    this.filled = i + 1;
    if (this.filled === this.blockRows) this.flush();
  }

  get rows(): number {
    return (this.running?.rows ?? 0) + this.filled;
  }

  private flush(): void {
    if (this.filled === 0) return;
    const n = this.filled;
    const part = summariseRows(this.block.map((c) => c.subarray(0, n)), this.weightBlock?.subarray(0, n) ?? null, this.columns);
    this.filled = 0;
    this.blocksFolded++;
    if (!this.running) {
      this.running = part;
      return;
    }
    const merged = mergeSummaries(this.running, part);
    // Same columns and weighting by construction.
    if (!merged.ok) throw new Error(merged.issues[0].message);
    this.running = merged.summary;
  }

  /** The summary of every row added; null when none was. */
  finish(): DataSummary | null {
    this.flush();
    return this.running;
  }
}
