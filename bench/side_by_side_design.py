#!/usr/bin/python3
"""Time SciPy's Remez routine on tapsheet's equiripple benchmark workloads.

Run by bench/side_by_side_design.ts (or alone): /usr/bin/python3 bench/side_by_side_design.py
Prints one JSON object: SciPy/NumPy versions, median and best time per design (seconds),
the achieved passband deviation and stopband peak (65536-point grid), and what the
over-met 0.02-transition design does.
"""
import json
import statistics
import sys
import time

import numpy as np
import scipy
from scipy import signal

REPEATS = int(sys.argv[1]) if len(sys.argv) > 1 else 15


def design():
    return signal.remez(1023, [0, 0.2, 0.205, 0.5], [1, 0], weight=[1, 10], fs=1)


design()  # warm-up
times = []
for _ in range(REPEATS):
    t0 = time.perf_counter()
    taps = design()
    times.append(time.perf_counter() - t0)
w, h = signal.freqz(taps, worN=1 << 16, fs=1)
m = np.abs(h)

t0 = time.perf_counter()
try:
    signal.remez(1023, [0, 0.2, 0.22, 0.5], [1, 0], weight=[1, 10], fs=1)
    over = "returned taps"
except Exception as e:  # SciPy raises ValueError on failure to converge
    over = f"{type(e).__name__}: {e}"
over_time = time.perf_counter() - t0

print(json.dumps({
    "scipy": scipy.__version__,
    "numpy": np.__version__,
    "remez1023": {
        "median": statistics.median(times),
        "best": min(times),
        "repeats": REPEATS,
        "passbandDeviation": float(np.max(np.abs(m[w <= 0.2] - 1))),
        "stopbandPeak": float(np.max(m[w >= 0.205])),
    },
    "overMet": {"outcome": over, "seconds": over_time},
}))
