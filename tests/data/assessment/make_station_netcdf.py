"""Writes invented CF point time series (featureType timeSeries) of one buoy with netCDF4-python, for the station
reader tests. No real station: the values follow the closed forms in StationNetCdfTests.Expected.

usage: make_station_netcdf.py PATH CASE
CASE: good (packed int16 Hs with a fill value, float Tp/Te, a 'to' direction in radians, a qc flag variable with
flag_meanings, scalar lat/lon, NETCDF4), classic (the same in NETCDF3_CLASSIC with a (station, time) layout),
negative_hs, duplicate_time, two_stations, not_timeseries, no_hs.
"""
import sys
import numpy as np
from netCDF4 import Dataset

path, case = sys.argv[1], sys.argv[2]
n = 48
hours = np.arange(n, dtype="f8")
hs = 1.0 + 0.01 * hours
tp = 8.0 + 0.05 * hours
te = 0.9 * tp
to_deg = (80.0 + 2.0 * hours) % 360.0          # the direction waves travel to; from = to + 180
qc = np.zeros(n, dtype="i1")
qc[[5, 17]] = 3                                 # 'bad' rows
hs_fill = [30]                                  # a dropout on a good row: Hs missing, row kept
if case == "negative_hs":
    hs[12] = -0.25
if case == "duplicate_time":
    hours[20] = hours[19]

fmt = "NETCDF3_CLASSIC" if case == "classic" else "NETCDF4"
with Dataset(path, "w", format=fmt) as ds:
    ds.Conventions = "CF-1.8"
    ds.featureType = "point" if case == "not_timeseries" else "timeSeries"
    ds.title = "invented test buoy for the atlas station reader"
    stations = 2 if case == "two_stations" else 1
    layout_2d = case in ("classic", "two_stations")
    ds.createDimension("time", n)
    if layout_2d:
        ds.createDimension("station", stations)
    t = ds.createVariable("time", "f8", ("time",))
    t.standard_name = "time"
    t.units = "hours since 2022-06-01 00:00:00"
    t.calendar = "standard"
    t[:] = hours
    dims = ("station", "time") if layout_2d else ("time",)
    lat = ds.createVariable("lat", "f8", ("station",) if layout_2d else ())
    lat.standard_name = "latitude"
    lat.units = "degrees_north"
    lon = ds.createVariable("lon", "f8", ("station",) if layout_2d else ())
    lon.standard_name = "longitude"
    lon.units = "degrees_east"
    if layout_2d:
        lat[:] = [51.25] * stations
        lon[:] = [334.5] * stations             # 0..360 longitudes: -25.5
    else:
        lat.assignValue(51.25)
        lon.assignValue(334.5)

    def series(values):
        return np.tile(values, (stations, 1)) if layout_2d else values

    if case != "no_hs":
        h = ds.createVariable("VHM0", "i2", dims, fill_value=np.int16(-32767))
        h.standard_name = "sea_surface_wave_significant_height"
        h.units = "cm"
        h.scale_factor = 0.1
        h.add_offset = 0.0
        h.ancillary_variables = "VHM0_QC"
        h.set_auto_maskandscale(True)
        masked = np.ma.masked_array(hs * 100.0, mask=np.isin(np.arange(n), hs_fill))
        h[:] = series(masked)
        q = ds.createVariable("VHM0_QC", "i1", dims)
        q.long_name = "quality flag of VHM0"
        q.flag_values = np.array([1, 2, 3], dtype="i1")
        q.flag_meanings = "good_data probably_good bad_data"
        q[:] = series(np.where(qc == 0, 1, qc).astype("i1"))
    p = ds.createVariable("VTPK", "f4", dims)
    p.standard_name = "sea_surface_wave_period_at_variance_spectral_density_maximum"
    p.units = "s"
    p[:] = series(tp)
    e = ds.createVariable("VTM10", "f4", dims)
    e.standard_name = "sea_surface_wave_mean_period_from_variance_spectral_density_inverse_frequency_moment"
    e.units = "s"
    e[:] = series(te)
    d = ds.createVariable("VMDR_TO", "f4", dims)
    d.standard_name = "sea_surface_wave_to_direction"
    d.units = "rad"
    d[:] = series(np.deg2rad(to_deg))
