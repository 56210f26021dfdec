"""The Fisher computation of server/physics/forecast, written again with numpy, as the baseline of
bench/forecast.bench.ts. Reads a JSON job (phase-coefficient values and partial derivatives, bands,
amplitude weights, b values, networks, priors) on stdin; prints JSON with the median time in ms and
the sigma_beta values, so the bench can check both implementations agree before comparing speed.
The phase coefficients themselves are taken from the job: they are a one-off cost per source."""
import json
import math
import sys
import time

import numpy as np

C = 299792458.0
LISA_L = 2.5e9
LISA_FSTAR = C / (2 * math.pi * LISA_L)
CONFUSION = {0.5: (0.133, 243, 482, 917, 2.58e-3), 1: (0.171, 292, 1020, 1680, 2.15e-3), 2: (0.165, 299, 611, 1340, 1.73e-3), 4: (0.138, -221, 521, 1680, 1.13e-3)}


def psd(curve, f, years):
    if curve == "aligo-design":
        x = f / 245.4
        return 1e-48 * (0.0152 * x**-4 + 0.2935 * x**2.25 + 2.7951 * x**1.5 - 6.508 * x**0.75 + 17.7622)
    if curve == "lisa":
        p_oms = 1.5e-11**2 * (1 + (2e-3 / f) ** 4)
        p_acc = 3e-15**2 * (1 + (0.4e-3 / f) ** 2) * (1 + (f / 8e-3) ** 4)
        pn = (p_oms + 2 * (1 + np.cos(f / LISA_FSTAR) ** 2) * p_acc / (2 * math.pi * f) ** 4) / LISA_L**2
        row = min(CONFUSION, key=lambda y: abs(math.log(y / years)))
        a, b, k, g, fk = CONFUSION[row]
        sc = 9e-45 * f ** (-7 / 3) * np.exp(-(f**a) + b * f * np.sin(k * f)) * (1 + np.tanh(g * (fk - f)))
        return 10 / 3 * pn * (1 + 0.6 * (f / LISA_FSTAR) ** 2) + sc
    raise ValueError(curve)


def detector_integrals(job, det):
    n = job["points"]
    lf = np.linspace(math.log(det["f_low"]), math.log(det["f_high"]), n)
    step = lf[1] - lf[0]
    f = np.exp(lf)
    trap = np.full(n, step)
    trap[0] = trap[-1] = 0.5 * step
    w = trap * f * det["amplitude2"] * f ** (-7 / 3) / psd(det["curve"], f, det["years"])
    lnu = np.log(math.pi * job["mc_z"] * f) / 3
    E = np.array(job["E"])  # 8 x 4: value, d/dmass, d/dchi_s, d/dchi_a
    D = np.array(job["D"])
    k = np.arange(8)[:, None]
    uk = np.exp((k - 5) * lnu[None, :])  # 8 x n
    d_mc = ((k - 5) / 3 * (E[:, :1] + D[:, :1] * lnu) + D[:, :1] / 3) * uk
    cols = np.empty((6, n))
    cols[0] = -1
    cols[1] = 2 * math.pi * f
    cols[2] = d_mc.sum(axis=0)
    for j in range(3):
        cols[3 + j] = ((E[:, 1 + j : 2 + j] + D[:, 1 + j : 2 + j] * lnu) * uk).sum(axis=0)
    base = (cols * w) @ cols.T
    return {"snr2": w.sum(), "base": base, "w": w, "lnu": lnu, "cols": cols}


def detector_fisher(ig, b):
    g = np.zeros((8, 8))
    g[0, 0] = ig["snr2"]
    g[1:7, 1:7] = ig["base"]
    ub = np.exp(b * ig["lnu"])
    wu = ig["w"] * ub
    cross = ig["cols"] @ wu
    g[7, 1:7] = cross
    g[1:7, 7] = cross
    g[7, 7] = wu @ ub
    return g


def sigma_beta(gamma):
    s = 1 / np.sqrt(np.diag(gamma))
    scaled = gamma * np.outer(s, s)
    sv = np.linalg.svd(scaled, compute_uv=True)[1]
    cond = sv.max() / sv.min()
    L = np.linalg.cholesky(scaled)
    inv = np.linalg.inv(L)
    cov = (inv.T @ inv) * np.outer(s, s)
    return math.sqrt(cov[7, 7]), cond


def run(job):
    integrals = [detector_integrals(job, d) for d in job["detectors"]]
    out = []
    prior = np.zeros(8)
    for idx, width in ((1, job["priors"]["phi_c"]), (5, job["priors"]["chi_s"]), (6, job["priors"]["chi_a"])):
        if width is not None:
            prior[idx] = 1 / width**2
    per_b = [[detector_fisher(ig, b) for ig in integrals] for b in job["b"]]
    for net in job["networks"]:
        row = []
        for bi, b in enumerate(job["b"]):
            if b in (0, 3):
                row.append(None)
                continue
            gamma = sum(per_b[bi][d] for d in net) + np.diag(prior)
            row.append(sigma_beta(gamma)[0])
        out.append(row)
    return out


def main():
    job = json.load(sys.stdin)
    for _ in range(3):
        run(job)
    samples = []
    for _ in range(job["runs"]):
        t0 = time.perf_counter()
        result = run(job)
        samples.append((time.perf_counter() - t0) * 1e3)
    samples.sort()
    print(json.dumps({"median_ms": samples[len(samples) // 2], "sigma": result, "numpy": np.__version__}))


main()
