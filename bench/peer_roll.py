"""numpy peer of case (d): the moments, CAPM fits, bounds and landmark low betas of every rolling
window, from cumulative sums. Reads the CSV with numpy.loadtxt (dates as text, numbers converted in
one vectorised step), forms window sums as differences of cumulative sums of x, y, x^2, y^2, xy
(after centring at the full-sample means, which keeps the differences from cancelling), evaluates
every column with array expressions and writes the same numbers as `roll --format csv` (full precision,
%.17g; undefined values as nan where ours leaves the field empty).

Usage: python3 bench/peer_roll.py FILE LOW HIGH WINDOW
"""

import sys

import numpy as np

from peer_common import bounds, equal_noise, read_columns

W = 0.5
HEADER = (
    "start_date,end_date,observations,low_mean,high_mean,low_variance,high_variance,covariance,market_mean,market_variance,"
    "low_alpha,low_beta,low_alpha_se,low_beta_se,low_r_squared,low_residual_variance,"
    "high_alpha,high_beta,high_alpha_se,high_beta_se,high_r_squared,high_residual_variance,"
    "low_beta_min,low_beta_max,high_beta_min,high_beta_max,factor_variance_min,factor_variance_max,"
    "low_noise_free,high_noise_free,equal_noise,capm_consistent,return_implied"
)


def main():
    path, low_name, high_name, window = sys.argv[1], sys.argv[2], sys.argv[3], int(sys.argv[4])
    dates, (low, high) = read_columns(path, [low_name, high_name], with_dates=True)
    k = window
    v = 1 - W
    centre_l, centre_h = low.mean(), high.mean()
    x, y = low - centre_l, high - centre_h

    def window_sum(z):
        cs = np.concatenate(([0.0], np.cumsum(z)))
        return cs[k:] - cs[:-k]

    sx, sy = window_sum(x), window_sum(y)
    mx, my = sx / k, sy / k
    sll = window_sum(x * x) - k * mx * mx
    shh = window_sum(y * y) - k * my * my
    slh = window_sum(x * y) - k * mx * my
    ml, mh = centre_l + mx, centre_h + my
    vl, vh, c = sll / (k - 1), shh / (k - 1), slh / (k - 1)
    mm = W * ml + v * mh
    smm = W * W * sll + 2 * W * v * slh + v * v * shh
    det = sll * shh - slh * slh
    cols = [ml, mh, vl, vh, c, mm, smm / (k - 1)]
    for own, with_market, ssr, mean in ((sll, W * sll + v * slh, v * v * det / smm, ml), (shh, W * slh + v * shh, W * W * det / smm, mh)):
        beta = with_market / smm
        s2 = ssr / (k - 2)
        cols += [mean - beta * mm, beta, np.sqrt(s2 * (1 / k + mm * mm / smm)), np.sqrt(s2 / smm),
                 (with_market / own) * (with_market / smm), ssr / (k - 1)]
    with np.errstate(divide="ignore", invalid="ignore"):
        ok = c > 0
        lower, upper, h_up, h_low, phi_min, phi_max = bounds(W, vl, vh, c)
        capm_low = cols[8]
        implied = ml / mm
        implied_ok = ok & (mm != 0) & (np.abs(mm) >= np.sqrt(smm / (k - 1)) / np.sqrt(k)) & (implied > 0) & (implied < 1 / W)
        set_cols = [lower, upper, h_up, h_low, phi_min, phi_max,
                    upper, lower, np.clip(equal_noise(W, vl, vh, c), lower, upper), np.clip(capm_low, lower, upper)]
        cols += [np.where(ok, col, np.nan) for col in set_cols]
        cols.append(np.where(implied_ok, implied, np.nan))
    count = len(ml)
    # The row formatting numpy.savetxt does (fmt % row), from Python lists: numpy.savetxt itself takes
    # 19 s for the 1,000,000 x 31 numbers alone and 36 s on a record array with the dates, this 14 s.
    fmt = "%s,%s,%d," + ",".join(["%.17g"] * len(cols)) + "\n"
    out = sys.stdout
    out.write(HEADER + "\n")
    matrix = np.column_stack(cols)
    starts, ends = dates[:count].tolist(), dates[k - 1 :].tolist()
    for first in range(0, count, 100_000):
        rows = matrix[first : first + 100_000].tolist()
        out.write("".join([fmt % (starts[first + i], ends[first + i], k, *row) for i, row in enumerate(rows)]))


if __name__ == "__main__":
    main()
