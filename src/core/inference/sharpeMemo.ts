/**
 * The Sharpe ratios of books already assessed in a run. A batch's pairs share books (25 low books by
 * 8 high books are 200 pairs but 33 books), and a book's Sharpe ratio and its standard errors are a
 * function of its scaled excess series alone (sharpe.ts): the same book series, the same risk-free
 * rates, the same power-of-two scale and the same HAC options give the same series, so the same
 * numbers, bit for bit. The memo keys on those: the series and the rates by the identity of their
 * arrays (never copied or hashed), the scale and the rate by value, the HAC options by their JSON.
 *
 * A caller must not change an array it has passed while the memo lives: the input layer hands every
 * pair a column kept whole as the same array, and nothing writes into a sample's columns.
 */
import type { HacOptions } from "./options.js";
import type { SharpeStdErrors } from "./sharpe.js";

export class SharpeMemo {
  private readonly ids = new WeakMap<object, number>();
  private readonly results = new Map<string, SharpeStdErrors>();
  private arrays = 0;

  /** Ratios computed so far (one a key: every miss stores its own). */
  get computed(): number {
    return this.results.size;
  }

  /**
   * The Sharpe ratio of the excess series of `book` over `riskFree` times `scale` under `hac`:
   * `compute()` the first time, the same result after.
   */
  of(
    book: ArrayLike<number>,
    riskFree: ArrayLike<number> | number | undefined,
    scale: number,
    hac: HacOptions,
    compute: () => SharpeStdErrors,
  ): SharpeStdErrors {
    // A rate by value (-0 apart from 0: x - 0 and x - -0 differ at x = -0), rates by their array.
    const rates = typeof riskFree === "object" ? `#${this.idOf(riskFree)}` : Object.is(riskFree, -0) ? "-0" : String(riskFree);
    const key = `${this.idOf(book)} ${rates} ${scale} ${JSON.stringify(hac)}`;
    const known = this.results.get(key);
    if (known !== undefined) return known;
    const result = compute();
    this.results.set(key, result);
    return result;
  }

  private idOf(array: object): number {
    let id = this.ids.get(array);
    if (id === undefined) {
      id = ++this.arrays;
      this.ids.set(array, id);
    }
    return id;
  }
}
