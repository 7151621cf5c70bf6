#!/usr/bin/python3
# Writes the reference tables of tests/Atlas.WavePhysics.Tests with SciPy, independently of the project's code.
# Run from this folder with Debian's interpreter:  /usr/bin/python3 make_references.py
import numpy as np
from scipy.optimize import brentq
from scipy.integrate import quad
from scipy.special import gammaln

def relative_depth(y):
    """k h solving x tanh x = y (y = k0 h = 2 pi h / L0), by Brent's method."""
    return brentq(lambda x: x * np.tanh(x) - y, 1e-12, 2 * max(y, np.sqrt(y)) + 1, xtol=1e-15, rtol=1e-15, maxiter=500)

# Linear dispersion: h/L0 -> h/L, tanh kh, n = cg/c, and cg/cg0 = 2 n tanh kh.
with open("dispersion_brentq.csv", "w") as out:
    out.write("h_over_L0,h_over_L,tanh_kh,n,cg_over_cg0\n")
    ratios = sorted(set(np.round(np.concatenate([np.logspace(-4, np.log10(3.0), 41), [0.01, 0.05, 0.1, 0.2, 0.5]]), 12)))
    for r in ratios:
        x = relative_depth(2 * np.pi * r)
        n = 0.5 * (1 + 2 * x / np.sinh(2 * x))
        out.write(f"{r!r},{x / (2 * np.pi)!r},{np.tanh(x)!r},{n!r},{2 * n * np.tanh(x)!r}\n")

# Directionality coefficient of the cosine-2s spreading model D = C(s) cos^(2s)(phi/2), s = 2/sigma^2 - 1:
# d = integral_{-pi/2}^{pi/2} D(phi) cos(phi) dphi, by adaptive quadrature.
with open("directionality_quad.csv", "w") as out:
    out.write("spread_deg,s,d\n")
    for spread in [1.0, 5.0, 10.0, 15.0, 20.0, 25.0, 30.0, 35.0, 40.0, 45.0, 50.0, 60.0, 70.0, 75.0, 80.0, 81.0]:
        sigma = np.radians(spread)
        s = 2 / sigma ** 2 - 1
        c = np.exp(gammaln(s + 1) - gammaln(s + 0.5)) / (2 * np.sqrt(np.pi))
        d, _ = quad(lambda p: c * np.cos(p / 2) ** (2 * s) * np.cos(p), -np.pi / 2, np.pi / 2, epsabs=1e-14, epsrel=1e-13, limit=200)
        out.write(f"{spread!r},{s!r},{d!r}\n")

# Parameters of a JONSWAP spectrum (Hs 2 m, Tp 10 s, gamma 3.3; the DNV-RP-C205 form) sampled every 0.001 Hz
# from 0.02 to 1 Hz, integrated with numpy's trapezoidal rule; power at 20 m depth with cg from brentq roots,
# and in deep water. Definitions of IEC TS 62600-101.
rho, g = 1025.0, 9.81
f = np.arange(20, 1001) / 1000.0  # 0.020, 0.021, ..., 1.000 Hz: the test builds (20 + i) / 1000.0
fp, hs, gamma = 0.1, 2.0, 3.3
sigma = np.where(f <= fp, 0.07, 0.09)
S = (1 - 0.287 * np.log(gamma)) * 5 / 16 * hs ** 2 * fp ** 4 * f ** -5 * np.exp(-1.25 * (fp / f) ** 4) * gamma ** np.exp(-(f - fp) ** 2 / (2 * sigma ** 2 * fp ** 2))
def cg(freq, depth):
    omega = 2 * np.pi * freq
    if np.isinf(depth):
        return g / (2 * omega)
    x = relative_depth(omega ** 2 * depth / g)
    k = x / depth
    return 0.5 * (1 + 2 * x / np.sinh(2 * x)) * omega / k
m = {n: np.trapz(S * f ** n, f) for n in (-2, -1, 0, 1, 2)}
with open("jonswap_parameters.csv", "w") as out:
    out.write("quantity,value\n")
    out.write(f"m0,{m[0]!r}\nm_minus1,{m[-1]!r}\nm1,{m[1]!r}\nm2,{m[2]!r}\n")
    out.write(f"hm0,{4 * np.sqrt(m[0])!r}\nte,{m[-1] / m[0]!r}\ntm01,{m[0] / m[1]!r}\ntm02,{np.sqrt(m[0] / m[2])!r}\n")
    out.write(f"tp,{1 / f[np.argmax(S)]!r}\neps0,{np.sqrt(m[0] * m[-2] / m[-1] ** 2 - 1)!r}\n")
    for depth in (20.0, np.inf):
        j = rho * g * np.trapz(np.array([cg(fi, depth) for fi in f]) * S, f) / 1000
        out.write(f"power_kw_per_m_depth_{'deep' if np.isinf(depth) else int(depth)},{j!r}\n")
