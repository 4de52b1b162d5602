#!/usr/bin/env python3
"""Generates tests/fixtures/cusum-arl-reference.json: average run lengths of the tabular CUSUM for
independent normal observations, by the Markov-chain method of Brook & Evans (1972), computed here
with numpy independently of the TypeScript implementation (src/lib/analytics/arl.ts).

Method: the one-sided upper CUSUM C_i = max(0, C_(i-1) + x_i - k), signal when C_i > h, x ~ N(delta, 1).
The interval [0, h) is cut into m transient states of width w = 2h/(2m - 1) (state 0: C < w/2; state j:
C within w/2 of j*w). With R the transient-to-transient transitions, the ARL vector is (I - R)^-1 1.
This script uses m = 800 and m = 1600 and Richardson extrapolation (error O(1/m^2)), finer than the
TypeScript side, so the two agree only if both are right. The normal distribution function is
0.5 * erfc(-z / sqrt(2)) from Python's math module.

Two-sided ARL: 1/ARL = 1/ARL+(delta) + 1/ARL+(-delta).

Run with Debian's python3-numpy:  python3 scripts/cusum-arl-reference.py
"""
import math

import numpy as np
from reference_common import write_fixture

def ncdf(z):
    return 0.5 * math.erfc(-z / math.sqrt(2.0))


def arl_raw(k, h, delta, m):
    w = 2.0 * h / (2 * m - 1)
    # transitions depend on d = j - i only: F at the 2m edges k + (d +- 1/2) w - delta
    d = np.arange(-m, m + 1)
    F = np.array([ncdf(k + (dd - 0.5) * w - delta) for dd in d])  # lower edge of cell d
    i = np.arange(m)[:, None]
    j = np.arange(m)[None, :]
    idx = (j - i) + m
    R = F[idx + 1] - F[idx]
    R[:, 0] = F[(0 - np.arange(m)) + m + 1]  # P(C' < w/2) = F(k - i w + w/2 - delta)
    arl = np.linalg.solve(np.eye(m) - R, np.ones(m))
    return float(arl[0])


def arl(k, h, delta):
    a = arl_raw(k, h, delta, 800)
    b = arl_raw(k, h, delta, 1600)
    return (4 * b - a) / 3


def two_sided(k, h, delta):
    return 1.0 / (1.0 / arl(k, h, delta) + 1.0 / arl(k, h, -delta))


cases = []
for k, h in [(0.5, 4.0), (0.5, 5.0), (0.5, 8.0), (0.25, 8.0)]:
    for delta in [0.0, 0.5, 1.0, 2.0, 3.0]:
        cases.append({"k": k, "h": h, "delta": delta, "oneSided": arl(k, h, delta), "twoSided": two_sided(k, h, delta)})

out = {
    "source": "scripts/cusum-arl-reference.py (numpy; Brook & Evans 1972 Markov chain, m = 800 and 1600, Richardson)",
    "cases": cases,
}
write_fixture("cusum-arl-reference.json", out)
for c in cases:
    print(f"k={c['k']} h={c['h']} delta={c['delta']}: one-sided {c['oneSided']:.3f}, two-sided {c['twoSided']:.3f}")
