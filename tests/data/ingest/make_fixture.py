#!/usr/bin/python3
"""Writes a small CF hindcast file with netCDF4-python (a writer the project did not write) for ingest tests.

usage: make_fixture.py OUT.nc START_HOURS STEPS [--format NETCDF4|NETCDF3_CLASSIC|NETCDF3_64BIT_OFFSET]
       [--nx 6] [--ny 5] [--packed] [--no-hs] [--lon0 -20] [--step-hours 3] [--negative-hs]
Values are a closed-form function of (step, j, i) so tests can recompute them: see expected() below.
Point (j=0, i=0) is land (fill value in every variable, depth fill).
"""
import argparse, numpy as np, netCDF4

def expected(hour, j, i):
    hs = 1.0 + 0.5 * j + 0.25 * i + 0.001 * (hour % 97)
    te = 6.0 + 0.1 * i + 0.01 * (hour % 13)
    tp = te / 0.9
    d = (200.0 + 10 * j + hour * 0.5) % 360.0
    spread = 20.0 + i
    return hs, te, tp, d, spread

p = argparse.ArgumentParser()
p.add_argument("out"); p.add_argument("start", type=float); p.add_argument("steps", type=int)
p.add_argument("--format", default="NETCDF4"); p.add_argument("--nx", type=int, default=6); p.add_argument("--ny", type=int, default=5)
p.add_argument("--packed", action="store_true"); p.add_argument("--no-hs", action="store_true")
p.add_argument("--lon0", type=float, default=-20.0); p.add_argument("--step-hours", type=float, default=3.0)
p.add_argument("--negative-hs", action="store_true")
a = p.parse_args()
ds = netCDF4.Dataset(a.out, "w", format=a.format)
ds.Conventions = "CF-1.8"; ds.title = "ingest test fixture"
ds.createDimension("time", None); ds.createDimension("lat", a.ny); ds.createDimension("lon", a.nx)
t = ds.createVariable("time", "f8", ("time",)); t.units = "hours since 2020-01-01 00:00:00"; t.calendar = "standard"; t.standard_name = "time"
la = ds.createVariable("lat", "f8", ("lat",)); la.units = "degrees_north"; la.standard_name = "latitude"; la[:] = 50.0 + 0.1 * np.arange(a.ny)
lo = ds.createVariable("lon", "f8", ("lon",)); lo.units = "degrees_east"; lo.standard_name = "longitude"; lo[:] = a.lon0 + 0.1 * np.arange(a.nx)
dep = ds.createVariable("depth", "f4", ("lat", "lon"), fill_value=np.float32(-9999)); dep.units = "m"; dep.standard_name = "sea_floor_depth_below_sea_surface"
depth = np.full((a.ny, a.nx), 5.0 + 10.0 * np.arange(a.nx)[None, :] + np.zeros((a.ny, 1)), dtype=np.float32)
depth = np.ma.masked_array(depth, mask=np.zeros_like(depth, dtype=bool)); depth.mask[0, 0] = True
dep[:] = depth
names = [("hs", "sea_surface_wave_significant_height", "m"),
         ("te", "sea_surface_wave_mean_period_from_variance_spectral_density_inverse_frequency_moment", "s"),
         ("tp", "sea_surface_wave_period_at_variance_spectral_density_maximum", "s"),
         ("dir", "sea_surface_wave_from_direction", "degree"),
         ("spr", "sea_surface_wave_directional_spread", "degree")]
vars_ = []
for k, (name, std, units) in enumerate(names):
    if a.no_hs and name == "hs":
        vars_.append(None); continue
    if a.packed:
        v = ds.createVariable(name, "i2", ("time", "lat", "lon"), fill_value=np.int16(-32767))
        v.scale_factor = 0.001 if name == "hs" else 0.01
        v.add_offset = 180.0 if name == "dir" else 0.0
    else:
        v = ds.createVariable(name, "f4", ("time", "lat", "lon"), fill_value=np.float32(-999.0))
    v.standard_name = std; v.units = units
    vars_.append(v)
jj, ii = np.meshgrid(np.arange(a.ny), np.arange(a.nx), indexing="ij")
for s in range(a.steps):
    hour = a.start + s * a.step_hours
    t[s] = hour
    hs, te, tp, d, spread = expected(hour, jj, ii)
    if a.negative_hs and s == 1:
        hs = hs - 100.0
    for v, field in zip(vars_, (hs, te, tp, d, spread + 0 * jj)):
        if v is None: continue
        m = np.ma.masked_array(np.asarray(field, dtype=np.float64), mask=np.zeros((a.ny, a.nx), dtype=bool)); m.mask[0, 0] = True
        v[s, :, :] = m
ds.close()
