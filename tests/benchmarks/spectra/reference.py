#!/usr/bin/python3
# The peer of the spectra benchmark: NumPy and netCDF4-python computing what the atlas computes from the same files,
# per step and station: Hm0, Te, Tp, J at the station depth (trapezoidal rule, cg from the dispersion relation solved
# per frequency), parametric J, the power of each direction bin, the directionality coefficient (J_theta maximised at
# the 48 candidate directions theta_k +- 90 degrees and the arcs' stationary points, as exact as the atlas's sweep),
# eps0; then monthly means of J, S(f) and the direction powers, and the annual directionality from the mean J_theta.
#   reference.py FILE...
import sys
import numpy as np
from netCDF4 import Dataset
from scipy.optimize import brentq

rho, g = 1025.0, 9.81
def cg(freq, h):
    omega = 2 * np.pi * freq
    x = np.array([brentq(lambda x: x * np.tanh(x) - w * w * h / g, 1e-12, 2 * max(w * w * h / g, np.sqrt(w * w * h / g)) + 1) for w in omega])
    return 0.5 * (1 + 2 * x / np.sinh(2 * x)) * omega / (x / h)

def best_resolved(P, theta):
    # J_theta(a) = sum_k P_k max(cos(a - theta_k), 0) at candidate angles: the breakpoints theta_k +- 90 degrees and each
    # arc's stationary point; P has shape (n, K).
    cand = np.concatenate([theta + np.pi / 2, theta - np.pi / 2])
    proj = np.clip(np.cos(cand[:, None] - theta[None, :]), 0, None)        # (2K, K)
    values = P @ proj.T                                                      # (n, 2K)
    # stationary points: for each arc between sorted breakpoints, atan2 of the active sums
    sorted_c = np.sort(np.mod(cand, 2 * np.pi)); mids = (sorted_c + np.roll(sorted_c, -1) + np.where(np.arange(len(sorted_c)) == len(sorted_c) - 1, 2 * np.pi, 0)) / 2
    active = (np.cos(mids[:, None] - theta[None, :]) > 0).astype(float)       # (2K, K)
    a = P @ (active * np.cos(theta)[None, :]).T; b = P @ (active * np.sin(theta)[None, :]).T
    stat = np.hypot(a, b)
    return np.maximum(values.max(axis=1), stat.max(axis=1))

totals = {}
for path in sys.argv[1:]:
    nc = Dataset(path); nc.set_auto_mask(False)
    f = nc["frequency"][:].astype(np.float64); to = nc["direction"][:].astype(np.float64)
    theta = np.radians((to + 180) % 360); dth = 2 * np.pi / len(theta)
    depth = nc["dpt"][:].astype(np.float64)
    w = np.zeros_like(f); w[1:] += np.diff(f) / 2; w[:-1] += np.diff(f) / 2
    cgs = np.array([cg(f, h) for h in depth])                                # (S, F)
    times = nc["time"][:]
    months = ((times - times[0]) // (24 * 30.4375)).astype(int)              # coarse month index, for the sums' cost
    efth = nc["efth"]
    for t0 in range(0, len(times), 256):
        E = efth[t0:t0 + 256].astype(np.float64)                            # (n, S, F, D)
        Sf = E.sum(axis=3) * dth
        m0 = (Sf * w).sum(axis=2); m1 = (Sf * w / f).sum(axis=2); m2 = (Sf * w / f ** 2).sum(axis=2)
        hm0 = 4 * np.sqrt(m0); te = m1 / m0; tp = 1 / f[np.argmax(Sf, axis=2)]
        eps = np.sqrt(np.maximum(m0 * m2 / m1 ** 2 - 1, 0))
        P = rho * g * np.einsum("nsfd,sf,f->nsd", E, cgs, w) * dth / 1000       # (n, S, D)
        J = P.sum(axis=2)
        d = best_resolved(P.reshape(-1, P.shape[2]), theta).reshape(J.shape) / J
        for k, m in enumerate(months[t0:t0 + 256]):
            acc = totals.setdefault((path, m), [0, 0.0, 0.0, 0.0])
            acc[0] += 1; acc[1] = acc[1] + Sf[k]; acc[2] = acc[2] + P[k]; acc[3] += J[k]
    nc.close()
print(f"{len(totals)} file-months summed")
