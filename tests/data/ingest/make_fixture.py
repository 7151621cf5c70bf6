#!/usr/bin/python3
"""Writes a small CF hindcast file with netCDF4-python (a writer the project did not write) for ingest tests.

usage: make_fixture.py OUT.nc START_HOURS STEPS [--format NETCDF4|NETCDF3_CLASSIC|NETCDF3_64BIT_OFFSET]
       [--nx 6] [--ny 5] [--packed] [--no-hs] [--no-te] [--lon0 -20] [--step-hours 3] [--negative-hs]
       [--peak-frequency UNITS] [--dir-units U] [--spread-units U] [--hs-units U] [--hs-offset X] [--backwards]
       [--no-depth] [--depth-name NAME] [--depth-standard-name SN|none] [--depth-units U] [--depth-positive up|down|none]
       [--depth-time] [--negative-depth]
Values are a closed-form function of (step, j, i) so tests can recompute them: see expected() below.
Point (j=0, i=0) is land (fill value in every variable, depth fill).
Conventions real files use, each written the way such files write it (never copied from a product):
  --peak-frequency UNITS  'fp' = 1/Tp in Hz with standard_name sea_surface_wave_peak_frequency instead of 'tp';
                          fp = 0 at step 0 of point (j=1, i=1) (no period: a missing Tp step)
  --dir-units/--spread-units/--hs-units  the units spelling; radians ('rad', 'radian', 'radians') and 'cm' scale the values
  --hs-offset X           adds X m to every Hs (the same time step with different values)
  --backwards             swaps the times of steps 1 and 2 (a time axis that goes backwards)
  --depth-time            depth(time, lat, lon): the static depth plus a tide of -0.5 m at even steps, +0.5 m at odd ones
  --depth-positive up     the depth written as an elevation (negated), with positive = "up"
  --negative-depth        point (j=2, i=3) has a depth of -4 m (after sign handling) although it has waves
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
p.add_argument("--packed", action="store_true"); p.add_argument("--no-hs", action="store_true"); p.add_argument("--no-te", action="store_true")
p.add_argument("--lon0", type=float, default=-20.0); p.add_argument("--step-hours", type=float, default=3.0)
p.add_argument("--negative-hs", action="store_true")
p.add_argument("--peak-frequency", default=None); p.add_argument("--dir-units", default="degree"); p.add_argument("--spread-units", default="degree")
p.add_argument("--hs-units", default="m"); p.add_argument("--hs-offset", type=float, default=0.0); p.add_argument("--backwards", action="store_true")
p.add_argument("--no-depth", action="store_true"); p.add_argument("--depth-name", default="depth")
p.add_argument("--depth-standard-name", default="sea_floor_depth_below_sea_surface"); p.add_argument("--depth-units", default="m")
p.add_argument("--depth-positive", default="none"); p.add_argument("--depth-time", action="store_true"); p.add_argument("--negative-depth", action="store_true")
a = p.parse_args()

def scale(units):
    """Factor from SI (m, s, degree, Hz) to the written units."""
    return {"cm": 100.0, "rad": np.pi / 180, "radian": np.pi / 180, "radians": np.pi / 180}.get(units, 1.0)
ds = netCDF4.Dataset(a.out, "w", format=a.format)
ds.Conventions = "CF-1.8"; ds.title = "ingest test fixture"
ds.createDimension("time", None); ds.createDimension("lat", a.ny); ds.createDimension("lon", a.nx)
t = ds.createVariable("time", "f8", ("time",)); t.units = "hours since 2020-01-01 00:00:00"; t.calendar = "standard"; t.standard_name = "time"
la = ds.createVariable("lat", "f8", ("lat",)); la.units = "degrees_north"; la.standard_name = "latitude"; la[:] = 50.0 + 0.1 * np.arange(a.ny)
lo = ds.createVariable("lon", "f8", ("lon",)); lo.units = "degrees_east"; lo.standard_name = "longitude"; lo[:] = a.lon0 + 0.1 * np.arange(a.nx)
depth = np.full((a.ny, a.nx), 5.0 + 10.0 * np.arange(a.nx)[None, :] + np.zeros((a.ny, 1)), dtype=np.float64)
if a.negative_depth:
    depth[2, 3] = -4.0
sign = -1.0 if a.depth_positive == "up" else 1.0
dep = None
if not a.no_depth:
    dims = ("time", "lat", "lon") if a.depth_time else ("lat", "lon")
    dep = ds.createVariable(a.depth_name, "f4", dims, fill_value=np.float32(-9999))
    dep.units = a.depth_units
    if a.depth_standard_name != "none": dep.standard_name = a.depth_standard_name
    if a.depth_positive != "none": dep.positive = a.depth_positive
    def depth_field(tide):
        m = np.ma.masked_array(sign * (depth + tide) * scale(a.depth_units), mask=np.zeros_like(depth, dtype=bool)); m.mask[0, 0] = True
        return m
    if not a.depth_time:
        dep[:] = depth_field(0.0)
tp_name = ("fp", "sea_surface_wave_peak_frequency", a.peak_frequency) if a.peak_frequency \
    else ("tp", "sea_surface_wave_period_at_variance_spectral_density_maximum", "s")
names = [("hs", "sea_surface_wave_significant_height", a.hs_units),
         ("te", "sea_surface_wave_mean_period_from_variance_spectral_density_inverse_frequency_moment", "s"),
         tp_name,
         ("dir", "sea_surface_wave_from_direction", a.dir_units),
         ("spr", "sea_surface_wave_directional_spread", a.spread_units)]
vars_ = []
for k, (name, std, units) in enumerate(names):
    if (a.no_hs and name == "hs") or (a.no_te and name == "te"):
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
hours = [a.start + s * a.step_hours for s in range(a.steps)]
if a.backwards:
    hours[1], hours[2] = hours[2], hours[1]
for s in range(a.steps):
    hour = hours[s]
    t[s] = hour
    hs, te, tp, d, spread = expected(hour, jj, ii)
    hs = hs + a.hs_offset
    if a.negative_hs and s == 1:
        hs = hs - 100.0
    period = tp
    if a.peak_frequency:
        period = 1.0 / tp
        if s == 0:
            period = np.where((jj == 1) & (ii == 1), 0.0, period)
    if dep is not None and a.depth_time:
        dep[s, :, :] = depth_field(-0.5 if s % 2 == 0 else 0.5)
    fields = (hs * scale(a.hs_units), te, period, d * scale(a.dir_units), (spread + 0 * jj) * scale(a.spread_units))
    for v, field in zip(vars_, fields):
        if v is None: continue
        m = np.ma.masked_array(np.asarray(field, dtype=np.float64), mask=np.zeros((a.ny, a.nx), dtype=bool)); m.mask[0, 0] = True
        v[s, :, :] = m
ds.close()
