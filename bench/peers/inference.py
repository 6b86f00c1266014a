"""The default uncertainty of `solve`, in numpy, for every peer (docs/methods.md §4, §5.1, §8, §12):

- HAC kernel sums with the Bartlett kernel at the Newey-West (1994) automatic lag, no prewhitening, no
  small-sample factor (our defaults): pre-lag m = floor(4 (T/100)^(2/9)), f_t the sum of the columns
  (0 weight for an intercept's column), sigma_j = sum f_t f_{t+j} / T, S = 1.1447 ((s1/s0)^2)^(1/3)
  T^(1/3), lag L = floor(S), weights 1 - j/(L + 1); the sum Gamma_0 + sum_j w_j (Gamma_j + Gamma_j'),
  from running sums in linear time whatever the lag (L is 30 to 60 on a million rows of these data);
- CAPM HAC standard errors: (X'X)^-1 S (X'X)^-1 with X = [1, M], scores X e;
- the bounds' delta-method standard errors and correlation (§4, "one bandwidth per bound"): each bound's
  influence series f_t = g' (z_t - zbar), z_t = ((x - xbar)^2, (y - ybar)^2, (x - xbar)(y - ybar)), and
  the Bartlett sum of (f_low, f_up) at the real bandwidth S = min(6 sqrt(T), T) (weights 1 - j/S), with
  Kiefer-Vogelsang's fixed-b factor k = q_0.975(S/T) / z_0.975 on the limits;
- the Imbens-Manski interval on the standard errors times k (bisection on Phi(C + r) - Phi(-C) =
  confidence), cut to the admissible range [0, 1/w] (§5);
- the Sharpe ratios' HAC standard errors from the standardised pair (d/s, (d/s)^2 - 1), g = (1, -SR/2).
"""

import math
from statistics import NormalDist

import numpy as np


def nw94_lag(u, weights):
    """Newey-West (1994) Bartlett bandwidth and lag for the columns of u (T x k)."""
    t = u.shape[0]
    pre = min(t - 1, int(math.floor(4 * (t / 100) ** (2 / 9))))
    f = u @ np.asarray(weights, dtype=float)
    sigma = np.array([f[: t - j] @ f[j:] for j in range(pre + 1)]) / t
    j = np.arange(pre + 1)
    s0 = sigma[0] + 2 * sigma[1:].sum()
    s1 = 2 * (j * sigma).sum()
    bandwidth = 1.1447 * ((s1 / s0) ** 2) ** (1 / 3) * t ** (1 / 3)
    if not (bandwidth > 0 and math.isfinite(bandwidth)):
        return 0.0, 0
    return bandwidth, int(math.floor(bandwidth))


def window_squares(u, b):
    """Q(B) = sum_t W_t W_t' over every window of B consecutive rows meeting the sample (cut to it)."""
    n, k = u.shape
    b = min(b, n)
    cs = np.zeros((n + 1, k))
    np.cumsum(u, axis=0, out=cs[1:])
    w = np.empty((n + b - 1, k))
    w[: b - 1] = cs[1:b]  # windows starting before the first row
    np.subtract(cs[b:], cs[: n + 1 - b], out=w[b - 1 : n])  # whole windows
    np.subtract(cs[n], cs[n + 1 - b : n], out=w[n:])  # windows running past the last row
    return w.T @ w


def bartlett_sum_real(u, s):
    """Bartlett sum at a real bandwidth S: ((S - B + 1) Q(B) + (B - S) Q(B - 1)) / S with B = ceil(S)."""
    b = math.ceil(s)
    lower = window_squares(u, b - 1) if b > 1 and b > s else 0.0
    return ((s - b + 1) * window_squares(u, b) + (b - s) * lower) / s


def kernel_sum(u, weights):
    """Bartlett kernel sum S (k x k) of the rows of u at the Newey-West (1994) lag L, and that lag.

    In linear time from running sums (docs/methods.md §8, "The Bartlett sum from window sums"): with
    B = L + 1 and W_t the sum of u over rows t .. t + B - 1 (cut to the sample) for every window
    meeting the sample, sum_t W_t W_t' = B (Gamma_0 + sum_j (1 - j/B) (Gamma_j + Gamma_j')). The window
    sums are differences of one cumulative sum of u."""
    _, lag = nw94_lag(u, weights)
    n, k = u.shape
    b = lag + 1
    if b == 1:
        return u.T @ u, lag
    cs = np.zeros((n + 1, k))
    np.cumsum(u, axis=0, out=cs[1:])
    if b > n:
        b = n
    w = np.empty((n + b - 1, k))
    w[: b - 1] = cs[1:b]  # windows starting before the first row
    np.subtract(cs[b:], cs[: n + 1 - b], out=w[b - 1 : n])  # whole windows
    np.subtract(cs[n], cs[n + 1 - b : n], out=w[n:])  # windows running past the last row
    return (w.T @ w) / (lag + 1), lag


def long_run(columns):
    u = np.column_stack(columns)
    u = u - u.mean(axis=0)
    s, lag = kernel_sum(u, np.ones(u.shape[1]))
    return s / u.shape[0], lag


def capm_hac(market, y):
    n = len(y)
    x = np.column_stack([np.ones(n), market])
    xtx = x.T @ x
    coef = np.linalg.solve(xtx, x.T @ y)
    e = y - x @ coef
    s, lag = kernel_sum(x * e[:, None], [0.0, 1.0])
    bread = np.linalg.inv(xtx)
    cov = bread @ s @ bread
    return math.sqrt(cov[0, 0]), math.sqrt(cov[1, 1]), lag


def imbens_manski(lower, upper, se_l, se_u, confidence=0.95):
    nd = NormalDist()
    alpha = 1 - confidence
    lo, hi = nd.inv_cdf(1 - alpha), nd.inv_cdf(1 - alpha / 2)
    top = max(se_l, se_u)
    delta = max(upper - lower, 0.0)
    r = (math.inf if delta > 0 else 0.0) if top == 0 else delta / top
    excess = lambda c: nd.cdf(c) - 0.5 * math.erfc((c + r) / math.sqrt(2)) - confidence  # noqa: E731
    if excess(hi) <= 0:
        crit = hi
    elif excess(lo) >= 0:
        crit = lo
    else:
        a, b = lo, hi
        for _ in range(200):
            m = 0.5 * (a + b)
            if m in (a, b):
                break
            a, b = (a, m) if excess(m) > 0 else (m, b)
        crit = 0.5 * (a + b)
    return lower - crit * se_l, upper + crit * se_u


def sharpe_hac(r):
    n = len(r)
    mu = r.mean()
    d = r - mu
    sigma = math.sqrt(d @ d / (n - 1))
    z = d / sigma
    omega, _ = long_run([z, z * z - 1])
    g = np.array([1.0, -mu / sigma / 2])
    return math.sqrt(max(0.0, g @ omega @ g) / n)


def uncertainty_digest(x, y, w, confidence=0.95):
    """The default uncertainty numbers of `solve`'s JSON, by their JSON path, from excess returns."""
    n = len(x)
    v = 1 - w
    market = w * x + v * y
    dx, dy = x - x.mean(), y - y.mean()
    vl, vh, c = dx @ dx / (n - 1), dy @ dy / (n - 1), dx @ dy / (n - 1)
    out = {}
    for book, series in (("low", x), ("high", y)):
        a_se, b_se, lag = capm_hac(market, series)
        out[f"capm.{book}.hac.alphaStdErr"] = a_se
        out[f"capm.{book}.hac.betaStdErr"] = b_se
        out["capm.hac.lags"] = lag
    dl, du = v * vh + w * c, w * vl + v * c
    gl = np.array([0.0, -v * c / dl**2, v * vh / dl**2])
    gu = np.array([v * c / du**2, 0.0, -v * vl / du**2])
    z = np.column_stack([dx * dx, dy * dy, dx * dy])
    z = z - z.mean(axis=0)
    bandwidth = min(6 * math.sqrt(n), n)
    omega = bartlett_sum_real(np.column_stack([z @ gl, z @ gu]), bandwidth) / n
    se_l = math.sqrt(max(0.0, omega[0, 0]) / n)
    se_u = math.sqrt(max(0.0, omega[1, 1]) / n)
    b = min(1.0, bandwidth / n)
    k = (1.96 + 2.9694 * b + 0.416 * b * b - 0.5324 * b**3) / NormalDist().inv_cdf(0.975)
    lower, upper = c / dl, max(c / dl, vl / du)
    out["uncertainty.method.lags"] = math.ceil(bandwidth) - 1
    out["uncertainty.bounds.lowBeta.min.stdError"] = se_l
    out["uncertainty.bounds.lowBeta.max.stdError"] = se_u
    out["uncertainty.bounds.correlation"] = omega[0, 1] / math.sqrt(omega[0, 0] * omega[1, 1])
    lo, hi = imbens_manski(lower, upper, k * se_l, k * se_u, confidence)
    out["uncertainty.lowBeta.interval.lower"], out["uncertainty.lowBeta.interval.upper"] = max(lo, 0.0), min(hi, 1 / w)
    for name, series in (("low", x), ("high", y), ("market", market)):
        out[f"uncertainty.sharpe.{name}.hacStdErr"] = sharpe_hac(series)
    return {k: float(val) for k, val in out.items()}
