/**
 * A compensated Welford accumulator of two series, shifted by the first pair added: the recurrences
 * of crossProducts (../moments.ts) for two series, kept incrementally (docs/methods.md §15).
 */
export class PairAccumulator {
  n = 0;
  shiftLow = 0;
  shiftHigh = 0;
  private meanLow = 0;
  private meanLowError = 0;
  private meanHigh = 0;
  private meanHighError = 0;
  private lowLow = 0;
  private lowLowError = 0;
  private highHigh = 0;
  private highHighError = 0;
  private lowHigh = 0;
  private lowHighError = 0;

  reset(): void {
    this.n = 0;
    this.shiftLow = 0;
    this.shiftHigh = 0;
    this.meanLow = 0;
    this.meanLowError = 0;
    this.meanHigh = 0;
    this.meanHighError = 0;
    this.lowLow = 0;
    this.lowLowError = 0;
    this.highHigh = 0;
    this.highHighError = 0;
    this.lowHigh = 0;
    this.lowHighError = 0;
  }

  add(low: number, high: number): void {
    if (this.n === 0) {
      this.shiftLow = low;
      this.shiftHigh = high;
    }
    const inverseCount = 1 / (this.n + 1);
    const x = low - this.shiftLow;
    const y = high - this.shiftHigh;
    // Means: compensated m += (x - m) / n.
    const dx = x - (this.meanLow + this.meanLowError);
    let m = this.meanLow;
    let increment = dx * inverseCount;
    let updated = m + increment;
    this.meanLowError += Math.abs(m) >= Math.abs(increment) ? m - updated + increment : increment - updated + m;
    this.meanLow = updated;
    const ax = x - (updated + this.meanLowError);
    const dy = y - (this.meanHigh + this.meanHighError);
    m = this.meanHigh;
    increment = dy * inverseCount;
    updated = m + increment;
    this.meanHighError += Math.abs(m) >= Math.abs(increment) ? m - updated + increment : increment - updated + m;
    this.meanHigh = updated;
    const ay = y - (updated + this.meanHighError);
    // Centred sums: S_ij += (x_i - old mean_i)(x_j - new mean_j), compensated.
    let sum = this.lowLow;
    let term = dx * ax;
    updated = sum + term;
    this.lowLowError += Math.abs(sum) >= Math.abs(term) ? sum - updated + term : term - updated + sum;
    this.lowLow = updated;
    sum = this.highHigh;
    term = dy * ay;
    updated = sum + term;
    this.highHighError += Math.abs(sum) >= Math.abs(term) ? sum - updated + term : term - updated + sum;
    this.highHigh = updated;
    sum = this.lowHigh;
    term = dx * ay;
    updated = sum + term;
    this.lowHighError += Math.abs(sum) >= Math.abs(term) ? sum - updated + term : term - updated + sum;
    this.lowHigh = updated;
    this.n++;
  }

  /** Mean of the shifted low series (add shiftLow for the mean). */
  lowOffset(): number {
    return this.meanLow + this.meanLowError;
  }
  highOffset(): number {
    return this.meanHigh + this.meanHighError;
  }
  sumLowLow(): number {
    return this.lowLow + this.lowLowError;
  }
  sumHighHigh(): number {
    return this.highHigh + this.highHighError;
  }
  sumLowHigh(): number {
    return this.lowHigh + this.lowHighError;
  }
}
