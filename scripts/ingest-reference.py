#!/usr/bin/python3
"""Reference hour statistics for the ingest shapes test (tests/ingest/reference-shapes.test.ts).

Writes, from ONE invented data set (boiler house B1 of the demo scenario, four hours of one-minute
readings of three tags), the export shapes under tests/fixtures/ingest/reference/ and, computed here
with pandas independently of Lossline's streaming aggregator, the expected statistics of every tag
hour of each shape in tests/fixtures/ingest-reference.json.

Definitions (as the tag-hours API gives them, docs/api.md):
- mean: time-weighted; the signal is linear between consecutive usable samples no more than 900 s
  apart; a rejected sample (bad quality) breaks the signal on both sides. Here it is integrated by
  brute force on a one-second grid (exact for a piecewise-linear signal whose breakpoints lie on
  whole seconds), each second credited to the local clock hour it starts in;
- min, max, first, last, samples: of the usable samples inside the hour [start, start + 1 h);
- covered fraction: seconds of the hour where the signal is drawn, over 3600.

Run: /usr/bin/python3 scripts/ingest-reference.py   (Debian python3-pandas)
"""
import csv
import json
import math
import os

import numpy as np
import pandas as pd

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
OUT_DIR = os.path.join(ROOT, "tests", "fixtures", "ingest", "reference")
OUT_JSON = os.path.join(ROOT, "tests", "fixtures", "ingest-reference.json")
MAX_GAP_S = 900
START = pd.Timestamp("2026-03-10T00:00:00Z")
ROWS = 240  # 00:00 .. 03:59
TAGS = ["B1.FT-101", "B1.PT-110", "B1.TT-111"]


def dataset():
    """The invented readings: tag -> list of (time, value), values as written (two decimals)."""
    data = {t: [] for t in TAGS}
    for i in range(ROWS):
        t = START + pd.Timedelta(minutes=i)
        data["B1.FT-101"].append((t, round(10000 + 1000 * math.sin(i / 17) + 3.7 * (i % 5), 2)))
        data["B1.PT-110"].append((t, round(40 + 0.01 * (i % 60), 2)))
        data["B1.TT-111"].append((t, round(480 + 5 * math.cos(i / 23), 2)))
    return data


def bad_quality(tag, i):
    """Samples the quality-pair file marks bad (their code is their reason)."""
    return tag == "B1.TT-111" and i % 7 == 3


def correction(i):
    """The newer shift file re-exports 02:15-02:29 with corrected pressures (+0.5)."""
    return 0.5 if 135 <= i < 150 else 0.0


def hour_stats(samples):
    """samples: list of (Timestamp, value or None for rejected). Returns a list of hour dicts."""
    s = pd.Series([v if v is not None else np.nan for _, v in samples], index=pd.DatetimeIndex([t for t, _ in samples]))
    usable = s.dropna()
    grouped = usable.groupby(usable.index.floor("h"))
    out = {}
    for hour, g in grouped:
        out[hour] = {"min": g.min(), "max": g.max(), "samples": int(g.count()), "first": g.iloc[0], "last": g.iloc[-1], "area": 0.0, "covered": 0}
    # one-second grid over each drawn segment
    times = s.index.asi8 // 10**9
    vals = s.to_numpy()
    for k in range(len(s) - 1):
        t0, t1, v0, v1 = times[k], times[k + 1], vals[k], vals[k + 1]
        if np.isnan(v0) or np.isnan(v1) or t1 - t0 > MAX_GAP_S or t1 <= t0:
            continue
        sec = np.arange(t0, t1)
        a = v0 + (v1 - v0) * (sec - t0) / (t1 - t0)
        b = v0 + (v1 - v0) * (sec + 1 - t0) / (t1 - t0)
        hours = pd.to_datetime(sec * 10**9, utc=True).floor("h")
        df = pd.DataFrame({"h": hours, "area": (a + b) / 2})
        for hour, g in df.groupby("h"):
            cell = out.setdefault(hour, {"min": None, "max": None, "samples": 0, "first": None, "last": None, "area": 0.0, "covered": 0})
            cell["area"] += float(g["area"].sum())
            cell["covered"] += int(len(g))
    rows = []
    for hour in sorted(out):
        c = out[hour]
        rows.append({
            "hourStart": hour.strftime("%Y-%m-%dT%H:%M:%S.000Z"),
            "mean": c["area"] / c["covered"] if c["covered"] > 0 else None,
            "min": None if c["min"] is None else float(c["min"]),
            "max": None if c["max"] is None else float(c["max"]),
            "samples": c["samples"],
            "first": None if c["first"] is None else float(c["first"]),
            "last": None if c["last"] is None else float(c["last"]),
            "coveredFraction": c["covered"] / 3600,
        })
    return rows


def write_csv(name, header, rows, **kw):
    with open(os.path.join(OUT_DIR, name), "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n", **kw)
        w.writerow(header)
        w.writerows(rows)


def iso(t):
    return t.strftime("%Y-%m-%d %H:%M:%S")


def main():
    os.makedirs(OUT_DIR, exist_ok=True)
    data = dataset()
    times = [t for t, _ in data[TAGS[0]]]
    col = {tag: [v for _, v in data[tag]] for tag in TAGS}

    # 1. plain comma file, decimal point
    write_csv("plain.csv", ["Time"] + TAGS, [[iso(t)] + [f"{col[g][i]:.2f}" for g in TAGS] for i, t in enumerate(times)])
    # 2. comma file whose flow is written with thousands groups and quoted, as spreadsheets save it
    write_csv("quoted-thousands.csv", ["Time"] + TAGS, [[iso(t), f"{col['B1.FT-101'][i]:,.2f}", f"{col['B1.PT-110'][i]:.2f}", f"{col['B1.TT-111'][i]:.2f}"] for i, t in enumerate(times)])
    # 3. value, quality pairs
    codes = lambda tag, i: "Comm Fail" if bad_quality(tag, i) else ("192" if tag == "B1.PT-110" else "Good")
    header = ["Time"] + [x for g in TAGS for x in (g, f"{g} Quality")]
    write_csv("quality-pairs.csv", header, [[iso(t)] + [x for g in TAGS for x in (f"{col[g][i]:.2f}", codes(g, i))] for i, t in enumerate(times)])
    # 4. two overlapping shift files: A 00:00-02:29, B 02:15-03:59 (B corrects 02:15-02:29)
    write_csv("shift-a.csv", ["Time"] + TAGS, [[iso(times[i])] + [f"{col[g][i]:.2f}" for g in TAGS] for i in range(150)])
    b_val = lambda g, i: round(col[g][i] + (correction(i) if g == "B1.PT-110" else 0.0), 2)
    write_csv("shift-b.csv", ["Time"] + TAGS, [[iso(times[i])] + [f"{b_val(g, i):.2f}" for g in TAGS] for i in range(135, ROWS)])

    truth = {}
    full = {g: hour_stats(data[g]) for g in TAGS}
    truth["plain.csv"] = full
    truth["quoted-thousands.csv"] = full
    truth["quality-pairs.csv"] = {g: hour_stats([(t, None if bad_quality(g, i) else v) for i, (t, v) in enumerate(data[g])]) for g in TAGS}
    truth["shift-a.csv+shift-b.csv"] = {g: hour_stats([(t, b_val(g, i) if i >= 135 else v) for i, (t, v) in enumerate(data[g])]) for g in TAGS}
    with open(OUT_JSON, "w") as f:
        json.dump({
            "source": "scripts/ingest-reference.py (pandas " + pd.__version__ + "): one-second brute-force integration of the invented data set",
            "timeZone": "UTC",
            "shapes": truth,
        }, f, indent=1)
        f.write("\n")


if __name__ == "__main__":
    main()
