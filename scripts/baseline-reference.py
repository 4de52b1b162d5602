#!/usr/bin/env python3
"""Generates tests/fixtures/baseline-reference.json: least-squares baselines computed with numpy.

Invented data: 60 hours of a unit's exergy efficiency against load (fraction of rating) and ambient
temperature (K), from a smooth made-up curve plus normal noise from numpy's seeded generator. The
data themselves are stored in the fixture, so the TypeScript test fits exactly the same numbers.

Reference results per model ('linear': 1, L, T; 'quadratic': + L^2, T^2, L*T):
coefficients in the raw variables from numpy.linalg.lstsq (SVD), cross-checked in the script
against a solve in a centred basis; predictions; SSE; s = sqrt(SSE/(n-p)); R^2;
CV(RMSE) = s / ybar and NMBE = sum(y - yhat) / ((n - p) ybar) (ASHRAE Guideline 14-2014 forms with
n - p); and, at three new hours, the standard deviation of a new observation
s * sqrt(1 + x0^T (X^T X)^-1 x0), with (X^T X)^-1 applied through numpy's QR of X.

Run with Debian's python3-numpy:  python3 scripts/baseline-reference.py
"""

import numpy as np
from reference_common import write_fixture

rng = np.random.RandomState(20260101)
n = 60
load = np.round(rng.uniform(0.35, 1.0, n), 4)
T_amb_K = np.round(rng.uniform(268.0, 308.0, n), 2)
dT = T_amb_K - 288.0
y_true = 0.25 + 0.30 * load - 0.15 * load**2 - 0.0008 * dT + 0.0002 * load * dT + 5e-6 * dT**2
y = np.round(y_true + rng.normal(0.0, 0.004, n), 6)

new_points = [(0.5, 275.0), (0.8, 295.0), (1.0, 305.0)]


def design(L, T, terms):
    cols = [np.ones_like(L)]
    for t in terms:
        cols.append({"load": L, "T_amb": T, "load^2": L**2, "T_amb^2": T**2, "load*T_amb": L * T}[t])
    return np.column_stack(cols)


def fit(terms):
    X = design(load, T_amb_K, terms)
    coef, *_ = np.linalg.lstsq(X, y, rcond=None)
    # independent check in a centred, scaled basis (same column space, better conditioned)
    Lz = (load - load.mean()) / load.std()
    Tz = (T_amb_K - T_amb_K.mean()) / T_amb_K.std()
    Z = design(Lz, Tz, terms)
    bz, *_ = np.linalg.lstsq(Z, y, rcond=None)
    assert np.allclose(X @ coef, Z @ bz, rtol=1e-10, atol=1e-12), "raw and centred fits disagree"
    yhat = X @ coef
    p = X.shape[1]
    resid = y - yhat
    sse = float(resid @ resid)
    s = float(np.sqrt(sse / (n - p)))
    ybar = float(y.mean())
    sst = float(((y - ybar) ** 2).sum())
    _, R = np.linalg.qr(Z)
    preds = []
    for L0, T0 in new_points:
        z0 = design(np.array([(L0 - load.mean()) / load.std()]), np.array([(T0 - T_amb_K.mean()) / T_amb_K.std()]), terms)[0]
        w = np.linalg.solve(R.T, z0)
        x0 = design(np.array([L0]), np.array([T0]), terms)[0]
        preds.append({"load": L0, "T_amb_K": T0, "yhat": float(x0 @ coef), "se": s * float(np.sqrt(1.0 + w @ w))})
    return {
        "terms": terms,
        "coefficients": dict(zip(["intercept"] + terms, [float(c) for c in coef])),
        "yhat": [float(v) for v in yhat],
        "sse": sse,
        "s": s,
        "r2": 1.0 - sse / sst,
        "cvRmse": s / ybar,
        "nmbe": float(resid.sum()) / ((n - p) * ybar),
        "predictions": preds,
    }


out = {
    "generator": "scripts/baseline-reference.py",
    "library": "numpy",
    "library_version": np.__version__,
    "note": "Invented data (seeded numpy.random.RandomState(20260101)); reference fits by numpy.linalg.lstsq.",
    "data": {"load": load.tolist(), "T_amb_K": T_amb_K.tolist(), "y": y.tolist()},
    "models": {
        "linear": fit(["load", "T_amb"]),
        "quadratic": fit(["load", "T_amb", "load^2", "T_amb^2", "load*T_amb"]),
    },
}
write_fixture("baseline-reference.json", out)
print(f"wrote baseline reference with numpy {np.__version__}")
