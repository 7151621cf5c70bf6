"""Reference statistics of the synthetic test dataset, computed with NumPy (the external reference of the API tests).

Input (argv[1], little-endian binary): int32 cells, int32 steps; int64 times[steps] (Unix seconds, UTC);
then per cell: int32 cell_id, float64 depth (NaN = unknown, deep water), float32 hs, te, tp, dir, spread [steps].
Output (argv[2]): CSV rows cell,period,parameter,mean,sd,min,max,p10,p50,p90,p99,count,coverage,extra
(extra: ';'-joined floats), with the atlas codes: period 0 annual, 1..12 months, 13..16 DJF MAM JJA SON, a year;
parameter 0 hs, 1 te, 2 tp, 3 j, 4 dir, 5 spread, 7 depth.

Definitions (IEC TS 62600-101 as summarised in tests/data/README.md, from memory):
  power per step J = rho g^2 Hm0^2 Te / (64 pi) * (cg / cg_deep), rho = 1025 kg/m3, g = 9.81 m/s2, kW/m, with the
  group velocity of linear theory at the cell depth (the dispersion relation solved here by Newton iteration);
  mean direction = power-weighted circular mean; power rose = share of summed power per 22.5-degree sector, sector 0
  centred on north. Percentiles: numpy.percentile's default (linear, Hyndman-Fan type 7). sd: population (ddof=0).
Coverage against the calendar: a period expects the calendar seconds of its months within the record's years over the
nominal step (numpy's mode of the intervals). Seasons and annual are month-balanced (the atlas's stated method): a
value of calendar month m weighs E_m / V_m (expected over valid steps of m); numpy.average gives mean and sd, the
weighted percentile puts the k-th sorted value at rank (n - 1) W_k / (W - w_last) and reads (n - 1) p there
(numpy.interp); exceedance and the direction sums take the same weights. Equal ratios: the plain numpy functions.
"""
import sys
import numpy as np

RHO, G = 1025.0, 9.81
HS_THRESHOLDS = [1, 2, 3, 4, 5]
J_THRESHOLDS = [5, 10, 20, 30, 50, 75, 100]


def wave_number(omega, depth):
    if np.isnan(depth):
        return omega ** 2 / G
    k = omega ** 2 / G
    k = np.where(k * depth < 1, omega / np.sqrt(G * depth), k)
    for _ in range(60):
        f = G * k * np.tanh(k * depth) - omega ** 2
        df = G * np.tanh(k * depth) + G * k * depth / np.cosh(k * depth) ** 2
        k = k - f / df
    return k


def power(hs, te, depth):
    with np.errstate(invalid="ignore"):
        omega = 2 * np.pi / te
        deep = RHO * G ** 2 * hs ** 2 * te / (64 * np.pi) / 1000.0
        if np.isnan(depth):
            return deep
        k = wave_number(omega, depth)
        kh = k * depth
        n = 0.5 * (1 + 2 * kh / np.sinh(2 * kh))
        cg = n * omega / k
        cg0 = G * te / (4 * np.pi)
        return deep * cg / cg0


def month_expected(y, m, nominal):
    start = np.datetime64(f"{y:04d}-{m:02d}-01T00:00:00", "s")
    end = np.datetime64(f"{y + (m == 12):04d}-{m % 12 + 1:02d}-01T00:00:00", "s")
    return int((int((end - start).astype(int)) + nominal // 2) // nominal)


def balance(code, valid, months, expected_month):
    """Weights per valid value of a season or annual period, or None when the month ratios are equal."""
    if not (code == 0 or 13 <= code <= 16):
        return None
    v = np.bincount(months[valid] - 1, minlength=12)
    ratios = [(max(int(expected_month[m]), int(v[m])), int(v[m])) for m in range(12) if v[m] > 0]
    if not ratios or all(a * ratios[0][1] == ratios[0][0] * b for a, b in ratios):
        return None
    w = np.array([max(expected_month[m], v[m]) / v[m] if v[m] else 0.0 for m in range(12)])
    return w[months[valid] - 1]


def weighted_percentiles(v, w, qs):
    order = np.argsort(v, kind="stable")
    x, ww = v[order], w[order]
    before = np.cumsum(ww) - ww
    r = (x.size - 1) * before / before[-1]
    return [float(np.interp((x.size - 1) * q / 100, r, x)) for q in qs]


def main():
    raw = open(sys.argv[1], "rb").read()
    cells, steps = np.frombuffer(raw, "<i4", 2, 0)
    offset = 8
    times = np.frombuffer(raw, "<i8", steps, offset).astype("datetime64[s]")
    offset += 8 * steps
    years = times.astype("datetime64[Y]").astype(int) + 1970
    months = times.astype("datetime64[M]").astype(int) % 12 + 1
    periods = [(0, np.ones(steps, bool))]
    periods += [(m, months == m) for m in range(1, 13)]
    for code, season in zip(range(13, 17), [(12, 1, 2), (3, 4, 5), (6, 7, 8), (9, 10, 11)]):
        periods.append((code, np.isin(months, season)))
    periods += [(int(y), years == y) for y in np.unique(years)]
    seconds = times.astype(np.int64)
    intervals, counts = np.unique(np.diff(seconds), return_counts=True)
    nominal = int(intervals[np.argmax(counts)]) if intervals.size else 3600
    slot_expected = {}
    for y in range(int(years.min()), int(years.max()) + 1):
        for m in range(1, 13):
            slot_expected[(y, m)] = max(month_expected(y, m, nominal), int(np.sum((years == y) & (months == m))))
    def expected_months(code):
        e = np.zeros(12)
        for (y, m), n in slot_expected.items():
            if (code == 0 or (1 <= code <= 12 and m == code) or (13 <= code <= 16 and np.isin(m, [(12, 1, 2), (3, 4, 5), (6, 7, 8), (9, 10, 11)][code - 13]))
                    or (code >= 1000 and y == code)):
                e[m - 1] += n
        return e
    out = open(sys.argv[2], "w")
    for _ in range(cells):
        cell = int(np.frombuffer(raw, "<i4", 1, offset)[0]); offset += 4
        depth = float(np.frombuffer(raw, "<f8", 1, offset)[0]); offset += 8
        series = []
        for _ in range(5):
            series.append(np.frombuffer(raw, "<f4", steps, offset).astype(np.float64)); offset += 4 * steps
        hs, te, tp, direction, spread = series
        j = power(hs, te, depth)
        for code, mask in periods:
            expected_month = expected_months(code)
            expected = int(expected_month.sum())
            for parameter, values, thresholds in [(0, hs, HS_THRESHOLDS), (1, te, None), (2, tp, None), (3, j, J_THRESHOLDS), (5, spread, None)]:
                valid = mask & ~np.isnan(values)
                v = values[valid]
                if v.size == 0:
                    continue
                wv = balance(code, valid, months, expected_month)
                if wv is None:
                    extra = "" if thresholds is None else ";".join(repr(float(np.mean(v > t))) for t in thresholds)
                    p10, p50, p90, p99 = np.percentile(v, [10, 50, 90, 99])
                    mean, sd = v.mean(), v.std()
                else:
                    extra = "" if thresholds is None else ";".join(repr(float(np.sum(wv[v > t]) / np.sum(wv))) for t in thresholds)
                    p10, p50, p90, p99 = weighted_percentiles(v, wv, [10, 50, 90, 99])
                    mean = np.average(v, weights=wv)
                    sd = np.sqrt(np.average((v - mean) ** 2, weights=wv))
                out.write(f"{cell},{code},{parameter},{mean!r},{sd!r},{v.min()!r},{v.max()!r},"
                          f"{p10!r},{p50!r},{p90!r},{p99!r},{v.size},{v.size / expected!r},{extra}\n")
            ok = mask & ~np.isnan(j) & ~np.isnan(direction)
            if ok.any():
                wd = balance(code, ok, months, expected_month)
                w, d = j[ok] * (1 if wd is None else wd), np.radians(direction[ok])
                mean = np.degrees(np.arctan2((w * np.sin(d)).sum(), (w * np.cos(d)).sum())) % 360
                sector = (np.floor((direction[ok] % 360 + 11.25) / 22.5).astype(int)) % 16
                rose = np.bincount(sector, weights=w, minlength=16) / w.sum()
                extra = ";".join(repr(float(x)) for x in rose)
                out.write(f"{cell},{code},4,{mean!r},,,,,,,,{int(ok.sum())},{ok.sum() / expected!r},{extra}\n")
        if not np.isnan(depth):
            out.write(f"{cell},0,7,{depth!r},,{depth!r},{depth!r},,,,,1,1.0,\n")
    out.close()


main()
