#!/usr/bin/python3
"""Writes a NetCDF-4 hindcast fixture with netCDF4-python (a writer independent of the project):
zlib-compressed, shuffled, chunked variables; Hs packed into int16 by netCDF4-python's own auto-scaling
(scale_factor/add_offset, _FillValue for masked values); Te float32, Tp float64, direction float32 and a 2-D
depth with land. Longitudes are in 0..360, latitudes north to south. The values before packing are written
to SOURCE.json so the test can check the decoded Hs against them as well as against netCDF4-python's reading.

Usage: make_compressed.py OUT.nc SOURCE.json
"""
import json
import sys

import netCDF4
import numpy as np

out, source_path = sys.argv[1], sys.argv[2]
nt, ny, nx = 48, 20, 30
rng = np.random.default_rng(7)

ds = netCDF4.Dataset(out, "w", format="NETCDF4")
ds.Conventions = "CF-1.8"
ds.title = "invented compressed test hindcast"
ds.createDimension("time", None)
ds.createDimension("lat", ny)
ds.createDimension("lon", nx)
t = ds.createVariable("time", "f8", ("time",))
t.units = "hours since 2003-07-01 00:00:00"
t.calendar = "gregorian"
t[:] = np.arange(nt, dtype="f8")
lat = ds.createVariable("lat", "f4", ("lat",))
lat.units = "degrees_north"
lat[:] = np.linspace(58.0, 56.1, ny)
lon = ds.createVariable("lon", "f4", ("lon",))
lon.units = "degrees_east"
lon[:] = 340.0 + 0.5 * np.arange(nx)

jj, ii = np.meshgrid(np.arange(ny), np.arange(nx), indexing="ij")
land = (ii < 4) & (jj < 6)
depth = np.ma.masked_array(5.0 + 3.0 * ii + 2.0 * jj, mask=land).astype("f4")

kw = dict(zlib=True, complevel=4, shuffle=True, chunksizes=(6, 10, 15))
hs = ds.createVariable("hs", "i2", ("time", "lat", "lon"), fill_value=np.int16(-32767), **kw)
hs.standard_name = "sea_surface_wave_significant_height"
hs.units = "m"
hs.scale_factor = np.float32(0.0005)
hs.add_offset = np.float32(8.0)
te = ds.createVariable("te", "f4", ("time", "lat", "lon"), fill_value=np.float32(-1.0e10), **kw)
te.standard_name = "sea_surface_wave_mean_period_from_variance_spectral_density_inverse_frequency_moment"
te.units = "s"
tp = ds.createVariable("tp", "f8", ("time", "lat", "lon"), fill_value=-9999.0, **kw)
tp.standard_name = "sea_surface_wave_period_at_variance_spectral_density_maximum"
tp.units = "s"
wd = ds.createVariable("mwd", "f4", ("time", "lat", "lon"), fill_value=np.float32(-999.0), **kw)
wd.standard_name = "sea_surface_wave_from_direction"
wd.units = "degree"
dp = ds.createVariable("depth", "f4", ("lat", "lon"), fill_value=np.float32(-999.0), zlib=True, complevel=4)
dp.standard_name = "sea_floor_depth_below_sea_surface"
dp.units = "m"
dp[:] = depth

source = np.empty((nt, ny, nx), dtype="f8")
for k in range(nt):
    h = 0.3 + 4.0 * rng.random((ny, nx)) + 0.02 * k
    source[k] = h
mask = np.broadcast_to(land, source.shape) | (rng.random(source.shape) < 0.01)
hs_values = np.ma.masked_array(source, mask=mask)
hs[:] = hs_values
te_values = np.ma.masked_array((5.0 + 1.5 * np.sqrt(source)).astype("f4"), mask=mask)
te[:] = te_values
tp[:] = np.ma.masked_array(1.15 * te_values.astype("f8") + 0.3, mask=mask)
wd[:] = np.ma.masked_array((rng.random(source.shape) * 360.0).astype("f4"), mask=mask)
ds.close()

with open(source_path, "w") as f:
    json.dump({"hs": [None if m else float(v) for v, m in zip(source.ravel(), mask.ravel())]}, f)
