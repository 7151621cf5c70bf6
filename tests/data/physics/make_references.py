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

# A directional spectrum written the way spectral wave models write output points: 32 frequencies on a geometric
# grid f_i = 0.035 * 1.1^i Hz and 24 direction bins of 15 degrees (centres 7.5, 22.5, ..., 352.5, waves coming from).
# JONSWAP (Hs 2.5 m, Tp 11 s, gamma 3.3, DNV-RP-C205 form) times cosine-2s spreading (spread 30 deg) about 250 deg,
# the spreading normalised over the discrete bins. Integrated with numpy.trapz over frequency and bin sums over
# direction; cg from brentq roots. The directionally resolved power J_theta(theta) = sum_j P_j max(cos(theta - theta_j), 0)
# is maximised on a 0.001-degree grid and then by scipy.optimize.minimize_scalar around the best grid point.
from scipy.optimize import minimize_scalar
fgeo = 0.035 * 1.1 ** np.arange(32)
dirs = 7.5 + 15.0 * np.arange(24)
dtheta = np.radians(15.0)
def jonswap(freq, hs_, tp_, gamma_):
    fp_ = 1 / tp_
    sg = np.where(freq <= fp_, 0.07, 0.09)
    return (1 - 0.287 * np.log(gamma_)) * 5 / 16 * hs_ ** 2 * fp_ ** 4 * freq ** -5 * np.exp(-1.25 * (fp_ / freq) ** 4) * gamma_ ** np.exp(-(freq - fp_) ** 2 / (2 * sg ** 2 * fp_ ** 2))
spread_sigma = np.radians(30.0)
s_exp = 2 / spread_sigma ** 2 - 1
D = np.abs(np.cos(np.radians(dirs - 250.0) / 2)) ** (2 * s_exp)
D = D / (D.sum() * dtheta)
S1 = jonswap(fgeo, 2.5, 11.0, 3.3)
S2 = S1[:, None] * D[None, :]  # m2 s rad-1, frequency-major
np.savetxt("directional_spectrum_density.csv", S2, delimiter=",", fmt="%.17g")
with open("directional_spectrum_parameters.csv", "w") as out:
    out.write("quantity,value\n")
    Sf = S2.sum(axis=1) * dtheta
    mm = {n: np.trapz(Sf * fgeo ** n, fgeo) for n in (-2, -1, 0)}
    hm0 = 4 * np.sqrt(mm[0]); te = mm[-1] / mm[0]
    out.write(f"hm0,{hm0!r}\nte,{te!r}\ntp,{1 / fgeo[np.argmax(Sf)]!r}\neps0,{np.sqrt(mm[0] * mm[-2] / mm[-1] ** 2 - 1)!r}\n")
    E = np.array([np.trapz(S2[:, j], fgeo) for j in range(24)]) * dtheta
    a1 = (E * np.cos(np.radians(dirs))).sum(); b1 = (E * np.sin(np.radians(dirs))).sum()
    r1 = np.hypot(a1, b1) / E.sum()
    out.write(f"mean_dir_from,{np.degrees(np.arctan2(b1, a1)) % 360!r}\nspread_deg,{np.degrees(np.sqrt(2 * (1 - r1)))!r}\n")
    for depth in (15.0, np.inf):
        c = np.array([cg(fi, depth) for fi in fgeo])
        P = np.array([rho * g * np.trapz(c * S2[:, j], fgeo) * dtheta / 1000 for j in range(24)])
        J = P.sum()
        def resolved(theta):
            return (P * np.clip(np.cos(np.radians(theta - dirs)), 0, None)).sum()
        grid = np.arange(0, 360, 0.001)
        values = (P[None, :] * np.clip(np.cos(np.radians(grid[:, None] - dirs[None, :])), 0, None)).sum(axis=1)
        best = grid[np.argmax(values)]
        refined = minimize_scalar(lambda t: -resolved(t), bounds=(best - 0.2, best + 0.2), method="bounded", options={"xatol": 1e-10})
        name = "deep" if np.isinf(depth) else str(int(depth))
        cg_te = cg(1 / te, depth)
        out.write(f"power_{name},{J!r}\nparametric_power_{name},{rho * g * hm0 ** 2 / 16 * cg_te / 1000!r}\n")
        out.write(f"directionality_{name},{-refined.fun / J!r}\nmax_power_from_{name},{refined.x % 360!r}\n")
