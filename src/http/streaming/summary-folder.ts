// Folds rows into a data summary in constant memory: rows are gathered into
// a block of BLOCK_ROWS, the block is summarised by the corrected two-pass
// algorithm (src/core/summary/summarise.ts) and merged into the running
// summary by Chan, Golub & LeVeque's pairwise update. Blocked pairwise
// merging keeps the accuracy of two passes (rounding grows with the number
// of blocks, not rows) where a row-by-row update would not.
// Memory: (p + 1) columns × BLOCK_ROWS doubles for the block, plus O(p²)
// for the running summary and the block's, independent of the row count:
// for p = 20 about 1.4 MB.
import { mergeSummaries, summariseRows, type DataSummary } from '../../core/summary/index.ts';

export const BLOCK_ROWS = 8192;

export class SummaryFolder {
  private readonly block: Float64Array[];
  private readonly weightBlock: Float64Array | null;
  private filled = 0;
  private running: DataSummary | null = null;

  constructor(
    private readonly columns: readonly string[],
    weighted: boolean,
  ) {
    this.block = columns.map(() => new Float64Array(BLOCK_ROWS));
    this.weightBlock = weighted ? new Float64Array(BLOCK_ROWS) : null;
  }

  /** Adds one row: values[j] for column j, and values[p] the weight when weighted. */
  add(values: Float64Array): void {
    const i = this.filled;
    for (let j = 0; j < this.block.length; j++) this.block[j][i] = values[j];
    if (this.weightBlock) this.weightBlock[i] = values[this.block.length];
    this.filled = i + 1;
    if (this.filled === BLOCK_ROWS) this.flush();
  }

  get rows(): number {
    return (this.running?.rows ?? 0) + this.filled;
  }

  private flush(): void {
    if (this.filled === 0) return;
    const n = this.filled;
    const part = summariseRows(this.block.map((c) => c.subarray(0, n)), this.weightBlock?.subarray(0, n) ?? null, this.columns);
    this.filled = 0;
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
