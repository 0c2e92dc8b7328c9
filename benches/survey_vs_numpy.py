#!/usr/bin/env python3
"""Side-by-side whole-process timing: `beltwright survey` against survey_numpy.py doing the
same work (every span of every double-layer combination, slots 6..=360, poles 2..=96), with
the outputs compared row by row first. Needs NumPy (pip install numpy) and a release build
(cargo build --release).

Usage: python3 benches/survey_vs_numpy.py [RUNS]
"""

import os
import statistics
import subprocess
import sys
import tempfile
import time

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
BIN = os.path.join(ROOT, "target", "release", "beltwright")
SURVEY = [BIN, "survey", "--slots", "6..=360", "--poles", "2..=96", "--layers", "2",
          "--feasible", "--format", "json"]
NUMPY = [sys.executable, os.path.join(HERE, "survey_numpy.py"), "6", "360", "2", "96"]


def timed(cmd, runs):
    times = []
    for _ in range(runs):
        start = time.perf_counter()
        subprocess.run(cmd, stdout=subprocess.DEVNULL, check=True)
        times.append(time.perf_counter() - start)
    return statistics.median(times), times


def main():
    runs = int(sys.argv[1]) if len(sys.argv) > 1 else 5
    with tempfile.TemporaryDirectory() as tmp:
        ours, theirs = os.path.join(tmp, "survey.json"), os.path.join(tmp, "numpy.csv")
        with open(ours, "w") as f:
            subprocess.run(SURVEY, stdout=f, check=True)
        with open(theirs, "w") as f:
            subprocess.run(NUMPY, stdout=f, check=True)
        subprocess.run([sys.executable, os.path.join(HERE, "compare_survey.py"), ours, theirs],
                       check=True)
    t_numpy, _ = timed(NUMPY, runs)
    t_ours, _ = timed(SURVEY, runs * 10)
    print(f"numpy script:      {t_numpy * 1000:9.1f} ms (median of {runs})")
    print(f"beltwright survey: {t_ours * 1000:9.1f} ms (median of {runs * 10})")
    print(f"ratio:             {t_numpy / t_ours:9.0f}x")


if __name__ == "__main__":
    main()
