#!/usr/bin/env python3
"""Independent reference balances for tests/equipment/reference.test.ts.

Run with the Debian system interpreter (the one that sees the apt package python3-iapws):

    python3 scripts/equipment-reference.py

It writes tests/fixtures/equipment-reference.json. The tests read that file; they never call Python.

Every figure is worked here from first principles, without the TypeScript engine:
  water and steam  iapws.IAPWS97 (IAPWS-IF97, R7-97(2012)) from Debian's python3-iapws
  ideal gases      the NASA Glenn 9-coefficient polynomials (McBride, Zehe & Gordon, NASA/TP-2002-211556,
                   eqs. 4.9-4.11), implemented below; the coefficients are the thermo.inp blocks
                   (release 9/09/04) as transcribed into the project's species table
                   (src/lib/thermo/species-data.ts); mixture entropy with -R sum x ln(x p / 1 bar)
  chemical exergy  Szargut, Morris & Steward (1988) standard values as listed in docs/domain.md s.4,
                   ideal-solution mixture e = sum x e_i + R T0 sum x ln x
  combustion       complete combustion in standard dry air (NASA 'Air': N2 0.78084, O2 0.209476,
                   Ar 0.009365, CO2 0.000319) with the excess air solved from the measured dry O2
  liquids          incompressible: psi = cp [(T - T0) - T0 ln(T/T0)] + (p - p0) / rho
  balances         SPECO fuel/product/loss per docs/domain.md s.3 (Bejan, Tsatsaronis & Moran 1996
                   ch. 3; Lazzaretto & Tsatsaronis 2006), D = F - P - L

The example plant is invented. Each case carries the TypeScript unit model (plain JSON), its inputs by
vector-entry name in SI, and the expected F, P, L, D, efficiency (and companions).
"""
import math
import os

import iapws
from iapws import IAPWS97
from reference_common import debian_version, fixture_path, write_fixture

OUT = fixture_path('equipment-reference.json')

T0 = 298.15
P0 = 101325.0
R = 8.31446261815324  # J/(mol K), exact SI value N_A k
P_REF = 1e5
G = 9.80665


# ----------------------------------------------------------------------------------- water (IF97)

def w_pt(p, T):
    st = IAPWS97(P=p / 1e6, T=T)
    return st.h * 1e3, st.s * 1e3


def w_px(p, x):
    st = IAPWS97(P=p / 1e6, x=x)
    return st.h * 1e3, st.s * 1e3


def w_ph(p, h):
    st = IAPWS97(P=p / 1e6, h=h / 1e3)
    return st.s * 1e3, st.T, (st.x if st.region == 4 else None)


def w_h_ps(p, s):
    return IAPWS97(P=p / 1e6, s=s / 1e3).h * 1e3


W_H0, W_S0 = w_pt(P0, T0)


def w_psi(h, s):
    return h - W_H0 - T0 * (s - W_S0)


# ------------------------------------------------------------------------- ideal gases (NASA-9)

NASA = {  # name: (M g/mol, [(a1..a7, (b1, b2)) for 200-1000 K, 1000-6000 K])
    'CH4': (16.04246, [
        ([-176685.0998, 2786.18102, -12.0257785, 0.0391761929, -3.61905443e-05, 2.026853043e-08, -4.97670549e-12], [-23313.1436, 89.0432275]),
        ([3730042.76, -13835.01485, 20.49107091, -0.001961974759, 4.72731304e-07, -3.72881469e-11, 1.623737207e-15], [75320.6691, -121.9124889]),
    ]),
    'C2H6': (30.06904, [
        ([-186204.4161, 3406.19186, -19.51705092, 0.0756583559, -8.20417322e-05, 5.0611358e-08, -1.319281992e-11], [-27029.3289, 129.8140496]),
        ([5025782.13, -20330.22397, 33.2255293, -0.00383670341, 7.23840586e-07, -7.3191825e-11, 3.065468699e-15], [111596.395, -203.9410584]),
    ]),
    'Ar': (39.948, [
        ([0.0, 0.0, 2.5, 0.0, 0.0, 0.0, 0.0], [-745.375, 4.37967491]),
        ([20.10538475, -0.0599266107, 2.500069401, -3.99214116e-08, 1.20527214e-11, -1.819015576e-15, 1.078576636e-19], [-744.993961, 4.37918011]),
    ]),
    'CO2': (44.0095, [
        ([49436.5054, -626.411601, 5.30172524, 0.002503813816, -2.127308728e-07, -7.68998878e-10, 2.849677801e-13], [-45281.9846, -7.04827944]),
        ([117696.2419, -1788.791477, 8.29152319, -9.22315678e-05, 4.86367688e-09, -1.891053312e-12, 6.33003659e-16], [-39083.5059, -26.52669281]),
    ]),
    'H2O': (18.01528, [
        ([-39479.6083, 575.573102, 0.931782653, 0.00722271286, -7.34255737e-06, 4.95504349e-09, -1.336933246e-12], [-33039.7431, 17.24205775]),
        ([1034972.096, -2412.698562, 4.64611078, 0.002291998307, -6.83683048e-07, 9.42646893e-11, -4.82238053e-15], [-13842.86509, -7.97814851]),
    ]),
    'N2': (28.0134, [
        ([22103.71497, -381.846182, 6.08273836, -0.00853091441, 1.384646189e-05, -9.62579362e-09, 2.519705809e-12], [710.846086, -10.76003744]),
        ([587712.406, -2239.249073, 6.06694922, -0.00061396855, 1.491806679e-07, -1.923105485e-11, 1.061954386e-15], [12832.10415, -15.86640027]),
    ]),
    'O2': (31.9988, [
        ([-34255.6342, 484.700097, 1.119010961, 0.00429388924, -6.83630052e-07, -2.0233727e-09, 1.039040018e-12], [-3391.45487, 18.4969947]),
        ([-1037939.022, 2344.830282, 1.819732036, 0.001267847582, -2.188067988e-07, 2.053719572e-11, -8.19346705e-16], [-16890.10929, 17.38716506]),
    ]),
}

SZARGUT_kJ_per_mol = {'N2': 0.72, 'O2': 3.97, 'CO2': 19.87, 'H2O': 9.50, 'Ar': 11.69, 'CH4': 831.65, 'C2H6': 1495.84}

DRY_AIR = {'N2': 0.78084, 'O2': 0.209476, 'Ar': 0.009365, 'CO2': 0.000319}


def nasa_H(name, T):
    """Molar enthalpy [J/mol] (formation included), NASA/TP-2002-211556 eq. 4.10."""
    a, b = NASA[name][1][0 if T <= 1000 else 1]
    return R * T * (-a[0] / T**2 + a[1] * math.log(T) / T + a[2] + a[3] * T / 2 + a[4] * T**2 / 3
                    + a[5] * T**3 / 4 + a[6] * T**4 / 5 + b[0] / T)


def nasa_S(name, T):
    """Standard molar entropy at 1 bar [J/(mol K)], eq. 4.11."""
    a, b = NASA[name][1][0 if T <= 1000 else 1]
    return R * (-a[0] / T**2 / 2 - a[1] / T + a[2] * math.log(T) + a[3] * T + a[4] * T**2 / 2
                + a[5] * T**3 / 3 + a[6] * T**4 / 4 + b[1])


class Mix:
    def __init__(self, x):
        tot = sum(x.values())
        self.x = {k: v / tot for k, v in x.items() if v > 0}
        self.M = sum(v * NASA[k][0] for k, v in self.x.items()) / 1000  # kg/mol

    def h(self, T):
        return sum(v * nasa_H(k, T) for k, v in self.x.items()) / self.M

    def s(self, T, p):
        return sum(v * (nasa_S(k, T) - R * math.log(v * p / P_REF)) for k, v in self.x.items()) / self.M

    def psi(self, T, p):
        return self.h(T) - self.h(T0) - T0 * (self.s(T, p) - self.s(T0, P0))

    def ech(self):
        e = sum(v * (SZARGUT_kJ_per_mol[k] * 1e3 + R * T0 * math.log(v)) for k, v in self.x.items())
        return e / self.M

    def T_h(self, h):
        lo, hi = 200.0, 3000.0
        for _ in range(200):
            mid = 0.5 * (lo + hi)
            if self.h(mid) < h:
                lo = mid
            else:
                hi = mid
        return 0.5 * (lo + hi)

    def T_ps(self, p, s):
        lo, hi = 200.0, 3000.0
        for _ in range(200):
            mid = 0.5 * (lo + hi)
            if self.s(mid, p) < s:
                lo = mid
            else:
                hi = mid
        return 0.5 * (lo + hi)


def liq_psi(cp, rho, T, p):
    return cp * ((T - T0) - T0 * math.log(T / T0)) + (p - P0) / rho


def result(F, P, L, extra=None):
    d = {'fuel_W': F, 'product_W': P, 'loss_W': L, 'destruction_W': F - (P or 0) - L,
         'efficiency': (P / F) if P is not None else None}
    if extra:
        d.update(extra)
    return d


WATER = {'kind': 'water'}
AIR = {'kind': 'air'}
cases = []


def case(cid, kind, model, inputs, expected, note):
    inputs = dict(inputs)
    inputs.setdefault('T0_K', T0)
    inputs.setdefault('p0_Pa', P0)
    cases.append({'id': cid, 'kind': kind, 'note': note, 'model': model, 'inputs': inputs, 'expected': expected})


# ---- turbine: extraction condensing turbine, electric power, wet exhaust from the energy balance
def turbine():
    m_in, p_in, T_in = 14.0, 6.0e6, 758.15
    m_x, p_x = 3.5, 0.5e6
    p_e = 9e3
    eta_gen = 0.978
    h_in, s_in = w_pt(p_in, T_in)
    h_x = h_in - 0.82 * (h_in - w_h_ps(p_x, s_in))
    T_x = IAPWS97(P=p_x / 1e6, h=h_x / 1e3).T
    h_x, s_x = w_pt(p_x, T_x)
    m_e = m_in - m_x
    h_e_design = h_in - 0.80 * (h_in - w_h_ps(p_e, s_in))
    W_el = eta_gen * (m_in * h_in - m_x * h_x - m_e * h_e_design)
    W = W_el / eta_gen
    h_e = (m_in * h_in - m_x * h_x - W) / m_e  # energy balance, docs/domain.md s.3
    s_e, _, x_e = w_ph(p_e, h_e)
    F = m_in * w_psi(h_in, s_in) - m_x * w_psi(h_x, s_x) - m_e * w_psi(h_e, s_e)
    ideal = m_x * (h_in - w_h_ps(p_x, s_in)) + m_e * (h_in - w_h_ps(p_e, s_in))
    eta_s = (m_x * (h_in - h_x) + m_e * (h_in - h_e)) / ideal
    case('turbine-extraction-wet-exhaust', 'turbine', {
        'powerMeasured': 'electric',
        'ports': [
            {'name': 'main-steam', 'direction': 'in', 'fluid': WATER},
            {'name': 'extraction', 'direction': 'out', 'fluid': WATER},
            {'name': 'exhaust', 'direction': 'out', 'fluid': WATER, 'state': 'energy-balance', 'flow': 'mass-balance'},
        ],
    }, {
        'main-steam.mDot_kg_per_s': m_in, 'main-steam.p_Pa': p_in, 'main-steam.T_K': T_in,
        'extraction.mDot_kg_per_s': m_x, 'extraction.p_Pa': p_x, 'extraction.T_K': T_x,
        'exhaust.p_Pa': p_e, 'power_W': W_el, 'generatorEfficiency': eta_gen,
    }, result(F, W, 0.0, {'isentropicEfficiency': eta_s, 'exhaust_x': x_e}),
        'extraction turbine; exhaust h = (m_in h_in - m_x h_x - W_el/eta_gen) / m_exh; eta_s mass-weighted over outlets')


# ---- expander: natural-gas pressure let-down expander (gas mixture), shaft power, 3 % heat loss
def expander():
    gas = {'CH4': 0.93, 'C2H6': 0.04, 'CO2': 0.01, 'N2': 0.02}
    mix = Mix(gas)
    m, p1, T1, p2 = 6.0, 4.0e6, 363.15, 1.0e6
    s1 = mix.s(T1, p1)
    T2s = mix.T_ps(p2, s1)
    h1 = mix.h(T1)
    h2 = h1 - 0.8 * (h1 - mix.h(T2s))
    T2 = mix.T_h(h2)
    W = 0.97 * m * (h1 - h2)
    F = m * (mix.psi(T1, p1) - mix.psi(T2, p2))
    eta_s = (h1 - mix.h(T2)) / (h1 - mix.h(T2s))
    fl = {'kind': 'gas', 'fractions': gas, 'basis': 'mole'}
    case('expander-gas-letdown', 'expander', {
        'ports': [
            {'name': 'inlet', 'direction': 'in', 'fluid': fl},
            {'name': 'outlet', 'direction': 'out', 'fluid': fl, 'flow': 'mass-balance'},
        ],
    }, {'inlet.mDot_kg_per_s': m, 'inlet.p_Pa': p1, 'inlet.T_K': T1, 'outlet.p_Pa': p2, 'outlet.T_K': T2, 'power_W': W},
        result(F, W, 0.0, {'isentropicEfficiency': eta_s}), 'gas expander, physical exergy of the mixture')


# ---- compressor: air compressor, electric power with motor efficiency
def compressor():
    air = Mix(DRY_AIR)
    m, p1, T1, p2, T2 = 5.0, 0.98e5, 293.15, 7.5e5, 575.15
    W_el, eta_m = 1.55e6, 0.955
    W = W_el * eta_m
    P = m * (air.psi(T2, p2) - air.psi(T1, p1))
    T2s = air.T_ps(p2, air.s(T1, p1))
    eta_s = (air.h(T2s) - air.h(T1)) / (air.h(T2) - air.h(T1))
    case('compressor-air-electric', 'compressor', {
        'powerMeasured': 'electric',
        'ports': [
            {'name': 'suction', 'direction': 'in', 'fluid': AIR},
            {'name': 'discharge', 'direction': 'out', 'fluid': AIR, 'flow': 'mass-balance'},
        ],
    }, {'suction.mDot_kg_per_s': m, 'suction.p_Pa': p1, 'suction.T_K': T1, 'discharge.p_Pa': p2, 'discharge.T_K': T2,
        'power_W': W_el, 'motorEfficiency': eta_m},
        result(W, P, 0.0, {'isentropicEfficiency': eta_s}), 'F = W_el eta_motor; P = m (psi_out - psi_in)')


# ---- pump: boiler feed pump, shaft power
def pump():
    m, p1, T1, p2, T2, W = 14.0, 0.3e6, 377.15, 7.3e6, 378.35, 128e3
    h1, s1 = w_pt(p1, T1)
    h2, s2 = w_pt(p2, T2)
    P = m * (w_psi(h2, s2) - w_psi(h1, s1))
    eta_s = (w_h_ps(p2, s1) - h1) / (h2 - h1)
    case('pump-feedwater', 'pump', {
        'ports': [
            {'name': 'suction', 'direction': 'in', 'fluid': WATER},
            {'name': 'discharge', 'direction': 'out', 'fluid': WATER, 'flow': 'mass-balance'},
        ],
    }, {'suction.mDot_kg_per_s': m, 'suction.p_Pa': p1, 'suction.T_K': T1, 'discharge.p_Pa': p2, 'discharge.T_K': T2, 'power_W': W},
        result(W, P, 0.0, {'isentropicEfficiency': eta_s}), 'water pump, IF97 states')


# ---- fan: forced-draught fan, outlet state from the energy balance (no outlet temperature tag)
def fan():
    air = Mix(DRY_AIR)
    m, p1, T1, p2, W = 16.0, 1.0e5, 298.15, 1.065e5, 120e3
    h2 = air.h(T1) + W / m
    T2 = air.T_h(h2)
    P = m * (air.psi(T2, p2) - air.psi(T1, p1))
    T2s = air.T_ps(p2, air.s(T1, p1))
    eta_s = (air.h(T2s) - air.h(T1)) / (h2 - air.h(T1))
    case('fan-outlet-from-energy-balance', 'fan', {
        'ports': [
            {'name': 'inlet', 'direction': 'in', 'fluid': AIR},
            {'name': 'outlet', 'direction': 'out', 'fluid': AIR, 'flow': 'mass-balance', 'state': 'energy-balance'},
        ],
    }, {'inlet.mDot_kg_per_s': m, 'inlet.p_Pa': p1, 'inlet.T_K': T1, 'outlet.p_Pa': p2, 'power_W': W},
        result(W, P, 0.0, {'isentropicEfficiency': eta_s}), 'h_out = h_in + W/m, T_out solved from h')


# ---- heat exchanger: steam-heated water heater, condensate leaves saturated
def heat_exchanger():
    mh, ph_in, Th_in, ph_out = 1.2, 0.5e6, 470.0, 0.48e6
    mc, pc_in, Tc_in, pc_out, Tc_out = 13.8, 0.8e6, 333.15, 0.75e6, 378.15
    hhi, shi = w_pt(ph_in, Th_in)
    hho, sho = w_px(ph_out, 0.0)
    hci, sci = w_pt(pc_in, Tc_in)
    hco, sco = w_pt(pc_out, Tc_out)
    F = mh * (w_psi(hhi, shi) - w_psi(hho, sho))
    P = mc * (w_psi(hco, sco) - w_psi(hci, sci))
    case('heat-exchanger-steam-water', 'heat-exchanger', {
        'ports': [
            {'name': 'steam-in', 'role': 'hot', 'direction': 'in', 'fluid': WATER},
            {'name': 'condensate-out', 'role': 'hot', 'direction': 'out', 'fluid': WATER, 'flow': 'mass-balance', 'state': 'sat-liquid'},
            {'name': 'water-in', 'role': 'cold', 'direction': 'in', 'fluid': WATER},
            {'name': 'water-out', 'role': 'cold', 'direction': 'out', 'fluid': WATER, 'flow': 'mass-balance'},
        ],
    }, {'steam-in.mDot_kg_per_s': mh, 'steam-in.p_Pa': ph_in, 'steam-in.T_K': Th_in, 'condensate-out.p_Pa': ph_out,
        'water-in.mDot_kg_per_s': mc, 'water-in.p_Pa': pc_in, 'water-in.T_K': Tc_in, 'water-out.p_Pa': pc_out, 'water-out.T_K': Tc_out},
        result(F, P, 0.0, {'hotDuty_W': mh * (hhi - hho), 'coldDuty_W': mc * (hco - hci)}),
        'F = hot-side decrease, P = cold-side increase (all streams above T0)')


# ---- boiler: gas-fired, dry O2, reheat line and blowdown
def boiler():
    fuel_x = {'CH4': 0.93, 'C2H6': 0.04, 'CO2': 0.01, 'N2': 0.02}
    fuel = Mix(fuel_x)
    m_f, p_f, T_f = 1.12, 3e5, 293.15
    p_a, T_a = 1.03e5, 303.15
    p_g, T_g, y = 1.01e5, 418.15, 0.032
    # complete combustion per mol fuel; excess air from dry O2 (mass balance)
    C = sum(v * {'CH4': 1, 'C2H6': 2, 'CO2': 1}.get(k, 0) for k, v in fuel.x.items())
    H = sum(v * {'CH4': 4, 'C2H6': 6}.get(k, 0) for k, v in fuel.x.items())
    O = sum(v * {'CO2': 2}.get(k, 0) for k, v in fuel.x.items())
    N = sum(v * {'N2': 2}.get(k, 0) for k, v in fuel.x.items())
    O2min = C + H / 4 - O / 2
    K = C + N / 2
    A = (O2min + y * (K - O2min)) / (DRY_AIR['O2'] - y)  # mol dry air per mol fuel
    flue_n = {'CO2': C + A * DRY_AIR['CO2'], 'H2O': H / 2, 'N2': N / 2 + A * DRY_AIR['N2'],
              'O2': A * DRY_AIR['O2'] - O2min, 'Ar': A * DRY_AIR['Ar']}
    flue = Mix(flue_n)
    air = Mix(DRY_AIR)
    n_f = m_f / fuel.M
    m_a = n_f * A * air.M
    m_g = n_f * sum(flue_n.values()) * flue.M
    lam = A * DRY_AIR['O2'] / O2min
    # water side
    m_fw, p_fw, T_fw = 14.15, 7.2e6, 378.15
    p_st, T_st = 6.2e6, 763.15
    m_bd, p_bd = 0.15, 6.5e6
    m_rh, p_crh, T_crh, p_hrh, T_hrh = 11.0, 2.5e6, 603.15, 2.3e6, 813.15
    hfw, sfw = w_pt(p_fw, T_fw)
    hst, sst = w_pt(p_st, T_st)
    hbd, sbd = w_px(p_bd, 0.0)
    hcr, scr = w_pt(p_crh, T_crh)
    hhr, shr = w_pt(p_hrh, T_hrh)
    m_st = m_fw - m_bd
    F = m_f * (fuel.psi(T_f, p_f) + fuel.ech()) + m_a * (air.psi(T_a, p_a) + air.ech())
    P = m_st * w_psi(hst, sst) - m_fw * w_psi(hfw, sfw) + m_rh * (w_psi(hhr, shr) - w_psi(hcr, scr))
    L_stack_ph = m_g * flue.psi(T_g, p_g)
    L_stack_ch = m_g * flue.ech()
    L = L_stack_ph + L_stack_ch + m_bd * w_psi(hbd, sbd)
    case('boiler-gas-reheat-blowdown', 'boiler', {
        'ports': [
            {'name': 'fuel', 'role': 'fuel', 'direction': 'in', 'fluid': {'kind': 'fuel-gas', 'composition': fuel_x}},
            {'name': 'air', 'role': 'air', 'direction': 'in', 'fluid': AIR, 'flow': 'fuel-ratio'},
            {'name': 'stack', 'role': 'flue-gas', 'direction': 'out', 'fluid': {'kind': 'flue-gas', 'o2Basis': 'dry'}, 'flow': 'fuel-ratio'},
            {'name': 'feedwater', 'role': 'water', 'direction': 'in', 'fluid': WATER},
            {'name': 'main-steam', 'role': 'water', 'direction': 'out', 'fluid': WATER, 'flow': 'mass-balance'},
            {'name': 'blowdown', 'role': 'blowdown', 'direction': 'out', 'fluid': WATER, 'state': 'sat-liquid'},
            {'name': 'cold-reheat', 'role': 'water', 'group': 'reheat', 'direction': 'in', 'fluid': WATER},
            {'name': 'hot-reheat', 'role': 'water', 'group': 'reheat', 'direction': 'out', 'fluid': WATER, 'flow': 'mass-balance'},
        ],
    }, {
        'fuel.mDot_kg_per_s': m_f, 'fuel.p_Pa': p_f, 'fuel.T_K': T_f, 'air.p_Pa': p_a, 'air.T_K': T_a,
        'stack.p_Pa': p_g, 'stack.T_K': T_g, 'stack.O2_fraction': y,
        'feedwater.mDot_kg_per_s': m_fw, 'feedwater.p_Pa': p_fw, 'feedwater.T_K': T_fw,
        'main-steam.p_Pa': p_st, 'main-steam.T_K': T_st, 'blowdown.mDot_kg_per_s': m_bd, 'blowdown.p_Pa': p_bd,
        'cold-reheat.mDot_kg_per_s': m_rh, 'cold-reheat.p_Pa': p_crh, 'cold-reheat.T_K': T_crh,
        'hot-reheat.p_Pa': p_hrh, 'hot-reheat.T_K': T_hrh,
    }, result(F, P, L, {'lambda': lam, 'airFlow_kg_per_s': m_a, 'flueGasFlow_kg_per_s': m_g,
                        'stackLossPhysical_W': L_stack_ph, 'stackLossChemical_W': L_stack_ch}),
        'F = fuel (physical + chemical) + air (physical + chemical); P = water side incl. reheat; L = stack (physical + chemical) + blowdown')


# ---- valve: let-down station, isenthalpic outlet
def valve():
    m, p1, T1, p2 = 2.0, 6.0e6, 758.15, 0.5e6
    h1, s1 = w_pt(p1, T1)
    s2, _, _ = w_ph(p2, h1)
    F = m * (w_psi(h1, s1) - w_psi(h1, s2))
    case('valve-letdown-isenthalpic', 'valve', {
        'ports': [
            {'name': 'inlet', 'direction': 'in', 'fluid': WATER},
            {'name': 'outlet', 'direction': 'out', 'fluid': WATER, 'flow': 'mass-balance', 'state': 'energy-balance'},
        ],
    }, {'inlet.mDot_kg_per_s': m, 'inlet.p_Pa': p1, 'inlet.T_K': T1, 'outlet.p_Pa': p2},
        result(F, None, 0.0), 'h_out = h_in; D = F, no product')


# ---- mixer: two air streams, roles by specific exergy against the outlet
def mixer():
    air = Mix(DRY_AIR)
    m1, p1, T1 = 3.0, 1.2e5, 473.15
    m2, p2, T2 = 7.0, 1.15e5, 303.15
    m3 = m1 + m2
    p3 = 1.1e5
    T3 = air.T_h((m1 * air.h(T1) + m2 * air.h(T2)) / m3) - 0.3  # mixed-air thermometer reads 0.3 K low
    psi1, psi2, psi3 = air.psi(T1, p1), air.psi(T2, p2), air.psi(T3, p3)
    assert psi1 > psi3 > psi2
    F = m1 * psi1 - (m3 - m2) * psi3
    P = m2 * (psi3 - psi2)
    case('mixer-air-streams', 'mixer', {
        'ports': [
            {'name': 'hot-air', 'direction': 'in', 'fluid': AIR},
            {'name': 'cold-air', 'direction': 'in', 'fluid': AIR},
            {'name': 'mixed', 'direction': 'out', 'fluid': AIR, 'flow': 'mass-balance'},
        ],
    }, {'hot-air.mDot_kg_per_s': m1, 'hot-air.p_Pa': p1, 'hot-air.T_K': T1, 'cold-air.mDot_kg_per_s': m2,
        'cold-air.p_Pa': p2, 'cold-air.T_K': T2, 'mixed.p_Pa': p3, 'mixed.T_K': T3},
        result(F, P, 0.0), 'F = hot stream exergy decrease, P = cold stream exergy increase')


# ---- deaerator: heating-steam flow from the energy balance, saturated feedwater, vent
def deaerator():
    p_s, T_s = 0.5e6, 468.15
    m_c, p_c, T_c = 12.5, 0.6e6, 318.15
    p_o = 0.12e6
    m_v, p_v = 0.02, 0.12e6
    hs, ss = w_pt(p_s, T_s)
    hc, sc = w_pt(p_c, T_c)
    ho, so = w_px(p_o, 0.0)
    hv, sv = w_px(p_v, 1.0)
    u = (m_c * (ho - hc) + m_v * (hv - ho)) / (hs - ho)
    m_o = u + m_c - m_v
    F = u * w_psi(hs, ss) - (m_o - m_c) * w_psi(ho, so)
    P = m_c * (w_psi(ho, so) - w_psi(hc, sc))
    L = m_v * w_psi(hv, sv)
    case('deaerator-steam-from-energy-balance', 'deaerator', {
        'ports': [
            {'name': 'heating-steam', 'direction': 'in', 'fluid': WATER, 'flow': 'energy-balance'},
            {'name': 'condensate', 'direction': 'in', 'fluid': WATER},
            {'name': 'feedwater', 'direction': 'out', 'fluid': WATER, 'flow': 'mass-balance', 'state': 'sat-liquid'},
            {'name': 'vent', 'role': 'vent', 'direction': 'out', 'fluid': WATER, 'state': 'sat-vapour'},
        ],
    }, {'heating-steam.p_Pa': p_s, 'heating-steam.T_K': T_s, 'condensate.mDot_kg_per_s': m_c, 'condensate.p_Pa': p_c,
        'condensate.T_K': T_c, 'feedwater.p_Pa': p_o, 'vent.mDot_kg_per_s': m_v, 'vent.p_Pa': p_v},
        result(F, P, L, {'steamFlow_kg_per_s': u}), 'steam flow from mass + energy balance; vent is a loss')


# ---- open feedwater heater: explicit hot/cold roles, measured flows
def ofwh():
    m_s, p_s, T_s = 1.1, 0.25e6, 423.15
    m_c, p_c, T_c = 9.0, 0.3e6, 333.15
    p_o = 0.24e6
    h_s, s_s = w_pt(p_s, T_s)
    h_c, s_c = w_pt(p_c, T_c)
    h_o = (m_s * h_s + m_c * h_c) / (m_s + m_c)
    T_o = IAPWS97(P=p_o / 1e6, h=h_o / 1e3).T - 0.4  # outlet thermometer reads a little low
    h_o, s_o = w_pt(p_o, T_o)
    m_o = m_s + m_c
    F = m_s * w_psi(h_s, s_s) - (m_o - m_c) * w_psi(h_o, s_o)
    P = m_c * (w_psi(h_o, s_o) - w_psi(h_c, s_c))
    case('open-feedwater-heater-roles', 'open-feedwater-heater', {
        'ports': [
            {'name': 'bleed-steam', 'role': 'hot', 'direction': 'in', 'fluid': WATER},
            {'name': 'condensate', 'role': 'cold', 'direction': 'in', 'fluid': WATER},
            {'name': 'outlet', 'direction': 'out', 'fluid': WATER, 'flow': 'mass-balance'},
        ],
    }, {'bleed-steam.mDot_kg_per_s': m_s, 'bleed-steam.p_Pa': p_s, 'bleed-steam.T_K': T_s, 'condensate.mDot_kg_per_s': m_c,
        'condensate.p_Pa': p_c, 'condensate.T_K': T_c, 'outlet.p_Pa': p_o, 'outlet.T_K': T_o},
        result(F, P, 0.0), 'hot/cold designated by the model')


# ---- condenser: wet exhaust by quality, cooling-water flow from the energy balance
def condenser():
    m, p, x = 10.5, 9e3, 0.93
    p_ci, T_ci, p_co, T_co = 2.5e5, 299.15, 1.8e5, 308.15
    hi, si = w_px(p, x)
    ho, so = w_px(p, 0.0)
    hci, sci = w_pt(p_ci, T_ci)
    hco, sco = w_pt(p_co, T_co)
    m_cw = m * (hi - ho) / (hco - hci)
    F = m * (w_psi(hi, si) - w_psi(ho, so))
    L = m_cw * (w_psi(hco, sco) - w_psi(hci, sci))
    case('condenser-cooling-flow-from-energy-balance', 'condenser', {
        'ports': [
            {'name': 'exhaust', 'role': 'process', 'direction': 'in', 'fluid': WATER, 'state': 'px'},
            {'name': 'hotwell', 'role': 'process', 'direction': 'out', 'fluid': WATER, 'flow': 'mass-balance', 'state': 'sat-liquid'},
            {'name': 'cw-in', 'role': 'cooling', 'direction': 'in', 'fluid': WATER, 'flow': 'energy-balance'},
            {'name': 'cw-out', 'role': 'cooling', 'direction': 'out', 'fluid': WATER, 'flow': 'mass-balance'},
        ],
    }, {'exhaust.mDot_kg_per_s': m, 'exhaust.p_Pa': p, 'exhaust.x': x, 'hotwell.p_Pa': p,
        'cw-in.p_Pa': p_ci, 'cw-in.T_K': T_ci, 'cw-out.p_Pa': p_co, 'cw-out.T_K': T_co},
        result(F, None, L, {'coolingFlow_kg_per_s': m_cw}), 'F = process decrease; L = cooling-water increase; D = F - L')


# ---- cooler: thermal-oil cooler without cooling-side data (heat rejected at T0)
def cooler():
    cp, rho = 2300.0, 850.0
    m, p1, T1, p2, T2 = 5.0, 4e5, 553.15, 3.6e5, 423.15
    F = m * (liq_psi(cp, rho, T1, p1) - liq_psi(cp, rho, T2, p2))
    fl = {'kind': 'liquid', 'cp_J_per_kgK': cp, 'rho_kg_per_m3': rho}
    case('cooler-oil-no-cooling-side', 'cooler', {
        'ports': [
            {'name': 'oil-in', 'role': 'process', 'direction': 'in', 'fluid': fl},
            {'name': 'oil-out', 'role': 'process', 'direction': 'out', 'fluid': fl, 'flow': 'mass-balance'},
        ],
    }, {'oil-in.mDot_kg_per_s': m, 'oil-in.p_Pa': p1, 'oil-in.T_K': T1, 'oil-out.p_Pa': p2, 'oil-out.T_K': T2},
        result(F, None, 0.0), 'no cooling-side data: heat leaves at T0, D = F')


def machines():
    case('motor-feed-pump-drive', 'motor', {}, {'powerIn_W': 150e3, 'powerOut_W': 142.5e3},
         result(150e3, 142.5e3, 0.0, {'energyEfficiency': 142.5e3 / 150e3}), 'epsilon = energy efficiency')
    case('generator-turbine-set', 'generator', {}, {'powerIn_W': 11.45e6, 'powerOut_W': 11.2e6},
         result(11.45e6, 11.2e6, 0.0, {'energyEfficiency': 11.2e6 / 11.45e6}), 'epsilon = energy efficiency')


# ---- generic control volume: thermal-oil dryer (heat to the product at Tb, casing loss at Tb2)
def generic():
    cp, rho = 2300.0, 850.0
    m, p1, T1, p2, T2 = 5.0, 4e5, 553.15, 3.5e5, 513.15
    Q, Tb, Q2, Tb2 = 440e3, 423.15, 20e3, 318.15
    F = m * (liq_psi(cp, rho, T1, p1) - liq_psi(cp, rho, T2, p2))
    P = (1 - T0 / Tb) * Q
    L = (1 - T0 / Tb2) * Q2
    fl = {'kind': 'liquid', 'cp_J_per_kgK': cp, 'rho_kg_per_m3': rho}
    case('generic-oil-dryer', 'generic', {
        'ports': [
            {'name': 'oil-in', 'role': 'fuel', 'direction': 'in', 'fluid': fl},
            {'name': 'oil-out', 'role': 'fuel', 'direction': 'out', 'fluid': fl, 'flow': 'mass-balance'},
        ],
        'heats': [
            {'name': 'dryer-heat', 'role': 'product', 'direction': 'out'},
            {'name': 'casing-loss', 'role': 'loss', 'direction': 'out'},
        ],
    }, {'oil-in.mDot_kg_per_s': m, 'oil-in.p_Pa': p1, 'oil-in.T_K': T1, 'oil-out.p_Pa': p2, 'oil-out.T_K': T2,
        'dryer-heat.Q_W': Q, 'dryer-heat.Tb_K': Tb, 'casing-loss.Q_W': Q2, 'casing-loss.Tb_K': Tb2},
        result(F, P, L), 'user-designated terms; heat exergy (1 - T0/Tb) Q')


# ---- port states (psi, eCh) for portState
def port_states():
    rows = []
    for p, T in [(6.0e6, 758.15), (0.3e6, 377.15), (2.0e4, 330.0)]:
        h, s = w_pt(p, T)
        rows.append({'fluid': WATER, 'm': {'p_Pa': p, 'T_K': T}, 'h': h, 's': s, 'psi': w_psi(h, s), 'eCh': None})
    for p, x in [(9e3, 0.93), (1.0e6, 0.5)]:
        h, s = w_px(p, x)
        rows.append({'fluid': WATER, 'm': {'p_Pa': p, 'x': x}, 'h': h, 's': s, 'psi': w_psi(h, s), 'eCh': None})
    h = 2.4e6
    s, _, _ = w_ph(1.5e4, h)
    rows.append({'fluid': WATER, 'm': {'p_Pa': 1.5e4, 'h_J_per_kg': h}, 'h': h, 's': s, 'psi': w_psi(h, s), 'eCh': None})
    air = Mix(DRY_AIR)
    rows.append({'fluid': AIR, 'm': {'p_Pa': 7.5e5, 'T_K': 503.15}, 'h': air.h(503.15), 's': air.s(503.15, 7.5e5),
                 'psi': air.psi(503.15, 7.5e5), 'eCh': air.ech()})
    fx = {'CH4': 0.93, 'C2H6': 0.04, 'CO2': 0.01, 'N2': 0.02}
    fm = Mix(fx)
    rows.append({'fluid': {'kind': 'fuel-gas', 'composition': fx}, 'm': {'p_Pa': 3e5, 'T_K': 293.15}, 'h': fm.h(293.15),
                 's': fm.s(293.15, 3e5), 'psi': fm.psi(293.15, 3e5), 'eCh': fm.ech()})
    rows.append({'fluid': {'kind': 'liquid', 'cp_J_per_kgK': 2300.0, 'rho_kg_per_m3': 850.0}, 'm': {'p_Pa': 4e5, 'T_K': 553.15},
                 'h': None, 's': None, 'psi': liq_psi(2300.0, 850.0, 553.15, 4e5), 'eCh': None})
    return rows


for f in (turbine, expander, compressor, pump, fan, heat_exchanger, boiler, valve, mixer, deaerator, ofwh, condenser, cooler,
          machines, generic):
    f()

doc = {
    'generator': 'scripts/equipment-reference.py',
    'library': 'iapws (python3-iapws, IAPWS-IF97 class IAPWS97) for water; NASA-9 polynomials and SPECO balances implemented in the script',
    'library_version': iapws.__version__,
    'debian_package_version': debian_version(),
    'dead_state': {'T0_K': T0, 'p0_Pa': P0},
    'units': 'SI: W, kg/s, Pa, K, J/kg, J/(kg K)',
    'plant': 'invented example plant',
    'cases': cases,
    'portStates': port_states(),
}
write_fixture(OUT, doc)
print(f'wrote {len(cases)} cases to {os.path.relpath(OUT)}')
