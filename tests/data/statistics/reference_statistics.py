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

def summary(values, mask, expected):
    if values is None:
        return None
    v = values[mask & np.isfinite(values)]
    out = {"count": int(v.size), "coverage": v.size / expected}
    if v.size:
        out.update(mean=float(np.mean(v)), sd=float(np.std(v)), min=float(v.min()), max=float(v.max()),
                   p10=float(np.percentile(v, 10, method=method)), p50=float(np.percentile(v, 50, method=method)),
                   p90=float(np.percentile(v, 90, method=method)), p99=float(np.percentile(v, 99, method=method)))
    return out

def positive(values):
    if values is None: return None
    v = values.astype(np.float64)
    v[~(v > 0)] = np.nan
    return v

def exceedance(values, mask, thresholds):
    v = values[mask & np.isfinite(values)].astype(np.float32)  # compared in single precision, like the stored data
    return [float(np.mean(v > np.float32(t))) if v.size else None for t in thresholds]

result = {"periods": {}}
hs_clean = np.where(hs_valid, hs64, np.nan)
for name, member in periods:
    mask = member & in_window
    expected = int(mask.sum())
    if expected == 0:
        continue
    entry = {"expected": expected, "hs": summary(hs_clean, mask, expected), "te": summary(positive(te64), mask, expected),
             "tp": summary(positive(tp), mask, expected), "j": summary(power, mask, expected),
             "spread": summary(None if spread is None else np.where(spread >= 0, spread.astype(np.float64), np.nan), mask, expected),
             "hsExceedance": exceedance(hs_clean, mask, settings["hsThresholds"])}
    if power is not None:
        entry["jExceedance"] = exceedance(power, mask, settings["powerThresholds"])
    if dr is not None and power is not None:
        ok = mask & np.isfinite(power) & np.isfinite(dr)
        w, a = power[ok], np.radians(dr[ok].astype(np.float64))
        c, s = np.sum(w * np.cos(a)), np.sum(w * np.sin(a))
        entry["dirMean"] = float(np.degrees(np.arctan2(s, c)) % 360)
        entry["dirSpread"] = float(np.degrees(np.sqrt(2 * (1 - np.hypot(c, s) / np.sum(w)))))
        sector = np.floor(((dr[ok].astype(np.float64) + 11.25) % 360) / 22.5).astype(int) % 16
        entry["rose"] = (np.bincount(sector, weights=w, minlength=16) / np.sum(w)).tolist()
        entry["dirCount"] = int(ok.sum())
    result["periods"][name] = entry

# Exceedance curves, joint occurrence and inter-annual means over the window.
def curve(values, step):
    v = values[in_window & np.isfinite(values)].astype(np.float32)
    k = np.arange(int(np.ceil(v.max() / step)) + 1) * step
    return {"thresholds": k.tolist(), "fractions": [float(np.mean(v > np.float32(t))) for t in k]}
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
    energy, _, _ = np.histogram2d(h, t, bins=[hs_edges, te_edges], weights=j)
    result["joint"] = {"hsEdges": hs_edges[:-1].tolist(), "teEdges": te_edges[:-1].tolist(), "counts": counts.astype(int).tolist(),
                       "fractionOfEnergy": (energy / j.sum()).tolist(), "total": int(ok.sum())}
    inter = {}
    te_clean = positive(te64)
    for name, member in [("annual", np.ones(len(times), bool))] + [(n, np.isin(months, m)) for n, m in seasons.items()]:
        rows_ = []
        for y in np.unique(years[in_window]):
            mask = member & in_window & (years == y)
            if not mask.any():
                continue
            okj = mask & np.isfinite(power)
            rows_.append({"year": int(y), "hs": float(np.nanmean(hs_clean[mask])) if np.isfinite(hs_clean[mask]).any() else None,
                          "te": float(np.nanmean(te_clean[mask])) if np.isfinite(te_clean[mask]).any() else None,
                          "j": float(np.mean(power[okj])) if okj.any() else None, "coverage": okj.sum() / mask.sum()})
        used = [r for r in rows_ if r["coverage"] >= settings["lowCoverage"]]
        def cov(key):
            v = np.array([r[key] for r in used if r[key] is not None])
            return float(np.std(v, ddof=1) / np.mean(v)) if v.size >= 2 else None
        inter[name] = {"years": rows_, "hsCov": cov("hs"), "teCov": cov("te"), "jCov": cov("j")}
    result["interAnnual"] = inter
json.dump(result, sys.stdout, allow_nan=False)
