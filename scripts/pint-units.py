#!/usr/bin/env python3
"""Generates tests/fixtures/pint-units.json: unit conversions to SI computed with pint.

The fixture is an independent cross-check of src/lib/units: every row names the value, Lossline's
unit spelling, the quantity, the pint expression used, and pint's SI result. Run with Debian's
python3-pint (`apt-get install python3-pint`):

    python3 scripts/pint-units.py

Notes on pint's own names: pint's 'Btu' is the ISO Btu (1055.056 J) and its 'therm' is 1e5 ISO Btu,
so the rows use 'Btu_it' (International Table Btu) explicitly; pint's 'calorie' is the thermochemical
calorie (4.184 J), so kcal rows use 'cal_it'. Conventional water/mercury columns are built from
pint's 'water' (1000 kg/m3), 'Hg' (13595.1 kg/m3) and 'g_0'. Gauge rows add a site atmosphere
with pint; reference-condition gas volumes become mol/s with pint's molar gas constant.
"""
import json
import os

import pint

ureg = pint.UnitRegistry()
Q = ureg.Quantity

P_ATM_PA = 95_000.0  # invented site atmosphere for the gauge rows (a plant at about 550 m)

rows = []


def add(value, unit, quantity, pint_expr, si_unit, q=None, ctx=None):
    """Converts Q(value, pint_expr) (or a ready quantity q) to si_unit and records the row."""
    qty = q if q is not None else Q(value, pint_expr)
    row = {
        "value": value,
        "unit": unit,
        "quantity": quantity,
        "pint": pint_expr,
        "si_unit": si_unit,
        "si": float(qty.to(si_unit).magnitude),
    }
    if ctx is not None:
        row["ctx"] = ctx
    rows.append(row)


# pressure (absolute) and pressure difference
linear_pressure = [
    ("Pa", "Pa"), ("hPa", "hPa"), ("kPa", "kPa"), ("MPa", "MPa"), ("bar", "bar"), ("mbar", "mbar"),
    ("psi", "psi"), ("kg/cm2", "kilogram_force / centimeter ** 2"), ("atm", "atm"),
    ("mmHg", "mmHg"), ("Torr", "torr"), ("inHg", "inch * Hg * g_0"),
    ("inH2O", "inch * water * g_0"), ("mmH2O", "millimeter * water * g_0"), ("mH2O", "meter * water * g_0"),
]
for unit, expr in linear_pressure:
    add(12.345, unit, "pressure", expr, "Pa")
    add(0.75, unit, "pressureDifference", expr, "Pa")
for unit, expr in [("bara", "bar"), ("kPaa", "kPa"), ("MPaa", "MPa"), ("psia", "psi"), ("kg/cm2a", "kilogram_force / centimeter ** 2")]:
    add(7.5, unit, "pressure", expr, "Pa")
for unit, expr in [("barg", "bar"), ("mbarg", "mbar"), ("kPag", "kPa"), ("MPag", "MPa"), ("psig", "psi"), ("kg/cm2g", "kilogram_force / centimeter ** 2")]:
    v = 7.5
    add(v, unit, "pressure", f"{expr} + {P_ATM_PA} Pa", "Pa", q=Q(v, expr) + Q(P_ATM_PA, "Pa"), ctx={"p_atm_Pa": P_ATM_PA})

# temperature (offset scales) and temperature difference
for v in (-40.0, 0.0, 25.0, 540.0):
    add(v, "degC", "temperature", "degC", "K")
    add(v, "degF", "temperature", "degF", "K")
for v in (0.0, 491.67, 1000.0):
    add(v, "degR", "temperature", "degR", "K")
add(300.0, "K", "temperature", "K", "K")
for unit, expr in [("K", "K"), ("degC", "delta_degC"), ("degF", "delta_degF"), ("degR", "degR"),
                   ("degC-diff", "delta_degC"), ("degF-diff", "delta_degF")]:
    add(1.8, unit, "temperatureDifference", expr, "K")

# mass flow
for unit, expr in [("kg/s", "kg/s"), ("g/s", "g/s"), ("kg/min", "kg/min"), ("kg/h", "kg/hour"),
                   ("t/h", "metric_ton/hour"), ("t/d", "metric_ton/day"), ("lb/s", "lb/s"),
                   ("lb/min", "lb/min"), ("lb/h", "lb/hour"), ("klb/h", "1000 * lb/hour")]:
    v = 123.4
    if expr.startswith("1000 * "):
        add(v, unit, "massFlow", expr, "kg/s", q=Q(1000 * v, expr[len("1000 * "):]))
    else:
        add(v, unit, "massFlow", expr, "kg/s")

# volume flow (actual)
for unit, expr in [("m3/s", "m**3/s"), ("m3/min", "m**3/min"), ("m3/h", "m**3/hour"), ("m3/d", "m**3/day"),
                   ("l/s", "L/s"), ("l/min", "L/min"), ("l/h", "L/hour"), ("ft3/s", "ft**3/s"),
                   ("ft3/min", "ft**3/min"), ("ft3/h", "ft**3/hour"), ("gal/min", "gallon/minute")]:
    add(56.7, unit, "volumeFlow", expr, "m**3/s")

# gas volume at reference conditions -> ideal-gas amount flow n = p V / (R T)
refs = {
    "normal": (Q(0.0, "degC").to("K"), Q(101.325, "kPa")),
    "standard": (Q(15.0, "degC").to("K"), Q(101.325, "kPa")),
    "scf": (Q(60.0, "degF").to("K"), Q(14.696, "psi")),
}
for unit, vol_expr, ref in [("Nm3/s", "m**3/s", "normal"), ("Nm3/h", "m**3/hour", "normal"),
                            ("kNm3/h", "1000 * m**3/hour", "normal"), ("Nm3/d", "m**3/day", "normal"),
                            ("Sm3/h", "m**3/hour", "standard"), ("Sm3/d", "m**3/day", "standard"),
                            ("scfm", "ft**3/min", "scf"), ("scfh", "ft**3/hour", "scf"),
                            ("MMscfd", "1e6 * ft**3/day", "scf")]:
    v = 2.5
    T, p = refs[ref]
    if vol_expr.startswith("1000 * "):
        V = Q(1000 * v, vol_expr[len("1000 * "):])
    elif vol_expr.startswith("1e6 * "):
        V = Q(1e6 * v, vol_expr[len("1e6 * "):])
    else:
        V = Q(v, vol_expr)
    n = V * p / (ureg.molar_gas_constant * T)
    add(v, unit, "standardVolumeFlow", f"({vol_expr}) * p_ref / (R * T_ref), {ref} reference", "mol/s", q=n)

# power and heat flow
power = [("W", "W", 1), ("kW", "kW", 1), ("MW", "MW", 1), ("GW", "GW", 1), ("hp", "horsepower", 1),
         ("Btu/h", "Btu_it/hour", 1), ("kBtu/h", "Btu_it/hour", 1e3), ("MMBtu/h", "Btu_it/hour", 1e6),
         ("kcal/h", "kcal_it/hour", 1), ("Gcal/h", "Gcal_it/hour", 1), ("MJ/h", "MJ/hour", 1),
         ("GJ/h", "GJ/hour", 1), ("TR", "Btu_it/hour", 12000)]
for unit, expr, mult in power:
    for quantity in ("power", "heatFlow"):
        v = 3.21
        label = expr if mult == 1 else f"{mult:g} * {expr}"
        add(v, unit, quantity, label, "W", q=Q(v * mult, expr))

# energy
for unit, expr, mult in [("J", "J", 1), ("kJ", "kJ", 1), ("MJ", "MJ", 1), ("GJ", "GJ", 1), ("TJ", "TJ", 1),
                         ("Wh", "W*hour", 1), ("kWh", "kW*hour", 1), ("MWh", "MW*hour", 1), ("GWh", "GW*hour", 1),
                         ("Btu", "Btu_it", 1), ("MMBtu", "Btu_it", 1e6), ("therm", "Btu_it", 1e5),
                         ("therm(US)", "US_therm", 1), ("kcal", "kcal_it", 1), ("Mcal", "Mcal_it", 1),
                         ("Gcal", "Gcal_it", 1)]:
    v = 4.56
    label = expr if mult == 1 else f"{mult:g} * {expr}"
    add(v, unit, "energy", label, "J", q=Q(v * mult, expr))

# specific enthalpy
for unit, expr in [("J/kg", "J/kg"), ("kJ/kg", "kJ/kg"), ("MJ/kg", "MJ/kg"), ("Btu/lb", "Btu_it/lb"),
                   ("kcal/kg", "kcal_it/kg")]:
    add(1234.5, unit, "specificEnthalpy", expr, "J/kg")

# fractions: pint 0.19 defines neither 'percent' nor 'ppm', so only the plain fraction is checked here
add(3.5, "1", "fraction", "dimensionless", "dimensionless")

# density, speed, length
for unit, expr in [("kg/m3", "kg/m**3"), ("g/cm3", "g/cm**3"), ("g/l", "g/L"), ("lb/ft3", "lb/ft**3")]:
    add(0.8, unit, "density", expr, "kg/m**3")
for unit, expr in [("m/s", "m/s"), ("km/h", "km/hour"), ("ft/s", "ft/s"), ("ft/min", "ft/min")]:
    add(22.0, unit, "speed", expr, "m/s")
for unit, expr in [("m", "m"), ("mm", "mm"), ("cm", "cm"), ("km", "km"), ("in", "inch"), ("ft", "ft")]:
    add(9.5, unit, "length", expr, "m")

out = {
    "generator": "scripts/pint-units.py",
    "library": "pint",
    "library_version": pint.__version__,
    "note": "SI values computed by pint; Lossline's toSI must agree within 1e-9 relative.",
    "rows": rows,
}
path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "tests", "fixtures", "pint-units.json")
with open(path, "w", encoding="utf-8") as f:
    json.dump(out, f, indent=1)
    f.write("\n")
print(f"wrote {len(rows)} rows with pint {pint.__version__}")
