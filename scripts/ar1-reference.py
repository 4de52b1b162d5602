#!/usr/bin/env python3
"""Generates tests/fixtures/ar1-reference.json: the AR(1) fit and pre-whitening of hourly residuals,
computed with numpy independently of src/lib/analytics/autocorrelation.ts.

Invented data: an AR(1) series r_t = 0.6 r_(t-1) + e_t, e_t ~ N(0, 2^2), 700 hours from numpy's seeded
generator, of which some hours are removed (as unsteady hours are: a random tenth, and two blocks of
5 and 30 hours). The kept hours and their starts are stored in the fixture, so the TypeScript test
works on exactly the same numbers.

Reference results:
- phi by numpy.linalg.lstsq of r_t on r_(t-1) without intercept, over the pairs of kept hours exactly
  one hour apart; the innovation spread sqrt(SSE / (m - 1)) over those m pairs;
- the standardised innovation of every kept hour given the fitted phi and spread, derived by Gaussian
  conditioning on ALL earlier kept hours (up to 60 back) with the AR(1) covariance
  sigma^2 phi^|i - j|, sigma^2 = sigma_e^2 / (1 - phi^2), solved with numpy.linalg.solve. This does not
  use the Markov shortcut (g-step prediction from the last hour) the product uses, so it checks it;
- the effective sample size of a mean of n consecutive hours, n^2 / sum_ij phi^|i - j|, by summing the
  correlation matrix, for several n and phi.

Run with Debian's python3-numpy:  python3 scripts/ar1-reference.py
"""

import numpy as np
from reference_common import write_fixture

rng = np.random.RandomState(20261202)
N = 700
PHI = 0.6
SE = 2.0
r = np.zeros(N)
r[0] = rng.normal(0.0, SE / np.sqrt(1 - PHI**2))
for t in range(1, N):
    r[t] = PHI * r[t - 1] + rng.normal(0.0, SE)
keep = rng.uniform(size=N) > 0.1
keep[200:205] = False
keep[400:430] = False
keep[0] = True
H = 3_600_000
T0 = 1_735_689_600_000  # 2025-01-01T00:00Z
idx = np.nonzero(keep)[0]
res = np.round(r[idx], 6)
hours = idx.astype(np.int64)

# fit on pairs one hour apart
pair = np.diff(hours) == 1
x_prev = res[:-1][pair]
x_next = res[1:][pair]
phi_fit = float(np.linalg.lstsq(x_prev[:, None], x_next, rcond=None)[0][0])
resid = x_next - phi_fit * x_prev
m = int(pair.sum())
s_e = float(np.sqrt(resid @ resid / (m - 1)))

# innovations by Gaussian conditioning on every earlier kept hour (up to 60 back)
sig2 = s_e**2 / (1 - phi_fit**2)
innov = []
for i in range(len(res)):
    past = list(range(max(0, i - 60), i))
    if not past:
        innov.append(float(res[i] / np.sqrt(sig2)))
        continue
    ti = hours[i]
    tp = hours[past]
    S22 = sig2 * phi_fit ** np.abs(tp[:, None] - tp[None, :])
    S12 = sig2 * phi_fit ** np.abs(ti - tp)
    w = np.linalg.solve(S22, S12)
    mean = float(w @ res[past])
    var = float(sig2 - S12 @ w)
    innov.append((float(res[i]) - mean) / np.sqrt(var))

neff = []
for phi in [0.0, 0.3, 0.9, -0.4]:
    for n in [1, 2, 24, 100]:
        idx_n = np.arange(n)
        C = phi ** np.abs(idx_n[:, None] - idx_n[None, :]).astype(float)
        neff.append({"n": n, "phi": phi, "nEff": float(n * n / C.sum())})

out = {
    "source": "scripts/ar1-reference.py (numpy lstsq, Gaussian conditioning, correlation-matrix sums)",
    "hourStartMs": [int(T0 + h * H) for h in hours],
    "residuals": [float(v) for v in res],
    "pairs": m,
    "phi": phi_fit,
    "sInnovation": s_e,
    "innovations": innov,
    "effectiveSampleSize": neff,
}
write_fixture("ar1-reference.json", out, indent=None)
print(f"{len(res)} hours, {m} pairs, phi = {phi_fit:.6f}, sInnovation = {s_e:.6f}")
