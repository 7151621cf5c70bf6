#!/usr/bin/python3
"""Reference statistics for tests/Atlas.Statistics.Tests, computed with NumPy/SciPy independently of the project.

Usage: /usr/bin/python3 reference_statistics.py DIR
DIR holds raw little-endian arrays written by the test: times.i64 (Unix seconds UTC), hs.f32, te.f32, tp.f32,
dir.f32, spread.f32 (a missing variable is an empty file) and settings.json. Prints one JSON document on stdout.

Definitions (IEC TS 62600-101 / tests/data/README.md): power per step J = rho g cg(Te, h) Hs^2 / 16 with rho 1025, g 9.81,
cg from the root of omega^2 = g k tanh(k h) by scipy.optimize.brentq (deep water cg = g Te / (4 pi) when the depth
is NaN); Te = 0.9 Tp when Te is absent. Means in float64, population sd (numpy.std), percentiles by
numpy.percentile with the requested method. Months and years are calendar months in UTC; seasons are
DJF/MAM/JJA/SON by calendar month across all years (Dec, Jan, Feb of every year, not shifted).

Calendar-true coverage: a period expects the calendar seconds of its months within the record's years (and the
window) over the nominal step (numpy's mode of the step intervals), every (year, month) at least its actual steps.
Month-balanced seasons and annual period (the atlas's stated method): each valid value of calendar month m weighs
E_m / V_m (expected over valid steps of m in the period); numpy.average with these weights gives the means and the
population sd; weighted percentiles put the k-th sorted value at rank (n - 1) W_k / (W - w_last) (W_k the weight
before it) and read numpy's virtual index of the method there (numpy.interp); exceedance is the weight above over
the total. With equal ratios (whole years) the plain numpy functions are used.
Directionality coefficient of a period: an independent grid evaluation of the cosine-2s model, not the atlas's
harmonics: each step's D(phi) = |cos((phi - mean)/2)|^(2s), s = 2/sigma^2 - 1, normalised on a 0.25-degree grid,
summed with weights J (times the month weight), then J_theta(theta) = sum F(phi) max(cos(theta - phi), 0) dphi on a
0.05-degree theta grid; d = max J_theta / sum of weighted J, with the argmax direction.
Inter-annual: a season of one year is contiguous (the winter of Y is December Y-1 with January and February Y),
its coverage against the calendar of all its months (also outside the record); the coefficients use the years
with coverage at or above the threshold.
"""
import json, os, sys
import numpy as np
from scipy.optimize import brentq

RHO, G = 1025.0, 9.81
d = sys.argv[1]
settings = json.load(open(os.path.join(d, "settings.json")))
def load(name, dtype):
    p = os.path.join(d, name)
    return np.fromfile(p, dtype=dtype) if os.path.getsize(p) > 0 else None
times = load("times.i64", "<i8")
hs, te, tp, dr, spread = (load(f"{n}.f32", "<f4") for n in ("hs", "te", "tp", "dir", "spread"))
depth = settings["depth"]  # null = deep water
method = settings.get("method", "linear")

stamps = times.astype("datetime64[s]")
years = stamps.astype("datetime64[Y]").astype(int) + 1970
months = stamps.astype("datetime64[M]").astype(int) % 12 + 1

hs64 = hs.astype(np.float64)
hs_valid = np.isfinite(hs64) & (hs64 >= 0)
if te is not None and np.any(np.isfinite(te) & (te > 0)):
    te64 = te.astype(np.float64)
elif tp is not None:
    te64 = (tp * np.float32(0.9)).astype(np.float64)   # the ratio applied in single precision, as stored
else:
    te64 = None

def group_velocity(period):
    omega = 2 * np.pi / period
    if depth is None:
        return G / (2 * omega)
    y = omega ** 2 * depth / G
    x = brentq(lambda x: x * np.tanh(x) - y, 1e-12, 2 * max(y, np.sqrt(y)) + 1, xtol=1e-15, rtol=1e-15)
    k = x / depth
    return 0.5 * (1 + 2 * x / np.sinh(2 * x)) * omega / k

power = None
if te64 is not None:
    valid = hs_valid & np.isfinite(te64) & (te64 > 0)
    power = np.full(len(hs64), np.nan)
    unique, inverse = np.unique(te64[valid], return_inverse=True)
    cg = np.array([group_velocity(t) for t in unique])
    power[valid] = RHO * G * cg[inverse] * hs64[valid] ** 2 / 16 / 1000

diffs = np.diff(times)
diffs = diffs[diffs > 0]
if diffs.size:
    values_, counts_ = np.unique(diffs, return_counts=True)
    nominal = int(values_[np.argmax(counts_)])
else:
    nominal = 3600

def month_expected(y, m):
    start = np.datetime64(f"{y:04d}-{m:02d}-01T00:00:00", "s")
    end = np.datetime64(f"{y + (m == 12):04d}-{m % 12 + 1:02d}-01T00:00:00", "s")
    return int((int((end - start).astype(int)) + nominal // 2) // nominal)

first_year, last_year = int(years.min()), int(years.max())
slot_expected = {}
for y in range(first_year, last_year + 1):
    for m in range(1, 13):
        actual = int(np.sum((years == y) & (months == m)))
        slot_expected[(y, m)] = max(month_expected(y, m), actual)

window = settings.get("window")
in_window = np.ones(len(times), bool)
if window:
    if window.get("firstYear") is not None: in_window &= years >= window["firstYear"]
    if window.get("lastYear") is not None: in_window &= years <= window["lastYear"]
    if window.get("months"): in_window &= np.isin(months, window["months"])

names = ["jan", "feb", "mar", "apr", "may", "jun", "jul", "aug", "sep", "oct", "nov", "dec"]
seasons = {"djf": [12, 1, 2], "mam": [3, 4, 5], "jja": [6, 7, 8], "son": [9, 10, 11]}
periods = [(n, months == i + 1) for i, n in enumerate(names)]
periods += [(n, np.isin(months, m)) for n, m in seasons.items()]
periods += [("annual", np.ones(len(times), bool))]
periods += [(f"y{y}", years == y) for y in np.unique(years)]

def slot_in_window(y, m):
    if not window: return True
    if window.get("firstYear") is not None and y < window["firstYear"]: return False
    if window.get("lastYear") is not None and y > window["lastYear"]: return False
    if window.get("months") and m not in window["months"]: return False
    return True

def period_months(name):
    if name in names: return [names.index(name) + 1]
    if name in seasons: return seasons[name]
    return list(range(1, 13))

def expected_by_month(name):
    """Expected steps per calendar month (index m - 1) of a period inside the window, against the calendar."""
    e = np.zeros(12, dtype=np.int64)
    for (y, m), n in slot_expected.items():
        if name.startswith("y") and y != int(name[1:]): continue
        if m in period_months(name) and slot_in_window(y, m):
            e[m - 1] += n
    return e

def balance_weights(name, values, mask):
    """Per-value weights E_m / V_m of a season or annual period, or None when the ratios are equal (or not balanced)."""
    if name not in seasons and name != "annual":
        return None
    ok = mask & np.isfinite(values)
    e = expected_by_month(name)
    v = np.bincount(months[ok] - 1, minlength=12)
    ratios = {(int(max(e[m], v[m])), int(v[m])) for m in range(12) if v[m] > 0}
    # Equal when every E_m * V_ref == E_ref * V_m (integers, as the atlas compares them).
    ref = next(iter(ratios)) if ratios else None
    if ref is None or all(a * ref[1] == ref[0] * b for a, b in ratios):
        return None
    w_month = np.zeros(12)
    for m in range(12):
        if v[m] > 0: w_month[m] = max(e[m], v[m]) / v[m]
    return w_month[months[ok] - 1]

def virtual_index(n, p):
    alpha_beta = {"inverted_cdf": None, "averaged_inverted_cdf": None, "closest_observation": None,
                  "interpolated_inverted_cdf": (0, 1), "hazen": (0.5, 0.5), "weibull": (0, 0), "linear": (1, 1),
                  "median_unbiased": (1 / 3, 1 / 3), "normal_unbiased": (3 / 8, 3 / 8)}[method]
    if alpha_beta is None:
        return n * p - (1.5 if method == "closest_observation" else 1)
    a, b = alpha_beta
    return n * p + a + p * (1 - a - b) - 1

def weighted_percentile(v, w, q):
    order = np.argsort(v, kind="stable")
    x, ww = v[order], w[order]
    before = np.cumsum(ww) - ww
    n = x.size
    if n == 1: return float(x[0])
    r = (n - 1) * before / before[-1]   # before[-1] = W - w_last
    vi = min(max(virtual_index(n, q / 100), 0), n - 1)
    return float(np.interp(vi, r, x))

def summary(values, mask, expected, name):
    if values is None:
        return None
    v = values[mask & np.isfinite(values)]
    out = {"count": int(v.size), "coverage": v.size / expected}
    if v.size:
        w = balance_weights(name, values, mask)
        if w is None:
            out.update(mean=float(np.mean(v)), sd=float(np.std(v)), min=float(v.min()), max=float(v.max()),
                       p10=float(np.percentile(v, 10, method=method)), p50=float(np.percentile(v, 50, method=method)),
                       p90=float(np.percentile(v, 90, method=method)), p99=float(np.percentile(v, 99, method=method)))
        else:
            mean = np.average(v, weights=w)
            out.update(mean=float(mean), sd=float(np.sqrt(np.average((v - mean) ** 2, weights=w))), min=float(v.min()), max=float(v.max()),
                       p10=weighted_percentile(v, w, 10), p50=weighted_percentile(v, w, 50),
                       p90=weighted_percentile(v, w, 90), p99=weighted_percentile(v, w, 99))
    return out

def positive(values):
    if values is None: return None
    v = values.astype(np.float64)
    v[~(v > 0)] = np.nan
    return v

def exceedance(values, mask, thresholds, name):
    v = values[mask & np.isfinite(values)].astype(np.float32)  # compared in single precision, like the stored data
    w = balance_weights(name, values, mask)
    if w is None:
        return [float(np.mean(v > np.float32(t))) if v.size else None for t in thresholds]
    return [float(np.sum(w[v > np.float32(t)]) / np.sum(w)) for t in thresholds]

PHI = np.radians(np.arange(0, 360, 0.25))
THETA = np.radians(np.arange(0, 360, 0.05))
KERNEL = np.maximum(np.cos(THETA[:, None] - PHI[None, :]), 0)  # theta x phi

def directionality(j, mean_deg, spread_deg):
    """Period d from a grid evaluation of the cosine-2s model (see the module notes); j already month-weighted."""
    sigma = np.radians(spread_deg.astype(np.float64))
    s_exp = np.maximum(0, 2 / sigma ** 2 - 1)
    f = np.zeros(PHI.size)
    for start in range(0, j.size, 512):
        sl = slice(start, start + 512)
        dens = np.abs(np.cos((PHI[None, :] - np.radians(mean_deg[sl].astype(np.float64))[:, None]) / 2)) ** (2 * s_exp[sl][:, None])
        dens /= dens.sum(axis=1, keepdims=True)   # normalised on the grid: sum D dphi = 1 per step
        f += (j[sl][:, None] * dens).sum(axis=0)
    resolved = KERNEL @ f
    k = int(np.argmax(resolved))
    return float(resolved[k] / j.sum()), float(np.degrees(THETA[k]))

result = {"periods": {}}
hs_clean = np.where(hs_valid, hs64, np.nan)
for name, member in periods:
    mask = member & in_window
    if int(mask.sum()) == 0:
        continue
    expected = int(expected_by_month(name).sum())
    entry = {"expected": expected, "hs": summary(hs_clean, mask, expected, name), "te": summary(positive(te64), mask, expected, name),
             "tp": summary(positive(tp), mask, expected, name), "j": summary(power, mask, expected, name),
             "spread": summary(None if spread is None else np.where(spread >= 0, spread.astype(np.float64), np.nan), mask, expected, name),
             "hsExceedance": exceedance(hs_clean, mask, settings["hsThresholds"], name)}
    if power is not None:
        entry["jExceedance"] = exceedance(power, mask, settings["powerThresholds"], name)
    if dr is not None and power is not None:
        dir_values = np.where(np.isfinite(dr), power, np.nan)
        ok = mask & np.isfinite(dir_values)
        balance = balance_weights(name, dir_values, mask)
        w, a = power[ok] * (1 if balance is None else balance), np.radians(dr[ok].astype(np.float64))
        c, s = np.sum(w * np.cos(a)), np.sum(w * np.sin(a))
        entry["dirMean"] = float(np.degrees(np.arctan2(s, c)) % 360)
        entry["dirSpread"] = float(np.degrees(np.sqrt(2 * (1 - np.hypot(c, s) / np.sum(w)))))
        sector = np.floor(((dr[ok].astype(np.float64) + 11.25) % 360) / 22.5).astype(int) % 16
        entry["rose"] = (np.bincount(sector, weights=w, minlength=16) / np.sum(w)).tolist()
        entry["dirCount"] = int(ok.sum())
        if spread is not None:
            d_values = np.where(np.isfinite(dr) & (spread >= 0), power, np.nan)
            okd = mask & np.isfinite(d_values)
            balance = balance_weights(name, d_values, mask)
            jd = power[okd] * (1 if balance is None else balance)
            entry["dCount"] = int(okd.sum())
            entry["d"], entry["dMaxFrom"] = directionality(jd, dr[okd], spread[okd]) if okd.any() and jd.sum() > 0 else (None, None)
    result["periods"][name] = entry

# Exceedance curves, joint occurrence and inter-annual means over the window.
def curve(values, step):
    v = values[in_window & np.isfinite(values)].astype(np.float32)
    k = np.arange(int(np.ceil(v.max() / step)) + 1) * step
    w = balance_weights("annual", values, in_window)
    if w is None:
        return {"thresholds": k.tolist(), "fractions": [float(np.mean(v > np.float32(t))) for t in k]}
    return {"thresholds": k.tolist(), "fractions": [float(np.sum(w[v > np.float32(t)]) / np.sum(w)) for t in k]}
result["hsCurve"] = curve(hs_clean, settings["hsCurveStep"])
if power is not None:
    result["jCurve"] = curve(power, settings["powerCurveStep"])
    ok = in_window & np.isfinite(power)
    h, t, j = hs64[ok], te64[ok], power[ok]
    rows = int(np.floor(h.max() / 0.5)) + 1
    c0, c1 = int(np.floor(t.min())), int(np.floor(t.max()))
    hs_edges = np.arange(rows + 1) * 0.5
    te_edges = np.arange(c0, c1 + 2) * 1.0
    counts, _, _ = np.histogram2d(h, t, bins=[hs_edges, te_edges])
    wj = balance_weights("annual", power, in_window)
    wj = np.ones(j.size) if wj is None else wj
    occurrence, _, _ = np.histogram2d(h, t, bins=[hs_edges, te_edges], weights=wj)
    energy, _, _ = np.histogram2d(h, t, bins=[hs_edges, te_edges], weights=j * wj)
    result["joint"] = {"hsEdges": hs_edges[:-1].tolist(), "teEdges": te_edges[:-1].tolist(), "counts": counts.astype(int).tolist(),
                       "fractionOfTime": (occurrence / wj.sum()).tolist(),
                       "fractionOfEnergy": (energy / (j * wj).sum()).tolist(), "total": int(ok.sum())}
    inter = {}
    te_clean = positive(te64)
    for name in ["annual", "djf", "mam", "jja", "son"]:
        rows_ = []
        last = last_year + (1 if name == "djf" else 0)
        for y in range(first_year, last + 1):
            members = [(y - 1 if (name == "djf" and m == 12) else y, m) for m in period_months(name)]
            if window and window.get("months"):
                members = [(yy, m) for yy, m in members if m in window["months"]]
            expected = sum(month_expected(yy, m) if (yy, m) not in slot_expected else slot_expected[(yy, m)] for yy, m in members)
            mask = np.zeros(len(times), bool)
            for yy, m in members:
                mask |= (years == yy) & (months == m)
            mask &= in_window
            if not mask.any() or expected == 0:
                continue
            okj = mask & np.isfinite(power)
            first, last_ = members[0], members[-1]
            label = str(y) if name == "annual" else f"{first[0]:04d}-{first[1]:02d}/{last_[0]:04d}-{last_[1]:02d}"
            rows_.append({"year": int(y), "label": label, "hs": float(np.nanmean(hs_clean[mask])) if np.isfinite(hs_clean[mask]).any() else None,
                          "te": float(np.nanmean(te_clean[mask])) if np.isfinite(te_clean[mask]).any() else None,
                          "j": float(np.mean(power[okj])) if okj.any() else None, "coverage": okj.sum() / expected})
        used = [r for r in rows_ if r["coverage"] >= settings["lowCoverage"]]
        def cov(key):
            v = np.array([r[key] for r in used if r[key] is not None])
            return float(np.std(v, ddof=1) / np.mean(v)) if v.size >= 2 else None
        inter[name] = {"years": rows_, "leftOut": [r["year"] for r in rows_ if r["coverage"] < settings["lowCoverage"]],
                       "hsCov": cov("hs"), "teCov": cov("te"), "jCov": cov("j")}
    result["interAnnual"] = inter
json.dump(result, sys.stdout, allow_nan=False)
