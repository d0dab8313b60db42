// data.summary: the fixed form of a data summary, its weighted variant, and
// the shapes of POST /v1/summaries (rows streamed in, a summary out).
import { z } from 'zod';
import { ColumnName, FiniteNumber } from './common.ts';

export const MAX_SUMMARY_COLUMNS = 200;

export const SummaryWeights = z
  .strictObject({
    sum: FiniteNumber.positive().meta({ description: 'Σ w over the rows.' }),
    sumLog: FiniteNumber.meta({ description: 'Σ ln w over the rows (the weighted log-likelihood adds ½ Σ ln w; it cannot be recovered from the moments).' }),
  })
  .meta({ id: 'SummaryWeights' });

export const DataSummary = z
  .strictObject({
    rows: z.number().int().min(1).meta({ description: 'n: the number of rows summarised.' }),
    columns: z.array(ColumnName).min(1).max(MAX_SUMMARY_COLUMNS).meta({ description: 'The summarised columns, response included, in the order of means and centredCrossProducts.' }),
    means: z.array(FiniteNumber).max(MAX_SUMMARY_COLUMNS).meta({ description: 'Per column, the mean (weighted: Σ w x / Σ w).' }),
    centredCrossProducts: z
      .array(z.array(FiniteNumber).max(MAX_SUMMARY_COLUMNS))
      .max(MAX_SUMMARY_COLUMNS)
      .meta({ description: 'Σ (x − x̄)(z − z̄) for every pair of listed columns (weighted: Σ w (x − x̄)(z − z̄)); symmetric, positive semidefinite.' }),
    weights: SummaryWeights.optional().meta({ description: 'Weighted variant only: the weight sums. Then means and centredCrossProducts are weighted; rows stays the row count.' }),
  })
  .meta({
    id: 'DataSummary',
    description:
      'Everything a Gaussian linear model needs from the rows, reduced where the data live (scripts/summary-sql.ts emits the SQL). Two summaries of disjoint rows merge by Chan, Golub & LeVeque: with δ = x̄_b − x̄_a and W = W_a + W_b (row counts, or weight sums), x̄ = x̄_a + δ W_b / W and C = C_a + C_b + (W_a W_b / W) δ δᵀ.',
  });

export type DataSummary = z.output<typeof DataSummary>;

export const SummaryData = z.strictObject({ summary: DataSummary }).meta({ id: 'SummaryData' });

export const SummaryUploadQuery = z.strictObject({
  columns: z
    .string()
    .min(1)
    .max(20_000)
    .transform((s) => s.split(',').map((c) => c.trim()))
    .refine((cs) => cs.every((c) => c.length > 0 && c.length <= 200), 'comma-separated column names, none empty, each at most 200 characters')
    .refine((cs) => new Set(cs).size === cs.length, 'a column is listed twice')
    .refine((cs) => cs.length <= MAX_SUMMARY_COLUMNS, `at most ${MAX_SUMMARY_COLUMNS} columns`)
    .meta({ description: 'The columns to summarise, comma-separated, e.g. peakTemp,holdMinutes,shrinkage.' }),
  weights: ColumnName.optional().meta({ description: 'A column of positive relative weights: the weighted variant.' }),
});

export const SummaryUploadResult = z
  .strictObject({
    data: SummaryData.meta({ description: 'Paste-ready: send this object as the "data" of POST /v1/comparisons or POST /v1/searches (it is { "summary": … }).' }),
    summary: DataSummary.meta({ description: 'The same summary, as data.summary takes it.' }),
    rowsRead: z.number().int().meta({ description: 'Data rows in the body (header excluded).' }),
    rowsDropped: z.number().int().meta({ description: 'Rows left out because a listed column (or the weight) was null or empty in them (common rows), or their weight was 0.' }),
    bytes: z.number().int(),
  })
  .meta({ id: 'SummaryUploadResult' });
