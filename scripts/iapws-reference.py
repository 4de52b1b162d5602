#!/usr/bin/env python3
"""Reference states for tests/thermo/water-reference.test.ts, computed with Debian's python3-iapws.

Run with the Debian system interpreter (the one that sees the apt package python3-iapws):

    python3 scripts/iapws-reference.py

It writes tests/fixtures/iapws-reference.json. Tests read that file; they never call Python.

What is computed (all values converted to SI base units: Pa, K, J/kg, J/(kg K), m3/kg, m/s):
  pt    iapws.IAPWS97(P=, T=) in regions 1, 2, 3 (including points in every SR5-05 subregion,
        near-critical ones among them) and 5
  ph    iapws.IAPWS97(P=, h=) for single-phase states (h taken from pt states) and two-phase
        states below psat(623.15 K)
  ps    iapws.IAPWS97(P=, s=) likewise
  px    iapws.IAPWS97(P=, x=) below psat(623.15 K); above it (saturation in region 3) the module's
        basic region 3 equation iapws.iapws97._Region3 with the density solved for p = p_given at
        T = _TSat_P(p) by scipy.optimize.newton (analytic derivative from the module's
        isothermal compressibility, tol 1e-9 kg/m3) from the module's SR5-05 starting
        value, because IAPWS97(P=, x=) returns the unpolished backward densities for 0 < x < 1
  tx    iapws.IAPWS97(T=, x=) likewise (same treatment above 623.15 K)
  sat   iapws.iapws97._PSat_T and _TSat_P
  iapws95  iapws.IAPWS95(T=, P=) (the scientific formulation, IAPWS R6-95(2018)) at a few
        single-phase states, for the IF97 / IAPWS-95 consistency check
"""
import random
import sys

import iapws
from iapws import IAPWS95, IAPWS97
from iapws import iapws97 as m
from scipy.optimize import newton
from reference_common import debian_version, fixture_path, write_fixture

OUT = fixture_path('iapws-reference.json')
rng = random.Random(1997)


def si(st, extra=None):
    d = {
        'p_Pa': st.P * 1e6, 'T_K': st.T, 'h_J_per_kg': st.h * 1e3, 's_J_per_kgK': st.s * 1e3,
        'v_m3_per_kg': st.v, 'region': st.region,
    }
    if st.region != 4 or st.x in (0, 1):
        d['cp_J_per_kgK'] = st.cp * 1e3 if st.cp is not None else None
        d['w_m_per_s'] = st.w
    if st.region == 4:
        d['x'] = st.x
    if extra:
        d.update(extra)
    return d


def region3_sat(P, T, x):
    """Saturated liquid (x=0) / vapour (x=1) of region 3 at (P MPa, T K), density polished."""
    rho0 = 1.0 / m._Backward3_sat_v_P(P, T, x)
    rho = newton(lambda r: m._Region3(r, T)['P'] - P, rho0,
                 fprime=lambda r: 1.0 / (r * m._Region3(r, T)['kt']), tol=1e-9, maxiter=200)
    return m._Region3(rho, T)


def on_line(st, x):
    """A saturated state from IAPWS97(P|T=, x=): x = 0 and 1 come back as region 1/2 states."""
    d = si(st)
    d['iapws_region'] = d['region']
    d['region'] = 4
    d['x'] = x
    return d


def sat_mix(P, T, x):
    liq = region3_sat(P, T, 0)
    vap = region3_sat(P, T, 1)
    d = {'p_Pa': P * 1e6, 'T_K': T, 'x': x, 'region': 4}
    if x in (0, 1):
        d['cp_J_per_kgK'] = (liq if x == 0 else vap)['cp'] * 1e3
        d['w_m_per_s'] = (liq if x == 0 else vap)['w']
    for key, name, f in (('h', 'h_J_per_kg', 1e3), ('s', 's_J_per_kgK', 1e3), ('v', 'v_m3_per_kg', 1)):
        d[name] = (liq[key] + x * (vap[key] - liq[key])) * f
    return d


pt, ph, ps, px, tx, sat, i95 = [], [], [], [], [], [], []

# ---- pt, region 1: T in 273.15..623.15 K, p in psat(T)..100 MPa (log-uniform)
for T, P in [(273.15, 0.000611213), (273.15, 100), (623.15, 100), (300, 3), (500, 3)]:
    pt.append(si(IAPWS97(P=P, T=T)))
while len([s for s in pt if s['region'] == 1]) < 60:
    T = rng.uniform(273.15, 623.15)
    lo = m._PSat_T(T)
    P = lo * (100 / lo) ** rng.random()
    if m._Bound_TP(T, P) == 1:
        pt.append(si(IAPWS97(P=P, T=T)))

# ---- pt, region 2: T up to 1073.15 K, p from 1 kPa to psat(T) or p_B23(T) or 100 MPa
for T, P in [(300, 0.0035), (700, 0.0035), (700, 30), (1073.15, 100), (1073.15, 0.001), (280, 0.0007)]:
    pt.append(si(IAPWS97(P=P, T=T)))
while len([s for s in pt if s['region'] == 2]) < 60:
    T = rng.uniform(273.15, 1073.15)
    if T <= 623.15:
        hi = m._PSat_T(T)
    elif T <= 863.15:
        hi = m._P23_T(T)
    else:
        hi = 100
    P = 0.001 * (hi / 0.001) ** rng.random()
    if m._Bound_TP(T, P) == 2:
        pt.append(si(IAPWS97(P=P, T=T)))

# ---- pt, region 3: the SR5-05 check points of every subregion, then random points
sr505 = [(630, 50), (670, 80), (710, 50), (750, 80), (630, 20), (650, 30), (656, 26), (670, 30),
         (661, 26), (675, 30), (671, 26), (690, 30), (649, 23.6), (650, 24), (652, 23.6), (654, 24),
         (653, 23.6), (655, 24), (655, 23.5), (660, 24), (660, 23), (670, 24), (646, 22.6), (646, 23),
         (648.6, 22.6), (649.3, 22.8), (649, 22.6), (649.7, 22.8), (649.1, 22.6), (649.9, 22.8),
         (649.4, 22.6), (650.2, 22.8), (640, 21.1), (643, 21.8), (644, 21.1), (648, 21.8),
         (635, 19.1), (638, 20), (626, 17), (640, 20), (644.6, 21.5), (646.1, 22), (648.6, 22.5),
         (647.9, 22.3), (647.5, 22.15), (648.1, 22.3), (648, 22.11), (649, 22.3), (646.84, 22),
         (647.05, 22.064), (646.89, 22), (647.15, 22.064)]
for T, P in sr505:
    if m._Bound_TP(T, P) == 3:
        pt.append(si(IAPWS97(P=P, T=T), {'note': 'SR5-05 check point'}))
n3 = 0
while n3 < 50:
    T = rng.uniform(623.15, 863.15)
    P = rng.uniform(max(m._P23_T(T), 16.53), 100)
    if T < 660 and rng.random() < 0.5:
        P = rng.uniform(max(m._P23_T(T), 16.53), 30)  # denser near the critical point
    if m._Bound_TP(T, P) == 3:
        pt.append(si(IAPWS97(P=P, T=T)))
        n3 += 1

# ---- pt, region 5
for T, P in [(1500, 0.5), (1500, 30), (2000, 30), (2273.15, 50), (1073.16, 0.001)]:
    pt.append(si(IAPWS97(P=P, T=T)))
for _ in range(20):
    T = rng.uniform(1073.15, 2273.15)
    P = 0.001 * (50 / 0.001) ** rng.random()
    pt.append(si(IAPWS97(P=P, T=T)))

# ---- ph and ps from single-phase pt states (every second one), two-phase below psat(623.15 K)
for k, st in enumerate(pt):
    if k % 2:
        continue
    P = st['p_Pa'] / 1e6
    if P < m.Pmin:
        continue
    a = IAPWS97(P=P, h=st['h_J_per_kg'] / 1e3)
    if a.region == st['region']:
        ph.append(si(a, {'from_T_K': st['T_K']}))
    b = IAPWS97(P=P, s=st['s_J_per_kgK'] / 1e3)
    if b.region == st['region']:
        ps.append(si(b, {'from_T_K': st['T_K']}))
for _ in range(20):
    P = 0.001 * (16.5 / 0.001) ** rng.random()
    x = rng.uniform(0.01, 0.99)
    w = IAPWS97(P=P, x=x)
    a = IAPWS97(P=P, h=w.h)
    if a.region == 4:
        ph.append(si(a))
    b = IAPWS97(P=P, s=w.s)
    if b.region == 4:
        ps.append(si(b))

# ---- px and tx
for P in [0.0007, 0.0035, 0.1, 1, 5, 10, 16.5]:
    for x in (0, 0.25, 1):
        px.append(on_line(IAPWS97(P=P, x=x), x))
for P in [17, 19, 20.5, 21.5, 22]:
    for x in (0, 0.4, 1):
        px.append(sat_mix(P, m._TSat_P(P), x))
for T in [273.15, 300, 373.15, 450, 550, 623.15]:
    for x in (0, 0.6, 1):
        tx.append(on_line(IAPWS97(T=T, x=x), x))
for T in [630, 640, 645, 647]:
    for x in (0, 0.6, 1):
        tx.append(sat_mix(m._PSat_T(T), T, x))

# ---- saturation line
for T in [273.15, 280, 300, 350, 373.15, 400, 450, 500, 550, 600, 623.15, 640, 647.096]:
    sat.append({'T_K': T, 'psat_Pa': m._PSat_T(T) * 1e6})
for P in [0.000611213, 0.001, 0.01, 0.1, 1, 5, 10, 16.5, 20, 22, 22.064]:
    sat.append({'p_Pa': P * 1e6, 'tsat_K': m._TSat_P(P)})

# ---- IAPWS-95 (scientific formulation) at single-phase states away from the critical point
for T, P in [(300, 0.1), (300, 50), (350, 1), (450, 10), (550, 80), (500, 0.1), (600, 1),
             (700, 10), (800, 20), (900, 60), (1000, 5), (700, 50), (750, 30), (1200, 1), (1273, 20)]:
    st = IAPWS95(T=T, P=P)
    i95.append({'p_Pa': P * 1e6, 'T_K': T, 'h_J_per_kg': st.h * 1e3, 's_J_per_kgK': st.s * 1e3,
                'v_m3_per_kg': st.v, 'cp_J_per_kgK': st.cp * 1e3, 'w_m_per_s': st.w})
for T in [300, 400, 500, 600]:
    st = IAPWS95(T=T, x=0)
    i95.append({'T_K': T, 'psat_Pa': st.P * 1e6})

doc = {
    'library': 'python3-iapws (Debian package %s, module version %s)' % (debian_version(), iapws.__version__),
    'python': sys.version.split()[0],
    'command': 'python3 scripts/iapws-reference.py  (Debian system interpreter with apt package python3-iapws)',
    'units': 'SI base: Pa, K, J/kg, J/(kg K), m3/kg, m/s',
    'notes': 'What is computed' + __doc__.split('What is computed', 1)[1].rstrip(),
    'pt': pt, 'ph': ph, 'ps': ps, 'px': px, 'tx': tx, 'sat': sat, 'iapws95': i95,
}
write_fixture(OUT, doc)
print('wrote %d pt, %d ph, %d ps, %d px, %d tx, %d sat, %d iapws95 states'
      % (len(pt), len(ph), len(ps), len(px), len(tx), len(sat), len(i95)))
