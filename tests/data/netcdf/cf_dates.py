#!/usr/bin/python3
"""Decodes CF time values with cftime (netCDF4-python's date library) for the CfTime tests.
Reads a JSON list of [units, calendar, [values...]] on stdin and prints a JSON list with, per case,
{"dates": ISO 8601 dates in the case's own calendar, "proleptic": the same instants as proleptic Gregorian
dates (real calendars only, via cftime's change_calendar), or null} or {"error": text}.
"""
import json
import sys

import cftime

REAL = {"standard", "gregorian", "proleptic_gregorian", "julian"}
out = []
for units, calendar, values in json.load(sys.stdin):
    try:
        dates = cftime.num2date(values, units, calendar, only_use_cftime_datetimes=True)
        proleptic = [d.change_calendar("proleptic_gregorian").isoformat() for d in dates] if calendar in REAL else None
        out.append({"dates": [d.isoformat() for d in dates], "proleptic": proleptic})
    except Exception as e:
        out.append({"error": str(e)})
json.dump(out, sys.stdout)
