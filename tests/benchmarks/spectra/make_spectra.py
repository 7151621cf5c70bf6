#!/usr/bin/python3
# Writes YEARS files of 3-hourly directional spectra at STATIONS invented output points, one file per year, as spectral
# models write them: efth(time, station, frequency, direction) float32 in m2 s rad-1, 45 geometric frequencies
# (0.03 x 1.08^i Hz), 24 directions of 15 degrees (travelling to), names with cf_role timeseries_id, depth per station.
#   make_spectra.py OUT_DIR STATIONS YEARS [FIRST_YEAR]
# Each step is a JONSWAP spectrum (gamma 3.3) times cosine-2s spreading whose Hs, Tp and direction wander in time.
import os, sys
import numpy as np
from netCDF4 import Dataset

out, stations, years = sys.argv[1], int(sys.argv[2]), int(sys.argv[3])
first = int(sys.argv[4]) if len(sys.argv) > 4 else 2001
os.makedirs(out, exist_ok=True)
freq = (0.03 * 1.08 ** np.arange(45)).astype(np.float32)
to_dirs = (np.arange(24) * 15.0).astype(np.float32)
from_rad = np.radians((to_dirs + 180.0) % 360)
rng = np.random.default_rng(11)
lons = -20.0 + 0.5 * rng.random(stations); lats = 50.0 + 0.4 * rng.random(stations)
depths = (8.0 + 120.0 * rng.random(stations)).astype(np.float32)
f = freq.astype(np.float64)[None, None, :]
for y in range(first, first + years):
    start = np.datetime64(f"{y}-01-01T00:00")
    steps = int((np.datetime64(f"{y + 1}-01-01T00:00") - start) / np.timedelta64(3, "h"))
    hours = (start - np.datetime64("2000-01-01T00:00")) / np.timedelta64(1, "h") + 3.0 * np.arange(steps)
    path = os.path.join(out, f"points-{y}.nc")
    nc = Dataset(path, "w", format="NETCDF4")
    nc.featureType = "timeSeries"; nc.Conventions = "CF-1.8"; nc.title = "Invented output points for the spectra benchmark"
    nc.createDimension("time", None); nc.createDimension("station", stations); nc.createDimension("string16", 16)
    nc.createDimension("frequency", 45); nc.createDimension("direction", 24)
    v = nc.createVariable("time", "f8", ("time",)); v.units = "hours since 2000-01-01 00:00:00"; v.standard_name = "time"; v[:] = hours
    v = nc.createVariable("station_name", "S1", ("station", "string16")); v.cf_role = "timeseries_id"
    v[:] = np.array([list(f"point {s:04d}".ljust(16)) for s in range(stations)], dtype="S1")
    v = nc.createVariable("longitude", "f4", ("station",)); v.standard_name = "longitude"; v.units = "degree_east"; v[:] = lons
    v = nc.createVariable("latitude", "f4", ("station",)); v.standard_name = "latitude"; v.units = "degree_north"; v[:] = lats
    v = nc.createVariable("frequency", "f4", ("frequency",)); v.standard_name = "sea_surface_wave_frequency"; v.units = "s-1"; v[:] = freq
    v = nc.createVariable("direction", "f4", ("direction",)); v.standard_name = "sea_surface_wave_to_direction"; v.units = "degree"; v[:] = to_dirs
    v = nc.createVariable("dpt", "f4", ("station",)); v.units = "m"; v.long_name = "depth"; v[:] = depths
    efth = nc.createVariable("efth", "f4", ("time", "station", "frequency", "direction"), chunksizes=(8, stations, 45, 24))
    efth.units = "m2 s rad-1"; efth.standard_name = "sea_surface_wave_directional_variance_spectral_density"
    block = 256
    for t0 in range(0, steps, block):
        n = min(block, steps - t0)
        t = (t0 + np.arange(n))[:, None]
        s = np.arange(stations)[None, :]
        hs = 1.5 + 1.0 * np.sin(2 * np.pi * t / 2920.0 + s) + 0.5 * np.sin(t / 7.0 + 0.3 * s) ** 2
        tp = 9.0 + 2.5 * np.cos(2 * np.pi * t / 2920.0 + 0.1 * s) + np.sin(t / 11.0)
        mean = np.radians(250.0 + 40.0 * np.sin(t / 30.0 + s))
        fp = (1 / tp)[:, :, None]
        sg = np.where(f <= fp, 0.07, 0.09)
        S1 = (1 - 0.287 * np.log(3.3)) * 5 / 16 * hs[:, :, None] ** 2 * fp ** 4 * f ** -5 * np.exp(-1.25 * (fp / f) ** 4) \
            * 3.3 ** np.exp(-(f - fp) ** 2 / (2 * sg ** 2 * fp ** 2))
        D = np.abs(np.cos((from_rad[None, None, :] - mean[:, :, None]) / 2)) ** 30
        D = D / (D.sum(axis=2, keepdims=True) * np.radians(15.0))
        efth[t0:t0 + n] = (S1[:, :, :, None] * D[:, :, None, :]).astype(np.float32)
    nc.close()
    print(path)
