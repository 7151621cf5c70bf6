"""SciPy reference fits for ExtremeFitTests (tests/Atlas.Assessment.Tests/Extremes).

Reads the seeded samples of extreme_fit_samples.json and writes extreme_fits.json:
  /usr/bin/python3 extreme_fits.py extreme_fit_samples.json extreme_fits.json   (run in this folder)

genextreme.fit, gumbel_r.fit and genpareto.fit(floc=0) with a tight Nelder-Mead (scipy.optimize.fmin, xtol 1e-10,
ftol 1e-12) so the comparison is not limited by SciPy's default stopping rule; then the profile likelihood of the
50-year level (scipy.optimize Nelder-Mead and brentq) for the confidence-interval checks. It takes about 15 s alone
and minutes on a busy machine, which is why its output is stored rather than computed in every test run.
"""
import json, sys
import numpy as np
from scipy import stats, optimize
with open(sys.argv[1]) as f:
    d = json.load(f)
periods = d["periods"]; T = d["profile_period"]; rate = d["rate"]
crit = stats.chi2.ppf(0.95, 1) / 2.0

def tight(func, x0, args=(), disp=0):
    return optimize.fmin(func, x0, args=args, xtol=1e-10, ftol=1e-12, maxiter=200000, maxfun=400000, disp=0)

def minimise(nll, starts):
    best = None
    for s in starts:
        r = optimize.minimize(nll, s, method="Nelder-Mead", options=dict(xatol=1e-10, fatol=1e-12, maxiter=40000))
        if best is None or r.fun < best.fun:
            best = r
    return -best.fun

def bounds(profile, est, llmax, step):
    target = llmax - crit
    f = lambda z: profile(z) - target
    out = []
    for sign in (-1.0, 1.0):
        inside, h = est, step
        while True:
            trial = est + sign * h
            if f(trial) < 0:
                break
            inside, h = trial, 2 * h
        out.append(optimize.brentq(f, min(inside, trial), max(inside, trial), xtol=1e-10))
    return out

def finite(v):
    return v if np.isfinite(v) else 1e300

def gev_profile(x, c_hat, scale_hat, shape_fixed):
    yp = -np.log(1 - 1.0 / T)
    def profile(z):
        if shape_fixed:
            nll = lambda p: finite(-np.sum(stats.gumbel_r.logpdf(x, z + np.exp(p[0]) * np.log(yp), np.exp(p[0]))))
            return minimise(nll, [[np.log(scale_hat)]])
        def nll(p):
            s, xi = np.exp(p[0]), p[1]
            mu = z - s * (yp ** (-xi) - 1) / xi if abs(xi) > 1e-12 else z + s * np.log(yp)
            return finite(-np.sum(stats.genextreme.logpdf(x, -xi, mu, s)))
        return minimise(nll, [[np.log(scale_hat), -c_hat], [np.log(scale_hat), 0.0]])
    return profile

def gpd_profile(y, c_hat):
    L = np.log(rate * T)
    def profile(z):
        def nll(p):
            xi = p[0]
            s = z * xi / np.expm1(xi * L) if abs(xi) > 1e-12 else z / L
            return finite(-np.sum(stats.genpareto.logpdf(y, xi, 0, s)))
        return minimise(nll, [[c_hat], [0.0]])
    return profile

out = {}
for name in ["gev_heavy", "gev_bounded"]:
    x = np.array(d[name])
    c, loc, scale = stats.genextreme.fit(x, optimizer=tight)
    ll = float(np.sum(stats.genextreme.logpdf(x, c, loc, scale)))
    level = float(stats.genextreme.ppf(1 - 1.0 / T, c, loc, scale))
    out[name] = dict(c=c, loc=loc, scale=scale, ll=ll,
                     levels=[float(stats.genextreme.ppf(1 - 1.0 / t, c, loc, scale)) for t in periods],
                     ci=bounds(gev_profile(x, c, scale, False), level, ll, 0.2 * scale))
x = np.array(d["gumbel"])
loc, scale = stats.gumbel_r.fit(x)
ll = float(np.sum(stats.gumbel_r.logpdf(x, loc, scale)))
level = float(stats.gumbel_r.ppf(1 - 1.0 / T, loc, scale))
out["gumbel"] = dict(loc=loc, scale=scale, ll=ll,
                     levels=[float(stats.gumbel_r.ppf(1 - 1.0 / t, loc, scale)) for t in periods],
                     ci=bounds(gev_profile(x, 0.0, scale, True), level, ll, 0.2 * scale))
for name in ["excesses_heavy", "excesses_bounded"]:
    y = np.array(d[name])
    c, loc, scale = stats.genpareto.fit(y, floc=0, optimizer=tight)
    ll = float(np.sum(stats.genpareto.logpdf(y, c, 0, scale)))
    level = float(stats.genpareto.isf(1.0 / (rate * T), c, 0, scale))
    out[name] = dict(c=c, scale=scale, ll=ll,
                     levels=[float(stats.genpareto.isf(1.0 / (rate * t), c, 0, scale)) for t in periods],
                     ci=bounds(gpd_profile(y, c), level, ll, 0.2 * scale))
with open(sys.argv[2], "w") as f:
    json.dump(out, f, indent=1)
    f.write("\n")
