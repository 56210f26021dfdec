"""The per-sample pipeline of bench/samples.bench.ts in numpy (the baseline it is compared with).

Same file, same steps: parse the columns, order the masses, the EdGB mapping's prefactor at
alpha = 1 and 2 (power-law check), the reachable side, x = (beta / K)^(1/p), uniform-in-alpha
weights 1 / |d beta / d alpha|, effective sample size, weighted 90% quantile (sorted cumulative
weights, linear interpolation), both validity conditions at alpha = 1 and 2 and at the bound,
the weighted log histogram. Prints JSON: seconds and the numbers to compare.
"""
import json
import sys
import time

import numpy as np

KM_PER_MSUN = 1.3271244e20 / 299792458.0**2 / 1000.0

def edgb_k(alpha, m1, m2, s1, s2):
    M = m1 + m2
    eta = m1 * m2 / (M * M)
    zeta = 16 * np.pi * alpha**2 / M**4
    return -(5 / 7168) * zeta * (m1**2 * s2 - m2**2 * s1) ** 2 / (M**4 * eta ** (18 / 5))

def run(path, c):
    t0 = time.perf_counter()
    data = np.loadtxt(path, delimiter=",", skiprows=1, usecols=(0, 1, 2, 3, 4))
    beta, m1, m2, chi1, chi2 = (np.ascontiguousarray(data[:, k]) for k in range(5))
    t_parse = time.perf_counter() - t0
    ok = np.isfinite(beta) & np.isfinite(m1) & np.isfinite(m2) & np.isfinite(chi1) & np.isfinite(chi2)
    swap = m2 > m1
    a = np.where(swap, m2, m1) * KM_PER_MSUN
    b = np.where(swap, m1, m2) * KM_PER_MSUN
    c1 = np.where(swap, chi2, chi1)
    c2 = np.where(swap, chi1, chi2)
    r1 = np.sqrt(1 - c1 * c1)
    r2 = np.sqrt(1 - c2 * c2)
    s1 = 2 * r1 / (1 + r1)
    s2 = 2 * r2 / (1 + r2)
    K = edgb_k(1.0, a, b, s1, s2)
    K2 = edgb_k(2.0, a, b, s1, s2)
    p = 2.0
    assert np.all(np.abs(K2[ok] / K[ok] - 2**p) < 1e-9 * 2**p)
    y = beta / K
    keep = ok & (K != 0) & (y > 0)
    x = y[keep] ** (1 / p)
    Kk = K[keep]
    w = 1.0 / (np.abs(p * Kk) * x ** (p - 1))
    ess = w.sum() ** 2 / (w * w).sum()
    order = np.argsort(x, kind="quicksort")
    xs = x[order]
    cw = np.cumsum(w[order]) / w.sum()
    j = int(np.searchsorted(cw, c, side="left"))
    if j == 0:
        bound = xs[0]
    else:
        bound = xs[j - 1] + (c - cw[j - 1]) / (cw[j] - cw[j - 1]) * (xs[j] - xs[j - 1])
    outside = np.zeros(x.shape, dtype=bool)
    ak, bk = a[keep], b[keep]
    for m in (ak, bk):
        v1 = 16 * np.pi * 1.0**2 / m**4
        v2 = 16 * np.pi * 2.0**2 / m**4
        q = np.log2(v2[0] / v1[0])
        outside |= v1 * bound**q > 1 / 6
    frac = w[outside].sum() / w.sum()
    quoted = np.sqrt(x)
    lq = np.log10(quoted)
    hist, _ = np.histogram(lq, bins=40, range=(lq.min(), lq.max()), weights=w)
    total = time.perf_counter() - t0
    return {"seconds": total, "parse_seconds": t_parse, "bound": float(bound), "ess": float(ess), "used": int(keep.sum()), "fraction_outside": float(frac), "hist_sum": float(hist.sum() / w.sum())}

if __name__ == "__main__":
    path, c = sys.argv[1], float(sys.argv[2])
    run(path, c)  # warm-up (imports, page cache)
    best = min((run(path, c) for _ in range(3)), key=lambda r: r["seconds"])
    print(json.dumps(best))
