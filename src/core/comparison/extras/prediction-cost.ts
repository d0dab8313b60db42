// The price of the predictions a comparison asks for, from the request's
// shape alone, before anything is allocated; the cost model adds
// averagedBoundsCost to the fits' own price (src/core/pricing/comparison-price.ts).
//
// Per prediction row and fitted model: building the row's design (p
// columns), x'(X'WX)⁻¹x through the model's p × p factor (p² multiply-adds)
// and, when predictions are averaged over two or more models, four
// model-averaged tail-area bounds, each a root found in a handful of Newton
// steps, every step one t distribution function per model. One unit is one
// design cell (a multiply-add on one row and column), the unit of
// MAX_REQUEST_WORK.

/** Newton steps a tail-area bound takes, bracket search included (measured: 4–8; priced high). */
export const TAIL_AREA_STEPS = 12;

/**
 * Cells one evaluation of the mixture's distribution function costs per model:
 * a t distribution function (an incomplete beta; scripts/bench-predictions.ts
 * measured 180 to 800 multiply-adds for one, on a busy machine, more in the
 * tails where the bounds lie), its density, the back-transform and the
 * Newton step's bookkeeping. Set so that the price covers a whole averaged
 * row as that script measures it (about 500,000 multiply-adds for six models
 * on a busy machine).
 */
export const T_CDF_CELLS = 2000;

export interface PredictionShape {
  /** Rows of options.predict.columns. */
  rows: number;
  /** Design columns of each candidate fitted here. */
  columnsPerModel: readonly number[];
}

/** Work units (design cells) of the predictions and their average. */
export function predictionCost({ rows, columnsPerModel }: PredictionShape): number {
  if (rows <= 0 || columnsPerModel.length === 0) return 0;
  let perRow = 0;
  for (const p of columnsPerModel) perRow += p + p * p;
  return rows * perRow + averagedBoundsCost(rows, columnsPerModel.length);
}

/** The model-averaged tail-area bounds alone: four roots per row, each Newton step one t distribution function per model. */
export function averagedBoundsCost(rows: number, models: number): number {
  return rows > 0 && models >= 2 ? rows * 4 * TAIL_AREA_STEPS * models * T_CDF_CELLS : 0;
}
