/**
 * Central-difference Jacobian of a vector function: column j is (f(x + h_j e_j) - f(x - h_j e_j)) / (2 h_j)
 * with h_j = step max(|x_j|, floor), truncation error O(h^2) (Press et al. 2007, §5.7). A check on
 * analytic derivatives (docs/methods.md §3), not used where an analytic one exists.
 */
export function centralDifferenceJacobian(
  f: (x: readonly number[]) => readonly number[],
  x: readonly number[],
  step = 1e-6,
  floor = 1e-300,
): number[][] {
  const columns = x.map((xj, j) => {
    const h = step * Math.max(Math.abs(xj), floor);
    const up = [...x];
    const down = [...x];
    up[j] = xj + h;
    down[j] = xj - h;
    const fu = f(up);
    const fd = f(down);
    // The step actually taken (x + h rounds): divide by it, not by 2h.
    const taken = up[j]! - down[j]!;
    return fu.map((value, i) => (value - fd[i]!) / taken);
  });
  return f(x).map((_, i) => columns.map((column) => column[i]!));
}
