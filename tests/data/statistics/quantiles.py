#!/usr/bin/python3
"""numpy.quantile under each of the nine Hyndman-Fan definitions, for tests/Atlas.Statistics.Tests.

Usage: /usr/bin/python3 quantiles.py DIR
DIR holds sample_*.f64 (raw little-endian float64 samples) and probabilities.f64. Prints
{"sample_0": {"1": [...], ..., "9": [...]}, ...}: the quantile at each probability for Hyndman-Fan type 1..9.
"""
import glob, json, os, sys
import numpy as np
d = sys.argv[1]
probabilities = np.fromfile(os.path.join(d, "probabilities.f64"), "<f8")
methods = ["inverted_cdf", "averaged_inverted_cdf", "closest_observation", "interpolated_inverted_cdf", "hazen",
           "weibull", "linear", "median_unbiased", "normal_unbiased"]
result = {}
for path in sorted(glob.glob(os.path.join(d, "sample_*.f64"))):
    values = np.fromfile(path, "<f8")
    result[os.path.basename(path)[:-4]] = {str(i + 1): [float(np.quantile(values, p, method=m)) for p in probabilities]
                                           for i, m in enumerate(methods)}
json.dump(result, sys.stdout)
