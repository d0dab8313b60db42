// Small pieces of arithmetic in logs that the likelihoods share.
import expm1 from '@stdlib/math-base-special-expm1';
import log1p from '@stdlib/math-base-special-log1p';

/**
 * ln(1 - e^x) for x <= 0, accurate for both small and large |x|: -expm1
 * near 0, log1p far from it (Mächler 2012, "Accurately computing
 * log(1 - exp(-|a|))", the switch at -ln 2).
 */
export function log1mexp(x: number): number {
  if (x > -Math.LN2) return Math.log(-expm1(x));
  return log1p(-Math.exp(x));
}

/**
 * A running sum with Neumaier's compensation: the log-likelihood of 10^5
 * rows is compared across tools to many digits, and plain summation loses
 * about log10(n) of them.
 */
export class NeumaierSum {
  private sum = 0;
  private compensation = 0;

  add(x: number): void {
    const next = this.sum + x;
    if (!Number.isFinite(next)) {
      // An infinite or NaN term decides the sum; compensation would turn it into NaN.
      this.sum = next;
      return;
    }
    if (Math.abs(this.sum) >= Math.abs(x)) this.compensation += this.sum - next + x;
    else this.compensation += x - next + this.sum;
    this.sum = next;
  }

  value(): number {
    return Number.isFinite(this.sum) ? this.sum + this.compensation : this.sum;
  }
}
