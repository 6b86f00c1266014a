"""The closed forms every peer evaluates, written once over an `ops` namespace so that the same text
runs on numpy arrays or scalars, polars expressions and DuckDB SQL expressions.

From a window's (or a sample's) count k, means of the excess returns and their second moments with
divisor k - 1 (vl, vh, c): the market proxy M = w x + (1 - w) y, both CAPM fits on M (docs/methods.md
§10 and §16: the closed forms from the 2x2 centred sums), the identified set (§1.2: Lb = C / D_l,
U = V_low / D_u, b_high(U) = C / D_u, b_high(Lb) = V_high / D_l, the factor variance's range) and the
landmark low betas (§25: equal noise is the Deming slope with ratio 1, §1.4; CAPM-consistent is the
CAPM beta kept inside the set; return-implied is mean x / mean M when |mean M| > z sd(M) / sqrt(k), z the
two-sided 95% normal critical value (Fieller's condition at the report's confidence), and 0 < b < 1/w, §26).
For `solve`, the structure at each point of the candidate grid and at each landmark as well (§1.1, §1.6:
the factor variance, both noise variances, the implied CAPM fits, expected alphas and Sharpe ratios), so
that the peers compute and check every number of the report's grid and landmarks, as ours does.
"""

import math

# scipy.stats.norm.ppf(0.975): Fieller's condition at the default 95% confidence.
FIELLER_Z = 1.959963984540054


class NumpyOps:
    def __init__(self):
        import numpy as np

        self.np = np

    def maximum(self, a, b):
        return self.np.maximum(a, b)

    def minimum(self, a, b):
        return self.np.minimum(a, b)

    def sqrt(self, a):
        return self.np.sqrt(a)

    def abs(self, a):
        return self.np.abs(a)

    def where(self, cond, a, b):
        with self.np.errstate(invalid="ignore", divide="ignore"):
            return self.np.where(cond, a, b)

    def both(self, a, b):
        return a & b

    nan = float("nan")


def columns(ops, w, k, ml, mh, vl, vh, c):
    """The 30 numbers `roll --format csv` writes per window after start, end and observations, by name."""
    v = 1 - w
    sll, shh, slh = vl * (k - 1), vh * (k - 1), c * (k - 1)
    mm = ml * w + mh * v
    smm = sll * (w * w) + slh * (2 * w * v) + shh * (v * v)
    det = ops.maximum(sll * shh - slh * slh, 0.0)
    out = {
        "lowMean": ml,
        "highMean": mh,
        "lowVariance": vl,
        "highVariance": vh,
        "covariance": c,
        "marketMean": mm,
        "marketVariance": smm / (k - 1),
    }
    for name, own, with_market, ssr_weight, mean in (("low", sll, sll * w + slh * v, v * v, ml), ("high", shh, slh * w + shh * v, w * w, mh)):
        beta = with_market / smm
        ssr = det * ssr_weight / smm
        s2 = ssr / (k - 2)
        out[f"{name}Alpha"] = mean - beta * mm
        out[f"{name}Beta"] = beta
        out[f"{name}AlphaStdErr"] = ops.sqrt(s2 * (mm * mm / smm + 1.0 / k))
        out[f"{name}BetaStdErr"] = ops.sqrt(s2 / smm)
        out[f"{name}RSquared"] = (with_market / own) * (with_market / smm)
        out[f"{name}ResidualVariance"] = ssr / (k - 1)
    du = vl * w + c * v
    dl = vh * v + c * w
    lower = c / dl
    upper = ops.maximum(lower, vl / du)
    high_at_upper = c / du
    high_at_lower = vh / dl
    peak = ops.minimum(ops.maximum(lower * 0.0 + 1 / (2 * w), lower), upper)
    phi_min = c * v / (peak * (1 - peak * w))
    phi_max = ops.maximum(dl * dl / vh, du * du / vl)
    d = vh - vl
    equal = 1 / ((ops.sqrt(d * d + c * c * 4) + d) / (c * 2) * v + w)
    capm = out["lowBeta"]
    implied = ml / mm
    ok = c > 0
    implied_ok = ops.both(ops.both(ok, ops.abs(mm) > FIELLER_Z * ops.sqrt(smm / (k - 1) / k)), ops.both(implied > 0, implied < 1 / w))
    set_values = {
        "lowBetaMin": lower,
        "lowBetaMax": upper,
        "highBetaMin": high_at_upper,
        "highBetaMax": high_at_lower,
        "factorVarianceMin": phi_min,
        "factorVarianceMax": phi_max,
        "lowNoiseFreeLowBeta": upper,
        "highNoiseFreeLowBeta": lower,
        "equalNoiseLowBeta": ops.minimum(ops.maximum(equal, lower), upper),
        "capmConsistentLowBeta": ops.minimum(ops.maximum(capm, lower), upper),
    }
    for name, value in set_values.items():
        out[name] = ops.where(ok, value, ops.nan)
    out["returnImpliedLowBeta"] = ops.where(implied_ok, implied, ops.nan)
    return out


ROLL_COLUMNS = [
    "lowMean", "highMean", "lowVariance", "highVariance", "covariance", "marketMean", "marketVariance",
    "lowAlpha", "lowBeta", "lowAlphaStdErr", "lowBetaStdErr", "lowRSquared", "lowResidualVariance",
    "highAlpha", "highBeta", "highAlphaStdErr", "highBetaStdErr", "highRSquared", "highResidualVariance",
    "lowBetaMin", "lowBetaMax", "highBetaMin", "highBetaMax", "factorVarianceMin", "factorVarianceMax",
    "lowNoiseFreeLowBeta", "highNoiseFreeLowBeta", "equalNoiseLowBeta", "capmConsistentLowBeta", "returnImpliedLowBeta",
]  # fmt: skip


def solve_digest(w, n, ml, mh, vl, vh, c, steps=11):
    """The numbers of `solve`'s JSON that the benchmark compares, by their JSON path, from scalars:
    moments, bounds, both CAPM fits, and the structures of the candidate grid and the landmarks."""
    col = columns(NumpyOps(), w, n, ml, mh, vl, vh, c)
    mm = col["marketMean"]
    vm = col["marketVariance"]
    out = {
        "observations": n,
        "moments.low.mean": ml,
        "moments.high.mean": mh,
        "moments.market.mean": mm,
        "moments.low.variance": vl,
        "moments.high.variance": vh,
        "moments.market.variance": vm,
        "moments.covariance.lowHigh": c,
        "moments.low.sharpeRatio": ml / math.sqrt(vl),
        "moments.high.sharpeRatio": mh / math.sqrt(vh),
        "moments.market.sharpeRatio": mm / math.sqrt(vm),
        "bounds.lowBeta.min": col["lowBetaMin"],
        "bounds.lowBeta.max": col["lowBetaMax"],
        "bounds.highBeta.min": col["highBetaMin"],
        "bounds.highBeta.max": col["highBetaMax"],
        "bounds.factorVariance.min": col["factorVarianceMin"],
        "bounds.factorVariance.max": col["factorVarianceMax"],
    }
    for book in ("low", "high"):
        for field, key in (("alpha", "Alpha"), ("beta", "Beta"), ("alphaStdErr", "AlphaStdErr"), ("betaStdErr", "BetaStdErr"),
                           ("rSquared", "RSquared"), ("residualVariance", "ResidualVariance")):  # fmt: skip
            out[f"capm.{book}.{field}"] = col[book + key]
    if c > 0:
        out.update(structures_digest(w, mm, vl, vh, c, col, steps))
    return {k: None if v is None else float(v) for k, v in out.items()}


def structure_at(w, mm, vl, vh, c, capm_low_beta, bl, bh):
    """The structures at low structural betas bl with high betas bh (numpy arrays; docs/methods.md §1.1,
    §1.6): the 16 numbers of a grid point or landmark in `solve`'s JSON, by name, as arrays (NaN where
    the report has null). Noise variances within 1e-12 of their book's variance of zero are 0
    (rounding at the set's ends, as the report says)."""
    import numpy as np

    v = 1 - w
    phi = c / (bl * bh)
    sl = vl - bl * c / bh
    sh = vh - bh * c / bl
    sl = np.where(np.abs(sl) <= 1e-12 * vl, 0.0, sl)
    sh = np.where(np.abs(sh) <= 1e-12 * vh, 0.0, sh)
    market_var = phi + w * w * sl + v * v * sh
    det = bl * bl * phi * sh + bh * bh * phi * sl + sl * sh
    alpha = (bl - capm_low_beta) * mm
    low_var, high_var = bl * bl * phi + sl, bh * bh * phi + sh
    with np.errstate(invalid="ignore", divide="ignore"):
        return {
            "lowBeta": bl,
            "highBeta": bh,
            "factorVariance": phi,
            "lowNoiseVariance": sl,
            "highNoiseVariance": sh,
            "noiseShare": np.where(sl + sh > 0, sl / (sl + sh), np.nan),
            "lowFactorRSquared": bl * bl * phi / vl,
            "highFactorRSquared": bh * bh * phi / vh,
            "impliedCapm.lowBeta": (bl * phi + w * sl) / market_var,
            "impliedCapm.highBeta": (bh * phi + v * sh) / market_var,
            "impliedCapm.lowResidualVariance": v * v * det / market_var,
            "impliedCapm.highResidualVariance": w * w * det / market_var,
            "expectedLowAlpha": alpha,
            "expectedHighAlpha": -w * alpha / v,
            "impliedLowSharpe": np.where(low_var > 0, bl * mm / np.sqrt(low_var), np.nan),
            "impliedHighSharpe": np.where(high_var > 0, bh * mm / np.sqrt(high_var), np.nan),
        }


def structures_digest(w, mm, vl, vh, c, col, steps):
    """The candidate grid (`steps` low betas evenly spaced over the set, both ends exact, the high beta
    interpolated between its end values) and the landmarks' structures, by JSON path, in one pass over
    the points' arrays."""
    import numpy as np

    v = 1 - w
    capm = (w * vl + v * c) / (w * w * vl + 2 * w * v * c + v * v * vh)
    lo, hi = float(col["lowBetaMin"]), float(col["lowBetaMax"])
    high_lo, high_hi = float(col["highBetaMin"]), float(col["highBetaMax"])
    fraction = np.arange(steps) / (steps - 1)
    grid_low, grid_high = lo + (hi - lo) * fraction, high_hi + (high_lo - high_hi) * fraction
    grid_low[-1], grid_high[-1] = hi, high_lo
    points = [f"grid.{k}" for k in range(steps)]
    equal, consistent = float(col["equalNoiseLowBeta"]), min(max(capm, lo), hi)
    landmarks = {"lowNoiseFree": (hi, high_lo), "highNoiseFree": (lo, high_hi), "equalNoise": (equal, (1 - w * equal) / v),
                 "capmConsistent": (consistent, (1 - w * consistent) / v)}  # fmt: skip
    implied = float(col["returnImpliedLowBeta"])
    if not math.isnan(implied):
        landmarks["returnImplied"] = (implied, (1 - w * implied) / v)
    points += [f"landmarks.{name}" for name in landmarks]
    low = np.concatenate([grid_low, [b for b, _ in landmarks.values()]])
    high = np.concatenate([grid_high, [b for _, b in landmarks.values()]])
    out = {}
    for name, values in structure_at(w, mm, vl, vh, c, capm, low, high).items():
        for at, value in zip(points, values.tolist()):
            out[f"{at}.{name}"] = None if value != value else value
    return out
