#!/usr/bin/python3
# Writes a file of directional spectra at output points the way spectral wave models write them, with netCDF4-python
# (a writer the project did not write), and beside it a JSON of every step's parameters computed with NumPy and SciPy,
# independently of the project's code:
#   make_point_spectra.py OUT.nc START_HOURS STEPS [--variant NAME]
# Layout: efth(time, station, frequency, direction) in m2 s rad-1; 32 geometric frequencies 0.035 * 1.1^i Hz; 24
# directions of 15 degrees given as "travelling to", in decreasing order from 90 degrees (as some models write them);
# longitude/latitude(time, station); station_name(station, string16) with cf_role timeseries_id; dpt(time, station).
# Three invented stations: "Harrow Deep" (80 m), "Cobble Shelf" (15 m) and "Wick Inner" (8 m).
# Each step is JONSWAP (DNV-RP-C205 form, gamma 3.3) with Hs and Tp varying in time, times cosine-2s spreading about a
# mean direction that turns in time. Variants write faults for the bad-input tests.
import json, sys
import numpy as np
from netCDF4 import Dataset
from scipy.optimize import brentq

path, start_hours, steps = sys.argv[1], float(sys.argv[2]), int(sys.argv[3])
variant = sys.argv[5] if len(sys.argv) > 5 and sys.argv[4] == "--variant" else ""
rho, g = 1025.0, 9.81
# float32, as the file stores them: the expectations use the same values.
freq = (0.035 * 1.1 ** np.arange(32)).astype(np.float32).astype(np.float64)
to_dirs = (90.0 - 15.0 * np.arange(24)) % 360          # travelling to: 90, 75, ..., 105
from_dirs = (to_dirs + 180.0) % 360
names = ["Harrow Deep", "Cobble Shelf", "Wick Inner"]
lons = np.array([-19.92, -19.71, -19.58]); lats = np.array([50.12, 50.21, 50.33]); depths = np.array([80.0, 15.0, 8.0])
times = start_hours + 3.0 * np.arange(steps)

def jonswap(f, hs, tp, gamma=3.3):
    fp = 1 / tp
    sg = np.where(f <= fp, 0.07, 0.09)
    return (1 - 0.287 * np.log(gamma)) * 5 / 16 * hs ** 2 * fp ** 4 * f ** -5 * np.exp(-1.25 * (fp / f) ** 4) * gamma ** np.exp(-(f - fp) ** 2 / (2 * sg ** 2 * fp ** 2))

def relative_depth(y):
    return brentq(lambda x: x * np.tanh(x) - y, 1e-12, 2 * max(y, np.sqrt(y)) + 1, xtol=1e-15, rtol=1e-15, maxiter=500)

def cg(f, h):
    omega = 2 * np.pi * f
    x = relative_depth(omega ** 2 * h / g)
    return 0.5 * (1 + 2 * x / np.sinh(2 * x)) * omega / (x / h)

efth = np.zeros((steps, 3, 32, 24), dtype=np.float32)
expected = {"stations": names, "steps": []}
dtheta = np.radians(15.0)
for t in range(steps):
    row = []
    k = int(round(times[t] / 3.0))  # the sea state is a function of the time itself, so files sharing a step agree on it
    for s in range(3):
        hs = 1.0 + 0.8 * s + 0.5 * np.sin(0.3 * k + s)
        tp = 8.0 + 2.0 * np.cos(0.2 * k) + 0.5 * s
        mean_from = (240.0 + 20.0 * np.sin(0.1 * k) + 10 * s) % 360
        spread = np.radians(25.0 + 5.0 * s)
        sexp = 2 / spread ** 2 - 1
        D = np.abs(np.cos(np.radians(from_dirs - mean_from) / 2)) ** (2 * sexp)
        D = D / (D.sum() * dtheta)
        S2 = (jonswap(freq, hs, tp)[:, None] * D[None, :]).astype(np.float32)
        efth[t, s] = S2
        S2 = S2.astype(np.float64)
        Sf = S2.sum(axis=1) * dtheta
        m0 = np.trapz(Sf, freq); m1 = np.trapz(Sf / freq, freq); m2 = np.trapz(Sf / freq ** 2, freq)
        c = np.array([cg(f, depths[s]) for f in freq])
        P = np.array([rho * g * np.trapz(c * S2[:, j], freq) * dtheta / 1000 for j in range(24)])
        hm0 = 4 * np.sqrt(m0); te = m1 / m0
        grid = np.arange(0, 360, 0.01)
        resolved = (P[None, :] * np.clip(np.cos(np.radians(grid[:, None] - from_dirs[None, :])), 0, None)).sum(axis=1)
        row.append({"hm0": hm0, "te": te, "tp": 1 / freq[np.argmax(Sf)], "j": P.sum(),
                    "j_parametric": rho * g * hm0 ** 2 / 16 * cg(1 / te, depths[s]) / 1000,
                    "directionality": resolved.max() / P.sum(), "eps0": np.sqrt(m0 * m2 / m1 ** 2 - 1),
                    "frequency_spectrum": Sf.tolist(), "direction_powers": P.tolist()})
    expected["steps"].append(row)

nc = Dataset(path, "w", format="NETCDF4")
nc.title = "Invented spectral output points for tests"
nc.featureType = "timeSeries"
nc.Conventions = "CF-1.8"
nc.createDimension("time", None); nc.createDimension("station", 3); nc.createDimension("string16", 16)
nc.createDimension("frequency", 32); nc.createDimension("direction", 24)
v = nc.createVariable("time", "f8", ("time",)); v.units = "hours since 2021-01-01 00:00:00"; v.standard_name = "time"; v.calendar = "standard"; v[:] = times
v = nc.createVariable("station_name", "S1", ("station", "string16")); v.cf_role = "timeseries_id"; v.long_name = "station name"
v[:] = np.array([list(n.ljust(16)[:16]) for n in names], dtype="S1")
if variant != "no_coordinates":
    v = nc.createVariable("longitude", "f4", ("time", "station")); v.units = "degree_east"; v.standard_name = "longitude"; v[:] = np.tile(lons, (steps, 1))
    v = nc.createVariable("latitude", "f4", ("time", "station")); v.units = "degree_north"; v.standard_name = "latitude"; v[:] = np.tile(lats, (steps, 1))
v = nc.createVariable("frequency", "f4", ("frequency",)); v.units = "s-1"; v.standard_name = "sea_surface_wave_frequency"
v[:] = freq[::-1] if variant == "frequencies_decreasing" else freq
if variant == "frequency_only":
    # S(f) only, per hertz, no depth in the file (the test gives the depths in a mapping file).
    v = nc.createVariable("ef", "f4", ("time", "station", "frequency"), fill_value=np.float32(9.96921e36))
    v.units = "m2 Hz-1"; v.standard_name = "sea_surface_wave_variance_spectral_density"
    v[:] = (efth.astype(np.float64).sum(axis=3) * dtheta).astype(np.float32)
    nc.close()
else:
    v = nc.createVariable("direction", "f4", ("direction",)); v.units = "degree"; v.standard_name = "sea_surface_wave_to_direction"
    v[:] = to_dirs
    if variant == "half_circle":
        v[:] = (np.arange(24) * 7.5).astype(np.float32)
    v = nc.createVariable("dpt", "f4", ("time", "station"), fill_value=np.float32(9.96921e36)); v.units = "m"; v.long_name = "depth"; v[:] = np.tile(depths, (steps, 1))
    # direction_before_frequency: the same densities stored efth(time, station, direction, frequency).
    dims = ("time", "station", "direction", "frequency") if variant == "direction_before_frequency" else ("time", "station", "frequency", "direction")
    v = nc.createVariable("efth", "f4", dims, fill_value=np.float32(9.96921e36))
    v.units = {"units_unknown": "m2 s furlong-1", "per_degree": "m2 Hz-1 degree-1"}.get(variant, "m2 s rad-1")
    v.standard_name = "sea_surface_wave_directional_variance_spectral_density"
    if variant == "negative":
        efth[1, 2, 5, 3] = -0.25
    # Per degree: the same spectra divided by 180/pi, which the reader must multiply back.
    if variant == "direction_before_frequency":
        v[:] = efth.transpose(0, 1, 3, 2)
    else:
        v[:] = efth * np.float32(np.pi / 180) if variant == "per_degree" else efth
    nc.close()
with open(path + ".expected.json", "w") as out:
    json.dump(expected, out)
