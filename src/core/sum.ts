/**
 * Compensated summation. Total log-likelihoods add up to 10^6 terms of similar size; naive summation
 * loses several digits there, which shows up as noise in the sampler's acceptance decisions.
 * Neumaier's variant of Kahan summation also handles terms larger than the running sum.
 */
export class NeumaierSum {
  private sum = 0;
  private comp = 0;

  add(x: number): void {
    const t = this.sum + x;
    if (Math.abs(this.sum) >= Math.abs(x)) this.comp += this.sum - t + x;
    else this.comp += x - t + this.sum;
    this.sum = t;
  }

  get value(): number {
    return this.sum + this.comp;
  }

  reset(): void {
    this.sum = 0;
    this.comp = 0;
  }
}

/** Compensated sum of an array (or a prefix of it). */
export function accurateSum(xs: ArrayLike<number>, n: number = xs.length): number {
  let sum = 0;
  let comp = 0;
  for (let i = 0; i < n; i++) {
    const x = xs[i];
    const t = sum + x;
    if (Math.abs(sum) >= Math.abs(x)) comp += sum - t + x;
    else comp += x - t + sum;
    sum = t;
  }
  return sum + comp;
}

/** log(exp(a) + exp(b)) without overflow; -Infinity is the identity. */
export function logAddExp(a: number, b: number): number {
  if (a === -Infinity) return b;
  if (b === -Infinity) return a;
  return a > b ? a + Math.log1p(Math.exp(b - a)) : b + Math.log1p(Math.exp(a - b));
}
