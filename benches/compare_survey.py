#!/usr/bin/env python3
"""Compare `beltwright survey --layers 2 --feasible --format json` with survey_numpy.py's
CSV row by row: the same combinations, spans, factors and sigma_d (to 1e-9).

Usage: compare_survey.py survey.json numpy.csv
"""

import csv
import json
import math
import sys


def close(a, b, tol=1e-9):
    return abs(a - b) <= tol * max(1.0, abs(b))


def main():
    ours = json.load(open(sys.argv[1]))["rows"]
    ours = {(r["slots"], r["poles"]): r for r in ours if r["feasible"] and r["layers"] == 2}
    theirs = {(int(r["slots"]), int(r["poles"])): r for r in csv.DictReader(open(sys.argv[2]))}
    bad = []
    if set(ours) != set(theirs):
        bad.append(f"combinations differ: {sorted(set(ours) ^ set(theirs))[:10]}")
    spans = 0
    for key in sorted(set(ours) & set(theirs)):
        o, t = ours[key], theirs[key]
        spans += int(t["spans"])
        checks = [
            ("pitch", o["pitch"] == int(t["pitch"])),
            ("k_w1", close(o["winding"], float(t["k_w1"]))),
            ("k_w5", close(o["winding_5"], float(t["k_w5"]))),
            ("k_w7", close(o["winding_7"], float(t["k_w7"]))),
            ("sigma_d", close(o["differential_leakage"], float(t["sigma_d"]))),
            ("max pitch", o["max_winding_pitch"] == int(t["max_pitch"])),
            ("calm pitch", o["min_leakage_pitch"] == int(t["calm_pitch"])),
            ("calm sigma_d", close(o["min_leakage"], float(t["calm_sigma_d"]))),
            ("t", o["periodicity"] == int(t["t"])),
            ("paths", o["parallel_paths"] == [int(v) for v in t["paths"].split()]),
            ("sub", (o["lowest_subharmonic"] is None and t["sub"] == "")
             or (t["sub"] != "" and o["lowest_subharmonic"] is not None
                 and close(o["lowest_subharmonic"], float(t["sub"]), 1e-5))),
            ("spans", o["spans_scored"] == int(t["spans"])),
        ]
        for name, ok in checks:
            if not ok:
                bad.append(f"{key}: {name}")
    print(f"{len(ours)} combinations, {spans} spans compared; {len(bad)} differences")
    for b in bad[:20]:
        print("  ", b)
    sys.exit(1 if bad else 0)


if __name__ == "__main__":
    main()
