#!/usr/bin/python3
"""Circular statistics of directions in degrees with SciPy/NumPy, for tests/Atlas.Statistics.Tests.

Usage: /usr/bin/python3 circular.py DIR   (DIR/directions.f64, DIR/weights.f64: raw little-endian float64)
Prints scipy.stats.circmean and circstd (high=360) of the directions, and the weighted mean direction and mean
resultant length computed with numpy from sum(w cos), sum(w sin).
"""
import json, os, sys
import numpy as np
from scipy.stats import circmean, circstd
d = sys.argv[1]
a = np.fromfile(os.path.join(d, "directions.f64"), "<f8")
w = np.fromfile(os.path.join(d, "weights.f64"), "<f8")
c, s = np.sum(w * np.cos(np.radians(a))), np.sum(w * np.sin(np.radians(a)))
json.dump({"circmean": float(circmean(a, high=360, low=0)), "circstd": float(circstd(a, high=360, low=0)),
           "weightedMean": float(np.degrees(np.arctan2(s, c)) % 360), "weightedR": float(np.hypot(c, s) / np.sum(w))}, sys.stdout)
