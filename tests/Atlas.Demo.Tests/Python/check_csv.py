"""Reads the demo's CSV outputs with Python's csv module and NumPy and prints a JSON summary.

Usage: check_csv.py buoy FILE | matrix FILE | stations FILE
"""
import csv
import json
import sys
from datetime import datetime, timezone

import numpy as np

kind, path = sys.argv[1], sys.argv[2]
if kind == "buoy":
    with open(path, newline="") as f:
        reader = csv.DictReader(f)
        rows = list(reader)
        header = reader.fieldnames
    times = [datetime.strptime(r["time"], "%Y-%m-%dT%H:%M:%SZ").replace(tzinfo=timezone.utc) for r in rows]
    steps = np.diff([t.timestamp() for t in times]) / 3600.0
    qc = np.array([int(r["qc"]) for r in rows])
    good = [r for r in rows if r["qc"] == "0"]
    hs = np.array([float(r["hs_m"]) for r in good])
    te = np.array([float(r["te_s"]) for r in good])
    tp = np.array([float(r["tp_s"]) for r in good])
    direction = np.array([float(r["dir_deg"]) for r in good])
    print(json.dumps({
        "header": header,
        "rows": len(rows),
        "first": rows[0]["time"],
        "last": rows[-1]["time"],
        "min_step_h": float(steps.min()),
        "gaps": int(np.sum(steps > steps.min() * 1.5)),
        "qc_counts": {str(k): int(v) for k, v in zip(*np.unique(qc, return_counts=True))},
        "flagged_empty": sum(1 for r in rows if r["qc"] != "0" and r["hs_m"] == ""),
        "good_empty": sum(1 for r in good if "" in (r["hs_m"], r["tp_s"], r["te_s"], r["dir_deg"])),
        "hs_mean": float(hs.mean()),
        "hs_max": float(hs.max()),
        "te_over_tp_median": float(np.median(te / tp)),
        "dir_min": float(direction.min()),
        "dir_max": float(direction.max()),
    }))
elif kind == "matrix":
    with open(path, newline="") as f:
        first = next(csv.reader(f))
    body = np.loadtxt(path, delimiter=",", skiprows=1)
    print(json.dumps({
        "corner": first[0],
        "te": [float(v) for v in first[1:]],
        "hs": body[:, 0].tolist(),
        "power": body[:, 1:].tolist(),
    }))
elif kind == "stations":
    with open(path, newline="") as f:
        print(json.dumps(list(csv.DictReader(f))))
else:
    sys.exit(f"unknown kind {kind}")
