#!/usr/bin/env python3
"""Generates tests/fixtures/distributions-reference.json: check values for
src/lib/analytics/distributions.ts (Student t quantiles and distribution function, the regularised
incomplete beta function, ln Gamma, coverage factors) and the normal quantiles the uncertainty tests
use, computed with scipy independently of the TypeScript code.

- t quantiles t_p(nu) by scipy.stats.t.ppf; the t distribution function by scipy.stats.t.cdf;
- I_x(a, b) by scipy.special.betainc; ln Gamma(x) by scipy.special.gammaln;
- coverage factors k for a two-sided interval of coverage c with nu degrees of freedom (JCGM 100:2008
  Annex G.3): t_((1 + c) / 2)(nu), and the normal quantile for nu = infinity (scipy.stats.norm.ppf).

Run with Debian's python3-scipy:  python3 scripts/distributions-reference.py
"""

import numpy as np
import scipy
from scipy import special, stats
from reference_common import write_fixture

P = [0.9, 0.95, 0.975, 0.99, 0.995, 0.9995]
NU = [1, 2, 3, 5, 10, 30, 100, 1000]
t_quantiles = [{"p": p, "nu": nu, "t": float(stats.t.ppf(p, nu))} for p in P for nu in NU]
t_cdf = [{"t": t, "nu": nu, "F": float(stats.t.cdf(t, nu))} for t in [-3.0, -0.5, 0.7, 2.0, 4.0] for nu in [1.5, 3, 10, 50]]
inc_beta = [
    {"x": x, "a": a, "b": b, "I": float(special.betainc(a, b, x))}
    for (x, a, b) in [(0.3, 2.5, 4.0), (0.05, 0.5, 0.5), (0.9, 10.0, 3.0), (0.5, 50.0, 50.0), (0.999, 1.5, 20.0)]
]
ln_gamma = [{"x": x, "lnGamma": float(special.gammaln(x))} for x in [0.1, 0.5, 1.5, 3.7, 12.5, 171.0]]
coverage = [
    {"coverage": c, "nu": nu, "k": float(stats.norm.ppf(0.5 + c / 2) if nu is None else stats.t.ppf(0.5 + c / 2, nu))}
    for c in [0.95, 0.9545, 0.99]
    for nu in [None, 5, 10, 50]
]
normal = [{"p": p, "z": float(stats.norm.ppf(p))} for p in [0.975, 0.97725, 0.995]]

out = {
    "source": f"scripts/distributions-reference.py (scipy {scipy.__version__}, numpy {np.__version__})",
    "note": "nu null means infinity (normal quantile)",
    "tQuantiles": t_quantiles,
    "tCdf": t_cdf,
    "incompleteBeta": inc_beta,
    "lnGamma": ln_gamma,
    "coverageFactors": coverage,
    "normalQuantiles": normal,
}
write_fixture("distributions-reference.json", out)
print(f"{len(t_quantiles)} t quantiles, {len(t_cdf)} t cdf values, {len(coverage)} coverage factors")
