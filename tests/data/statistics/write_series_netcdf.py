#!/usr/bin/python3
"""Writes one point's series as a CF-NetCDF file with netCDF4-python, for checking the atlas statistics with CDO.

usage: write_series_netcdf.py DIR OUT.nc
DIR holds times.i64 (Unix seconds UTC), hs.f32 and te.f32 as raw little-endian arrays (NaN = missing). The file has
one 1 x 1 lat/lon cell, time in hours since 1970-01-01 (standard calendar), and -999 as the fill value.
"""
import os, sys
import numpy as np, netCDF4
d, out = sys.argv[1], sys.argv[2]
times = np.fromfile(os.path.join(d, "times.i64"), dtype="<i8")
ds = netCDF4.Dataset(out, "w", format="NETCDF4")
ds.createDimension("time", None); ds.createDimension("lat", 1); ds.createDimension("lon", 1)
t = ds.createVariable("time", "f8", ("time",)); t.units = "hours since 1970-01-01 00:00:00"; t.calendar = "standard"; t.standard_name = "time"
t[:] = times / 3600.0
la = ds.createVariable("lat", "f4", ("lat",)); la[:] = [50.0]; la.units = "degrees_north"; la.standard_name = "latitude"
lo = ds.createVariable("lon", "f4", ("lon",)); lo[:] = [-26.5]; lo.units = "degrees_east"; lo.standard_name = "longitude"
for name, standard in (("hs", "sea_surface_wave_significant_height"),
                       ("te", "sea_surface_wave_mean_period_from_variance_spectral_density_inverse_frequency_moment")):
    v = ds.createVariable(name, "f4", ("time", "lat", "lon"), fill_value=np.float32(-999.0))
    v.units = "m" if name == "hs" else "s"; v.standard_name = standard
    values = np.fromfile(os.path.join(d, f"{name}.f32"), dtype="<f4")
    v[:] = np.ma.masked_invalid(values)[:, None, None]
ds.close()
