// Total sum of squares of a response, weighted, about its weighted mean, in
// double-double: R² of a nearly perfect model is 1 − RSS/TSS, and TSS must not
// lose the digits that RSS keeps.
import { ddAdd, ddMulDouble, twoProduct } from './numeric/double-double.ts';

export function centredTotalSumOfSquares(y: ArrayLike<number>, weights?: ArrayLike<number>): number {
  let sw = 0;
  let swy = 0;
  for (let i = 0; i < y.length; i++) {
    const w = weights ? weights[i] : 1;
    sw += w;
    swy += w * y[i];
  }
  if (!(sw > 0)) return 0;
  const mean = swy / sw;
  let hi = 0;
  let lo = 0;
  for (let i = 0; i < y.length; i++) {
    const d = y[i] - mean;
    let [ph, pl] = twoProduct(d, d);
    if (weights) [ph, pl] = ddMulDouble(ph, pl, weights[i]);
    [hi, lo] = ddAdd(hi, lo, ph, pl);
  }
  return hi + lo;
}
