#!/usr/bin/python3
"""Side-by-side timing of tapsheet's IIR workloads against Debian SciPy.

Run from the repository root:  /usr/bin/python3 bench/side_by_side_iir.py
(For NumPy timing you may unset OPENBLAS_CORETYPE and OPENBLAS_L2_SIZE for this command only.)

Workloads (identical on both sides):
  1. filter 1e6 samples through an order-8 elliptic lowpass (0.1 dB / 80 dB, 4 kHz at 48 kHz)
     in second-order sections: scipy.signal.sosfilt vs tapsheet applySections (fresh output
     array per call, and into a reused output array);
  2. design an order-8 elliptic bandpass (1–2 kHz at 48 kHz, 0.5 dB / 70 dB) to sections:
     scipy.signal.ellip(output='sos') vs tapsheet designIir (target: under 5 ms).
Prints each time (best and median, ms) and our time ÷ theirs.
"""
import json
import subprocess
import time

import numpy as np
import scipy
from scipy import signal


def timed(fn, repeats):
    times = []
    for _ in range(repeats):
        t0 = time.perf_counter()
        fn()
        times.append((time.perf_counter() - t0) * 1000)
    times.sort()
    return {"best": times[0], "median": times[len(times) // 2]}


sos = signal.ellip(8, 0.1, 80, 4000, fs=48000, output="sos")
x = np.random.default_rng(1).uniform(-1, 1, 1_000_000)
for _ in range(3):
    signal.sosfilt(sos, x)
scipy_filter = timed(lambda: signal.sosfilt(sos, x), 20)
scipy_design = timed(lambda: signal.ellip(8, 0.5, 70, [1000, 2000], btype="bandpass", fs=48000, output="sos"), 200)

ours = json.loads(subprocess.run(["deno", "run", "bench/side_by_side_iir.ts"], check=True,
                                 capture_output=True, text=True).stdout)

print(f"SciPy {scipy.__version__}, NumPy {np.__version__}")
print(f"filter 1e6 samples, order-8 elliptic ({ours['sections']} sections):")
print(f"  tapsheet applySections  best {ours['filterMs']['best']:.2f} ms  median {ours['filterMs']['median']:.2f} ms")
print(f"  tapsheet, reused output best {ours['filterReusedMs']['best']:.2f} ms  median {ours['filterReusedMs']['median']:.2f} ms")
print(f"  scipy.signal.sosfilt    best {scipy_filter['best']:.2f} ms  median {scipy_filter['median']:.2f} ms")
print(f"  ours / theirs (best)    {ours['filterMs']['best'] / scipy_filter['best']:.2f}   "
      f"(median {ours['filterMs']['median'] / scipy_filter['median']:.2f})")
print(f"  reused output / theirs  {ours['filterReusedMs']['best'] / scipy_filter['best']:.2f}   "
      f"(median {ours['filterReusedMs']['median'] / scipy_filter['median']:.2f})")
print("order-8 elliptic bandpass design to sections:")
print(f"  tapsheet designIir      best {ours['designMs']['best']:.3f} ms  median {ours['designMs']['median']:.3f} ms  (target < 5 ms)")
print(f"  scipy.signal.ellip      best {scipy_design['best']:.3f} ms  median {scipy_design['median']:.3f} ms")
print(f"  ours / theirs (best)    {ours['designMs']['best'] / scipy_design['best']:.2f}   "
      f"(median {ours['designMs']['median'] / scipy_design['median']:.2f})")
