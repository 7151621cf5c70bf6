#!/usr/bin/python3
"""Writes a small deep-water hindcast (Hs, Te; no depth) with netCDF4-python for comparing the atlas statistics
with CDO. Values are rounded to the atlas storage steps (Hs 1 mm, Te 0.01 s) so that the stored series equal the
file's float32 values exactly and both tools average the same numbers.

usage: make_cdo_fixture.py OUT.nc NX NY YEARS
"""
import sys, numpy as np, netCDF4
out, nx, ny, years = sys.argv[1], int(sys.argv[2]), int(sys.argv[3]), int(sys.argv[4])
steps = int(round(years * 365.25 * 8))  # 3-hourly
rng = np.random.default_rng(11)
ds = netCDF4.Dataset(out, "w", format="NETCDF4")
ds.createDimension("time", None); ds.createDimension("lat", ny); ds.createDimension("lon", nx)
t = ds.createVariable("time", "f8", ("time",)); t.units = "hours since 2019-01-01 00:00:00"; t.calendar = "standard"; t.standard_name = "time"
la = ds.createVariable("lat", "f4", ("lat",)); la[:] = np.linspace(49.5, 50.0, ny); la.units = "degrees_north"; la.standard_name = "latitude"
lo = ds.createVariable("lon", "f4", ("lon",)); lo[:] = np.linspace(-27, -26, nx); lo.units = "degrees_east"; lo.standard_name = "longitude"
hs = ds.createVariable("hs", "f4", ("time", "lat", "lon"), fill_value=np.float32(-999.0)); hs.units = "m"; hs.standard_name = "sea_surface_wave_significant_height"
te = ds.createVariable("te", "f4", ("time", "lat", "lon"), fill_value=np.float32(-999.0)); te.units = "s"
te.standard_name = "sea_surface_wave_mean_period_from_variance_spectral_density_inverse_frequency_moment"
base = rng.random((ny, nx))
hours = np.arange(steps) * 3.0
t[:] = hours
season = 2.5 + 1.3 * np.cos(2 * np.pi * hours / 8766.0)
storm = 1.0 + 0.4 * np.sin(hours / 41.0) + 0.2 * rng.standard_normal(steps)
h = np.clip(season[:, None, None] * storm[:, None, None] * (0.6 + 0.8 * base)[None], 0.05, None)
h = np.round(h, 3).astype(np.float32)
p = np.round(5.0 + 1.7 * np.sqrt(h) + 0.3 * rng.random(h.shape), 2).astype(np.float32)
# A gap: one cell missing for ten days, to exercise the missing-value handling of both tools.
h[200:280, 1, 1] = -999.0
p[200:280, 1, 1] = -999.0
hs[:] = np.ma.masked_equal(h, -999.0)
te[:] = np.ma.masked_equal(p, -999.0)
ds.close()
