"""Independent refits of the reaction-order test datasets, written into refits.test.ts.

numpy.linalg.lstsq for each integrated law's linear form (one intercept per run, a common slope), and
scipy.optimize.curve_fit for each law fitted to the concentrations (a common k, one [A]_0 per run).
Run: python3 test/kinds/reaction-order/independent-refits.py
"""
import json
import numpy as np
import scipy
from scipy.optimize import curve_fit

DATASETS = {
    # N2O5 in CCl4 at 45 C, [N2O5]/M against t/s (from memory: a general-chemistry textbook's worked example).
    "n2o5": {"runs": [[[0, 0.1000], [50, 0.0707], [100, 0.0500], [200, 0.0250], [300, 0.0125], [400, 0.00625]]], "per_molar": 1.0, "offset": 0.0},
    # 2 NO2 -> 2 NO + O2 at 300 C, [NO2]/M against t/s (from memory: a general-chemistry textbook's worked example).
    "no2": {"runs": [[[0, 0.01000], [50, 0.00787], [100, 0.00649], [200, 0.00481], [300, 0.00380]]], "per_molar": 1.0, "offset": 0.0},
    # Invented absorbance runs: epsilon 8374.6 M^-1 cm^-1, l 0.5 cm, A_inf 0.02; t/min.
    "dye": {
        "runs": [
            [[0, 0.91351], [0.9437, 0.66243], [1.887, 0.5256], [2.831, 0.41417], [3.775, 0.36104], [4.718, 0.31011], [5.662, 0.28846], [6.606, 0.25677], [7.549, 0.2319]],
            [[0, 0.84207], [1.021, 0.61419], [2.043, 0.48472], [3.064, 0.38915], [4.086, 0.34976], [5.107, 0.30373], [6.129, 0.2748], [7.15, 0.22939], [8.172, 0.21963]],
        ],
        "per_molar": 8374.6 * 0.5,
        "offset": 0.02,
    },
    # Invented concentration run, [A]/M against t/min.
    "flat": {"runs": [[[0, 0.087513], [2.76, 0.076465], [5.52, 0.06708], [8.28, 0.057283], [11.04, 0.048931], [13.8, 0.040416], [16.56, 0.030366], [19.32, 0.020911]]], "per_molar": 1.0, "offset": 0.0},
}


def transform(order, c):
    return c if order == 0 else np.log(c) if order == 1 else 1 / c


def linear(order, runs):
    rows, y = [], []
    for r, (t, c) in enumerate(runs):
        for ti, ci in zip(t, c):
            if order > 0 and ci <= 0:
                continue
            rows.append([1.0 if j == r else 0.0 for j in range(len(runs))] + [ti])
            y.append(transform(order, ci))
    X, y = np.array(rows), np.array(y)
    beta, *_ = np.linalg.lstsq(X, y, rcond=None)
    res = y - X @ beta
    dof = len(y) - X.shape[1]
    cov = (res @ res / dof) * np.linalg.inv(X.T @ X)
    sign = 1 if order == 2 else -1
    return {"k": sign * beta[-1], "se": float(np.sqrt(cov[-1, -1])), "intercepts": beta[:-1].tolist(), "sse": float(res @ res), "dof": dof}


def law(order, t, c0, k):
    return c0 - k * t if order == 0 else c0 * np.exp(-k * t) if order == 1 else c0 / (1 + c0 * k * t)


def nonlinear(order, runs, start):
    t = np.concatenate([np.asarray(tt, float) for tt, _ in runs])
    c = np.concatenate([np.asarray(cc, float) for _, cc in runs])
    run = np.concatenate([[r] * len(tt) for r, (tt, _) in enumerate(runs)])

    def model(_, k, *c0):
        return law(order, t, np.asarray(c0)[run], k)

    p, cov = curve_fit(model, t, c, p0=start, xtol=1e-15, ftol=1e-15, gtol=1e-15, maxfev=100000)
    res = c - model(t, *p)
    return {"k": float(p[0]), "se": float(np.sqrt(cov[0, 0])), "c0": p[1:].tolist(), "sse": float(res @ res)}


out = {"numpy": np.__version__, "scipy": scipy.__version__}
for name, d in DATASETS.items():
    runs = [([row[0] for row in rr], [(row[1] - d["offset"]) / d["per_molar"] for row in rr]) for rr in d["runs"]]
    out[name] = {}
    for order in (0, 1, 2):
        lin = linear(order, runs)
        c0 = [float(np.exp(b)) if order == 1 else (1 / b if order == 2 else b) for b in lin["intercepts"]]
        out[name][order] = {"linear": lin, "nonlinear": nonlinear(order, runs, [lin["k"], *c0])}
print(json.dumps(out, indent=1))
