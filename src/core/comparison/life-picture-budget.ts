// Whether a comparison with life models stores the life-data picture. The
// picture is a courtesy beside the ranking, so it must never be the reason a
// comparison is refused: where its price is above a fixed budget (Turnbull's
// EM run to its iteration cap dominates on large left- or interval-censored
// samples), the comparison is scored without it and a caution says so. The
// budget is a constant of the service, not a server setting, so the same
// request always gets the same record (and its replay the same answer).
import type { Columns } from '../types.ts';
import type { Caution } from '../scoring/cautions.ts';
import { priceLifePicture } from '../models/lifetime/pricing.ts';

/** What the budget reads of a comparison request (its candidates' kinds, the data and the status column). */
export interface PictureRequest {
  candidates: readonly { form: string; distribution?: unknown }[];
  columns?: Columns | null;
  censoring?: { status: string } | null;
}

/** Multiply-adds the picture may cost: 40% of the default work cap (MAX_REQUEST_WORK, 1e10), about 16,000 rows with left or interval censoring priced at Turnbull's iteration cap; a server whose cap is set below the picture's price refuses such a request as it would any other. */
export const LIFE_PICTURE_BUDGET = 4e9;

/** The picture's price in multiply-adds, or null without life models or data rows. */
export function lifePictureWork(input: PictureRequest, rows: number): number | null {
  const life = input.candidates.filter((c) => c.form === 'lifetime');
  if (life.length === 0 || !input.columns) return null;
  const status = input.censoring ? input.columns[input.censoring.status] : undefined;
  const leftOrIntervalCensored = Array.isArray(status) && status.some((s) => s === 'left' || s === 'interval');
  return priceLifePicture({
    rows, models: life.length, gammaModels: life.filter((c) => c.distribution === 'gamma').length, leftOrIntervalCensored,
  }) / 2; // operations to multiply-adds, as the lifetime kind prices a fit
}

/** The data rows the request sends, counted as the cost model counts them (the longest column), before any row is dropped. */
export function dataRows(input: PictureRequest): number {
  let rows = 0;
  for (const values of Object.values(input.columns ?? {})) rows = Math.max(rows, values.length);
  return rows;
}

/** Whether the picture is drawn, and the caution when it is not: one pricing of the request for both. */
export function lifePictureDecision(input: PictureRequest): { draw: boolean; cautions: Caution[] } {
  const work = lifePictureWork(input, dataRows(input));
  if (work === null) return { draw: false, cautions: [] };
  if (work <= LIFE_PICTURE_BUDGET) return { draw: true, cautions: [] };
  return {
    draw: false,
    cautions: [{
      code: 'life_picture_skipped',
      message: `The life-data picture was not stored: its nonparametric estimate and curves would cost about ${work.toPrecision(2)} multiply-adds, over the picture's budget of ${LIFE_PICTURE_BUDGET.toPrecision(2)} (a large sample with left or interval censoring, where Turnbull's estimate iterates). The ranking and every model are complete without it; send fewer rows for a picture.`,
    }],
  };
}
