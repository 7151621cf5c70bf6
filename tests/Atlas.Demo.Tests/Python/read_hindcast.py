"""Reads a demo hindcast file with netCDF4-python and reports what a CF reader sees.

Usage: read_hindcast.py FILE OUTDIR
Writes OUTDIR/<variable>.f32 (raw little-endian float32, fill values kept) for every field and
prints a JSON summary: data model, dimensions, attributes, filters, decoded times, masked counts.
"""
import json
import sys

import netCDF4
import numpy as np

path, out = sys.argv[1], sys.argv[2]
with netCDF4.Dataset(path) as ds:
    summary = {
        "data_model": ds.data_model,
        "dimensions": {name: len(dim) for name, dim in ds.dimensions.items()},
        "global": {name: str(ds.getncattr(name)) for name in ds.ncattrs()},
        "variables": {},
    }
    time = ds["time"]
    dates = netCDF4.num2date(time[:], time.units, time.calendar)
    summary["times"] = [d.strftime("%Y-%m-%dT%H:%M:%SZ") for d in dates]
    for name in ["hs", "te", "tp", "dir", "spread", "depth"]:
        var = ds[name]
        masked = var[:]
        var.set_auto_mask(False)
        raw = np.asarray(var[:], dtype="<f4")
        raw.tofile(f"{out}/{name}.f32")
        summary["variables"][name] = {
            "dimensions": list(var.dimensions),
            "attributes": {a: str(var.getncattr(a)) for a in var.ncattrs()},
            "filters": {k: bool(v) if isinstance(v, bool) else v for k, v in (var.filters() or {}).items() if k in ("zlib", "shuffle", "complevel")},
            "masked": int(np.ma.count_masked(masked)),
            "valid_min": float(masked.min()),
            "valid_max": float(masked.max()),
        }
    for name in ["latitude", "longitude"]:
        var = ds[name]
        summary["variables"][name] = {
            "attributes": {a: str(var.getncattr(a)) for a in var.ncattrs()},
            "values": [float(v) for v in var[:]],
        }
print(json.dumps(summary))
