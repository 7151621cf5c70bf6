#!/usr/bin/python3
"""Reads netCDF files with netCDF4-python (auto mask and scale on) and prints, as one JSON object keyed by
path: the data model, dimensions, every variable's dimensions, attributes and values (masked values as
null), and the time axis decoded by cftime (ISO 8601) where a 'time' variable exists.

Usage: read_back.py FILE...
"""
import json
import sys

import netCDF4
import numpy as np


def plain(value):
    if isinstance(value, (np.ndarray, list, tuple)):
        return [plain(v) for v in np.asarray(value).tolist()]
    if isinstance(value, (np.floating, float)):
        return None if np.isnan(value) else float(value)
    if isinstance(value, (np.integer, int)):
        return int(value)
    return str(value)


result = {}
for path in sys.argv[1:]:
    ds = netCDF4.Dataset(path)
    entry = {"data_model": ds.data_model, "dimensions": {n: len(d) for n, d in ds.dimensions.items()},
             "attributes": {a: plain(ds.getncattr(a)) for a in ds.ncattrs()}, "variables": {}}
    for name, var in ds.variables.items():
        data = var[:]
        flat = np.ma.asarray(data).astype("f8").filled(np.nan).ravel() if var.dtype.kind in "iuf" else np.array([])
        entry["variables"][name] = {
            "dimensions": list(var.dimensions),
            "dtype": str(var.dtype),
            "attributes": {a: plain(var.getncattr(a)) for a in var.ncattrs()},
            "values": [None if np.isnan(v) else float(v) for v in flat],
        }
    if "time" in ds.variables:
        t = ds.variables["time"]
        try:
            dates = netCDF4.num2date(t[:], t.units, getattr(t, "calendar", "standard"), only_use_cftime_datetimes=True)
            entry["times"] = [d.isoformat() for d in np.ravel(dates)]
        except Exception as e:  # the test decides whether the file should have decoded
            entry["times_error"] = str(e)
    ds.close()
    result[path] = entry
json.dump(result, sys.stdout)
