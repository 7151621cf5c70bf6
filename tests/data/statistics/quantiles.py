#!/usr/bin/python3
"""numpy.quantile under each of the nine Hyndman-Fan definitions, for tests/Atlas.Statistics.Tests.

Usage: /usr/bin/python3 quantiles.py DIR   (DIR/values.f64: raw little-endian float64; DIR/probabilities.f64)
Prints {"1": [...], ..., "9": [...]} with the quantile at each probability for Hyndman-Fan type 1..9.
"""
import json, os, sys
import numpy as np
d = sys.argv[1]
values = np.fromfile(os.path.join(d, "values.f64"), "<f8")
probabilities = np.fromfile(os.path.join(d, "probabilities.f64"), "<f8")
methods = ["inverted_cdf", "averaged_inverted_cdf", "closest_observation", "interpolated_inverted_cdf", "hazen",
           "weibull", "linear", "median_unbiased", "normal_unbiased"]
json.dump({str(i + 1): [float(np.quantile(values, p, method=m)) for p in probabilities] for i, m in enumerate(methods)}, sys.stdout)
