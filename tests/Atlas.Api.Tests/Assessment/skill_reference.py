"""NumPy reference for the validation skill of matched pairs (trade definitions, tests/data/README.md):
bias = mean(model - observed); RMSE; scatter index = RMSE / mean(observed); Pearson r (numpy.corrcoef);
symmetric slope = sqrt(sum(model^2) / sum(observed^2)).

usage: skill_reference.py PAIRS.csv  (the pairs endpoint's CSV: the header time,observed,modelled, then the pairs)
prints one JSON object.
"""
import json
import sys
import numpy as np

with open(sys.argv[1], encoding="utf-8") as f:
    lines = [line for line in f if not line.startswith("#")]
assert lines[0].strip() == "time,observed,modelled", lines[0]
values = np.array([[float(x) for x in line.strip().split(",")[1:]] for line in lines[1:] if line.strip()], dtype="f8")
observed, modelled = values[:, 0], values[:, 1]
error = modelled - observed
rmse = float(np.sqrt(np.mean(error ** 2)))
print(json.dumps({
    "n": int(observed.size),
    "bias": float(np.mean(error)),
    "rmse": rmse,
    "scatter_index": rmse / float(np.mean(observed)),
    "pearson_r": float(np.corrcoef(observed, modelled)[0, 1]),
    "symmetric_slope": float(np.sqrt(np.sum(modelled ** 2) / np.sum(observed ** 2))),
}))
