#!/usr/bin/env python3
"""Independent reference for tests/engine: a water-water heat exchanger worked end to end.

Run with the Debian system interpreter (the one that sees the apt package python3-iapws):

    python3 tests/engine/engine-reference.py

It writes tests/engine/engine-reference.json. The tests read that file; they never call Python.

Worked here without the TypeScript code:
  water and steam  iapws.IAPWS97 (IAPWS-IF97, R7-97(2012)) from Debian's python3-iapws
  flow exergy      psi = (h - h0) - T0 (s - s0), h0 and s0 of liquid water at (T0, p0)
  balance          SPECO for a heat exchanger above T0 (docs/domain.md s.3): F = hot-side exergy
                   decrease, P = cold-side exergy increase, D = F - P; Sgen = sum_out m s - sum_in m s
  uncertainty      GUM first order (JCGM 100:2008 5.1.2 eq. 10): sensitivities by central differences
                   of this script's own balance, u_c^2 = sum (c_i u_i)^2, U = 2 u_c
  readings         the engineering units the test links use: barg (site atmosphere 101325 Pa), degC,
                   t/h; uncertainties as the links state them (pressure 0.5 % of the barg reading,
                   temperature 0.5 K, flow 1 % of reading)

The plant is invented: a steam heater whose condensate leaves subcooled (so p and T fix every state).
The cold outlet temperature is chosen so that the cold side takes 99.5 % of the hot side's heat.
"""
import json
import os
import subprocess

import iapws
from iapws import IAPWS97

OUT = os.path.join(os.path.dirname(os.path.abspath(__file__)), 'engine-reference.json')

T0 = 298.15
P0 = 101325.0
P_ATM = 101325.0


def debian_version():
    try:
        return subprocess.run(['dpkg-query', '-W', '-f=${Version}', 'python3-iapws'], capture_output=True, text=True, check=True).stdout.strip()
    except Exception:  # noqa: BLE001 - informative only
        return 'unknown'


def hs(p, T):
    st = IAPWS97(P=p / 1e6, T=T)
    return st.h * 1e3, st.s * 1e3


H0, S0 = hs(P0, T0)


def psi(p, T):
    h, s = hs(p, T)
    return h - H0 - T0 * (s - S0)


# Readings in the links' engineering units.
readings = {
    'HX_HOT_IN_P': 4.0,  # barg
    'HX_HOT_IN_T': 196.85,  # degC (470 K)
    'HX_HOT_IN_F': 4.32,  # t/h (1.2 kg/s)
    'HX_HOT_OUT_P': 3.8,  # barg
    'HX_HOT_OUT_T': 136.85,  # degC (410 K), subcooled at 4.9 bar(a)
    'HX_COLD_IN_P': 7.0,  # barg
    'HX_COLD_IN_T': 60.0,  # degC
    'HX_COLD_IN_F': 49.68,  # t/h (13.8 kg/s)
    'HX_COLD_OUT_P': 6.5,  # barg
}
SHARE = 0.995


def si(r):
    return {
        'ph_in': r['HX_HOT_IN_P'] * 1e5 + P_ATM,
        'Th_in': r['HX_HOT_IN_T'] + 273.15,
        'mh': r['HX_HOT_IN_F'] / 3.6,
        'ph_out': r['HX_HOT_OUT_P'] * 1e5 + P_ATM,
        'Th_out': r['HX_HOT_OUT_T'] + 273.15,
        'pc_in': r['HX_COLD_IN_P'] * 1e5 + P_ATM,
        'Tc_in': r['HX_COLD_IN_T'] + 273.15,
        'mc': r['HX_COLD_IN_F'] / 3.6,
        'pc_out': r['HX_COLD_OUT_P'] * 1e5 + P_ATM,
        'Tc_out': r['HX_COLD_OUT_T'] + 273.15,
    }


# Cold outlet temperature: the cold side takes SHARE of the hot side's heat (bisection on IF97).
base = si({**readings, 'HX_COLD_OUT_T': 0.0})
q_hot = base['mh'] * (hs(base['ph_in'], base['Th_in'])[0] - hs(base['ph_out'], base['Th_out'])[0])
h_target = hs(base['pc_in'], base['Tc_in'])[0] + SHARE * q_hot / base['mc']
lo, hi = base['Tc_in'], base['Tc_in'] + 100.0
for _ in range(200):
    mid = 0.5 * (lo + hi)
    if hs(base['pc_out'], mid)[0] < h_target:
        lo = mid
    else:
        hi = mid
readings['HX_COLD_OUT_T'] = 0.5 * (lo + hi) - 273.15


def balance(r):
    s = si(r)
    F = s['mh'] * (psi(s['ph_in'], s['Th_in']) - psi(s['ph_out'], s['Th_out']))
    P = s['mc'] * (psi(s['pc_out'], s['Tc_out']) - psi(s['pc_in'], s['Tc_in']))
    sg = s['mh'] * (hs(s['ph_out'], s['Th_out'])[1] - hs(s['ph_in'], s['Th_in'])[1]) + s['mc'] * (hs(s['pc_out'], s['Tc_out'])[1] - hs(s['pc_in'], s['Tc_in'])[1])
    return {'fuel_W': F, 'product_W': P, 'destruction_W': F - P, 'efficiency': P / F, 'entropyGeneration_W_per_K': sg}


# Standard uncertainties in each reading's own unit, as the links state them.
def u_of(tag, value):
    if tag.endswith('_P'):
        return 0.005 * abs(value)  # 0.5 % of the barg reading
    if tag.endswith('_T'):
        return 0.5  # K = degC difference
    return 0.01 * abs(value)  # 1 % of the flow reading


expected = balance(readings)
var = {'efficiency': 0.0, 'destruction_W': 0.0}
for tag, v in readings.items():
    u = u_of(tag, v)
    h = 1e-6 * max(abs(v), u)
    up = balance({**readings, tag: v + h})
    dn = balance({**readings, tag: v - h})
    for k in var:
        c = (up[k] - dn[k]) / (2 * h)
        var[k] += (c * u) ** 2
expected['efficiency_U'] = 2 * var['efficiency'] ** 0.5
expected['destruction_U_W'] = 2 * var['destruction_W'] ** 0.5

out = {
    'generator': 'tests/engine/engine-reference.py',
    'library': 'iapws (python3-iapws, IAPWS-IF97 class IAPWS97)',
    'library_version': iapws.__version__,
    'debian_package_version': debian_version(),
    'dead_state': {'T0_K': T0, 'p0_Pa': P0},
    'p_atm_Pa': P_ATM,
    'plant': 'invented example plant',
    'heatExchanger': {'readings': readings, 'expected': expected},
}
with open(OUT, 'w') as f:
    json.dump(out, f, indent=1)
    f.write('\n')
print(json.dumps(out, indent=1))
