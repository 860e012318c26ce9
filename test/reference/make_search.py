#!/usr/bin/python3
"""Reference values for tapsheet's design search (lib/search).

Run with Debian's interpreter:  /usr/bin/python3 test/reference/make_search.py
It writes test/reference/search.json next to this script. Every case names the
reference function that produced it and the SciPy / NumPy versions.

- IIR minimum orders: scipy.signal.buttord, cheb1ord, cheb2ord, ellipord (fs in Hz).
- Kaiser window length and beta: scipy.signal.kaiserord.
- Smallest equiripple length: scipy.signal.remez at every length from a
  starting point upward, each design measured with scipy.signal.freqz on a
  dense grid of each band; the first length meeting both limits is recorded.
"""
import json
import os

import numpy as np
import scipy
from scipy import signal

VERSION = f"SciPy {scipy.__version__}, NumPy {np.__version__} (Debian python3-scipy)"

out = {"generator": "test/reference/make_search.py", "versions": VERSION}

# ---------------------------------------------------------------- IIR minimum orders
orders = []
for fam, fn in [("butterworth", signal.buttord), ("chebyshev1", signal.cheb1ord),
                ("chebyshev2", signal.cheb2ord), ("elliptic", signal.ellipord)]:
    for shape, wp, ws, gp, gs, fs in [
        ("lowpass", 4000.0, 5000.0, 0.5, 50.0, 44100.0),
        ("lowpass", 200.0, 260.0, 0.1, 80.0, 2000.0),
        ("highpass", 1200.0, 900.0, 1.0, 45.0, 16000.0),
        ("bandpass", [2000.0, 3000.0], [1600.0, 3600.0], 1.0, 55.0, 16000.0),
        ("bandstop", [900.0, 1400.0], [1000.0, 1200.0], 0.5, 40.0, 8000.0),
    ]:
        n, wn = fn(wp, ws, gp, gs, fs=fs)
        orders.append({"name": f"{fam} {shape} {wp}/{ws} Hz Ap={gp} As={gs} fs={fs}",
                       "reference": f"scipy.signal.{fn.__name__}", "version": VERSION,
                       "family": fam, "response": shape, "fs": fs, "passband": wp, "stopband": ws,
                       "passbandRippleDb": gp, "stopbandAttenuationDb": gs, "order": int(n)})
out["iirOrders"] = orders

# ---------------------------------------------------------------- Kaiser window length
kaiser = []
for a, width, fs in [(60.0, 500.0, 8000.0), (45.0, 2000.0, 48000.0), (80.0, 100.0, 2000.0),
                     (30.0, 300.0, 8000.0)]:
    numtaps, beta = signal.kaiserord(a, width / (fs / 2))
    kaiser.append({"reference": "scipy.signal.kaiserord", "version": VERSION,
                   "attenuationDb": a, "transitionWidth": width, "fs": fs,
                   "length": int(numtaps), "beta": float(beta)})
out["kaiser"] = kaiser


# ---------------------------------------------------------------- smallest equiripple length
def band_levels(taps, fs, bands):
    """(min dB, max dB) of |H| on each band, freqz on 8192 points per band plus the edges."""
    levels = []
    for lo, hi in bands:
        f = np.linspace(lo, hi, 8192)
        _, h = signal.freqz(taps, worN=f, fs=fs)
        db = 20 * np.log10(np.maximum(np.abs(h), 1e-300))
        levels.append((float(db.min()), float(db.max())))
    return levels


def smallest_equiripple(case):
    fs = case["fs"]
    kinds = case["kinds"]  # "pass" or "stop" per band
    bands = case["bands"]
    gp = 10 ** (case["rippleDb"] / 20)
    dp = (gp - 1) / (gp + 1)
    ds = 10 ** (-case["attenuationDb"] / 20)
    weight = [1.0 if k == "pass" else dp / ds for k in kinds]
    desired = [1.0 if k == "pass" else 0.0 for k in kinds]
    edges = [e for b in bands for e in b]
    # Requirement bands: the design bands, except that edges at 0 and fs/2 stay.
    n = case["start"]
    while True:
        if case["odd"] and n % 2 == 0:
            n += 1
            continue
        taps = signal.remez(n, edges, desired, weight=weight, fs=fs)
        levels = band_levels(taps, fs, bands)
        ok = True
        for k, (lo, hi) in zip(kinds, levels):
            if k == "pass" and hi - lo > case["rippleDb"]:
                ok = False
            if k == "stop" and -hi < case["attenuationDb"]:
                ok = False
        if ok:
            return n
        n += 1


equiripple = []
for case in [
    {"name": "lowpass 0.4π/0.6π, δp = 0.01, δs = 0.001 (Oppenheim & Schafer's example)",
     "fs": 2.0, "bands": [[0.0, 0.4], [0.6, 1.0]], "kinds": ["pass", "stop"],
     "rippleDb": float(20 * np.log10(1.01 / 0.99)), "attenuationDb": 60.0, "start": 20, "odd": False},
    {"name": "lowpass 3.4/4 kHz at 16 kHz, 0.5 dB, 50 dB",
     "fs": 16000.0, "bands": [[0.0, 3400.0], [4000.0, 8000.0]], "kinds": ["pass", "stop"],
     "rippleDb": 0.5, "attenuationDb": 50.0, "start": 40, "odd": False},
    {"name": "highpass 1/1.5 kHz at 8 kHz, 1 dB, 40 dB",
     "fs": 8000.0, "bands": [[0.0, 1000.0], [1500.0, 4000.0]], "kinds": ["stop", "pass"],
     "rippleDb": 1.0, "attenuationDb": 40.0, "start": 11, "odd": True},
    {"name": "bandpass 1.2–2 kHz at 8 kHz, 0.5 dB, 45 dB",
     "fs": 8000.0, "bands": [[0.0, 900.0], [1200.0, 2000.0], [2400.0, 4000.0]],
     "kinds": ["stop", "pass", "stop"], "rippleDb": 0.5, "attenuationDb": 45.0, "start": 20,
     "odd": False},
]:
    n = smallest_equiripple(case)
    equiripple.append({"name": case["name"], "reference": "scipy.signal.remez + scipy.signal.freqz",
                       "version": VERSION, "fs": case["fs"], "bands": case["bands"],
                       "kinds": case["kinds"], "rippleDb": case["rippleDb"],
                       "attenuationDb": case["attenuationDb"], "length": n})
out["equiripple"] = equiripple

path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "search.json")
with open(path, "w") as f:
    json.dump(out, f, indent=1)
    f.write("\n")
print(f"wrote {path} ({VERSION})")
