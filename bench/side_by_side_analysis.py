#!/usr/bin/python3
"""Time the analysis workloads with Debian's NumPy/SciPy; the same workloads as
bench/side_by_side_analysis.ts runs in Deno. Prints one JSON object of
millisecond timings (min and median over repeats) on stdout.

Run by bench/side_by_side_analysis.ts, or alone:
    /usr/bin/python3 bench/side_by_side_analysis.py
"""
import json
import sys
import time

import numpy as np
import scipy
import scipy.signal as sig


def timing(fn, repeats, inner=1):
    """Minimum and median per call over `repeats` batches of `inner` calls, in ms,
    both by wall clock and by the process's CPU time (time.process_time_ns), which
    does not count the time spent waiting for a core on a shared machine."""
    fn()  # warm-up
    wall = []
    cpu = []
    for _ in range(repeats):
        t = time.perf_counter()
        c = time.process_time_ns()
        for _ in range(inner):
            fn()
        cpu.append((time.process_time_ns() - c) / 1e6 / inner)
        wall.append((time.perf_counter() - t) * 1e3 / inner)
    wall.sort()
    cpu.sort()
    return {"min": wall[0], "median": wall[len(wall) // 2],
            "cpuMin": cpu[0], "cpuMedian": cpu[len(cpu) // 2]}


def main():
    rng = np.random.default_rng(1)
    x16 = rng.standard_normal(1 << 16)
    x6 = rng.standard_normal(1_000_000)
    h = rng.standard_normal(255)
    h32 = rng.standard_normal(32)
    X16 = np.fft.rfft(x16)
    one = np.array([1.0])
    result = {
        "versions": {"numpy": np.__version__, "scipy": scipy.__version__},
        # source: numpy.fft.rfft (pocketfft)
        "realFft65536": timing(lambda: np.fft.rfft(x16), repeats=40, inner=20),
        # source: numpy.fft.irfft (pocketfft), for information
        "inverseRealFft65536": timing(lambda: np.fft.irfft(X16, 1 << 16), repeats=40, inner=20),
        # source: scipy.signal.lfilter, a = [1]. SciPy 1.10 hands an FIR (len(a) == 1)
        # to numpy.convolve (a vectorised dot product per output sample).
        "fir255x1e6": timing(lambda: sig.lfilter(h, one, x6), repeats=7),
        # A short filter, for information: numpy.convolve's cost grows with the taps.
        "fir32x1e6": timing(lambda: sig.lfilter(h32, one, x6), repeats=7),
        # The same filter with a = [1, 0], which sends lfilter through its own C
        # transposed direct-form II loop (for information; not the target).
        "fir255x1e6GeneralLoop": timing(lambda: sig.lfilter(h, np.array([1.0, 0.0]), x6), repeats=3),
    }
    json.dump(result, sys.stdout)
    print()


if __name__ == "__main__":
    main()
