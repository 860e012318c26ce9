#!/usr/bin/python3
"""Reference vectors for tapsheet's FIR design code (lib/fir, lib/window/kaiser.ts, lib/multirate).

Run with Debian's interpreter: /usr/bin/python3 test/reference/make_fir_design.py
It writes test/reference/fir_design.json next to this script. Every case names
the SciPy function that produced it; the file records the SciPy and NumPy versions.
"""
import json
import os

import numpy as np
import scipy
from scipy import signal, special

out = {
    "generator": "test/reference/make_fir_design.py",
    "scipy": scipy.__version__,
    "numpy": np.__version__,
}


def arr(a):
    return [float(v) for v in np.asarray(a, dtype=float)]


# Bessel I0 over the range a Kaiser window uses and beyond.
xs = [0.0, 1e-8, 0.5, 1.0, 2.5, 5.0, 8.6, 14.9, 29.9, 30.1, 50.0, 120.0, 400.0, 700.0]
out["besselI0"] = {"function": "scipy.special.i0", "x": xs, "values": arr(special.i0(xs))}

kw = []
for n, beta, sym in [(1, 5.0, True), (2, 3.0, True), (11, 0.0, True), (11, 8.6, True),
                     (32, 5.653, True), (33, 14.0, True), (64, 6.0, False), (101, 40.0, True),
                     (17, 600.0, True)]:
    kw.append({"function": "scipy.signal.windows.kaiser", "length": n, "beta": beta,
               "symmetric": sym, "values": arr(signal.windows.kaiser(n, beta, sym=sym))})
out["kaiserWindows"] = kw

# Kaiser's formulas: numtaps and beta for a ripple (dB) and a width (fraction of Nyquist).
ko = []
for ripple_db, width in [(60.0, 0.2), (40.0, 0.05), (25.0, 0.1), (90.0, 0.01), (15.0, 0.3)]:
    numtaps, beta = signal.kaiserord(ripple_db, width)
    ko.append({"function": "scipy.signal.kaiserord", "attenuationDb": ripple_db,
               "widthOverNyquist": width, "numtaps": int(numtaps), "beta": float(beta),
               "kaiserBeta": float(signal.kaiser_beta(ripple_db))})
out["kaiserOrder"] = ko

# Window method. cutoff in Hz; response and firstBand are tapsheet's words for pass_zero.
ws = []
def win_case(length, fs, cutoff, response, window, first_pass, scipy_window):
    taps = signal.firwin(length, cutoff, window=scipy_window, pass_zero=first_pass, fs=fs)
    ws.append({"function": "scipy.signal.firwin", "length": length, "fs": fs,
               "cutoff": cutoff if isinstance(cutoff, list) else [cutoff], "response": response,
               "window": window, "taps": arr(taps)})

win_case(31, 8000.0, 1000.0, "lowpass", {"name": "hamming"}, True, "hamming")
win_case(51, 48000.0, 6000.0, "lowpass", {"name": "kaiser", "beta": 5.653}, True, ("kaiser", 5.653))
win_case(41, 1000.0, 200.0, "highpass", {"name": "hann"}, False, "hann")
win_case(61, 2.0, [0.3, 0.6], "bandpass", {"name": "blackman"}, False, "blackman")
win_case(63, 100.0, [10.0, 30.0], "bandstop", {"name": "kaiser", "beta": 8.0}, True, ("kaiser", 8.0))
win_case(81, 1.0, [0.1, 0.2, 0.3, 0.4], "multiband", {"name": "hamming"}, True, "hamming")
win_case(81, 1.0, [0.1, 0.2, 0.3], "multiband-stop", {"name": "rectangular"}, False, "boxcar")
win_case(30, 1.0, [0.1, 0.3], "bandpass", {"name": "hamming"}, False, "hamming")
out["windowedSinc"] = ws

# Parks-McClellan (Remez exchange). bands: [from, to, gain, weight] in Hz.
eq = []
def eq_case(length, fs, bands, kind="multiband", density=16, note=""):
    edges = [b for band in bands for b in band[:2]]
    desired = [band[2] for band in bands]
    weight = [band[3] for band in bands]
    scipy_type = {"multiband": "bandpass", "hilbert": "hilbert",
                  "differentiator": "differentiator"}[kind]
    if kind == "differentiator":
        # tapsheet's differentiator gain g means D(w) = g*w (w in rad/sample);
        # SciPy's desired d means D = d*f with f = w/(2*pi) cycles/sample.
        desired = [d * 2 * np.pi for d in desired]
    taps = signal.remez(length, edges, desired, weight=weight, type=scipy_type,
                        grid_density=density, fs=fs)
    eq.append({"function": "scipy.signal.remez", "length": length, "fs": fs,
               "bands": [list(map(float, b)) for b in bands], "kind": kind,
               "gridDensity": density, "note": note, "taps": arr(taps)})

eq_case(31, 1.0, [[0, 0.1, 1, 1], [0.15, 0.5, 0, 1]], note="type I lowpass")
eq_case(32, 1.0, [[0, 0.1, 1, 1], [0.15, 0.5, 0, 1]], note="type II lowpass")
eq_case(73, 48000.0, [[0, 4000, 0, 10], [5000, 9000, 1, 1], [10000, 24000, 0, 10]],
        note="bandpass, weighted stopbands")
eq_case(55, 2.0, [[0, 0.3, 1, 1], [0.4, 0.6, 0, 5], [0.7, 1.0, 1, 1]], note="bandstop")
eq_case(45, 1.0, [[0, 0.1, 0, 1], [0.15, 0.25, 1, 1], [0.3, 0.35, 0, 3], [0.4, 0.5, 0.5, 1]],
        note="multiband with a half-gain band")
eq_case(41, 1.0, [[0.05, 0.45, 1, 1]], kind="hilbert", note="type III Hilbert transformer")
eq_case(40, 1.0, [[0.05, 0.5, 1, 1]], kind="hilbert", note="type IV Hilbert transformer")
eq_case(32, 1.0, [[0, 0.4, 1, 1]], kind="differentiator", note="type IV differentiator")
eq_case(31, 1.0, [[0, 0.35, 1, 1], [0.42, 0.5, 0, 1]], kind="differentiator",
        note="type III lowpass differentiator")
eq_case(101, 1.0, [[0, 0.2, 1, 1], [0.23, 0.5, 0, 10]], note="101-tap lowpass")
eq_case(31, 1.0, [[0, 0.1, 1, 1], [0.15, 0.5, 0, 1]], density=32, note="denser grid")
out["equiripple"] = eq

# The benchmark workload (long design): compared on achieved ripple, not taps.
big = signal.remez(1023, [0, 0.2, 0.205, 0.5], [1, 0], weight=[1, 10], fs=1)
w, h = signal.freqz(big, worN=1 << 16, fs=1)
m = np.abs(h)
out["equirippleLong"] = {
    "function": "scipy.signal.remez + scipy.signal.freqz (65536 points)",
    "length": 1023, "fs": 1.0, "bands": [[0, 0.2, 1, 1], [0.205, 0.5, 0, 10]],
    "passbandDeviation": float(np.max(np.abs(m[w <= 0.2] - 1))),
    "stopbandPeak": float(np.max(m[w >= 0.205])),
}

# Hard multiband cases (wide transition bands, bands not reaching 0 or fs/2): compared on
# the weighted error each design achieves on a dense grid, not on taps.
hard = []
for n, bands in [
    (81, [[0.0, 0.13763953395726652, 1.0, 10.0], [0.15937379435704807, 0.24732989486034707, 0.0, 3.0],
          [0.35665020420610793, 0.49313669411218974, 0.0, 3.0]]),
    (69, [[0.0, 0.13205651580958294, 0.0, 3.0], [0.25432861763828724, 0.34074523116889827, 1.0, 10.0]]),
    (120, [[0.05, 0.15, 0.0, 1.0], [0.2, 0.3, 1.0, 1.0], [0.35, 0.45, 0.0, 1.0]]),
]:
    edges = [b for band in bands for b in band[:2]]
    taps = signal.remez(n, edges, [b[2] for b in bands], weight=[b[3] for b in bands], fs=1)
    w, h = signal.freqz(taps, worN=1 << 16, fs=1)
    m = np.abs(h)
    worst = max(float(np.max(np.abs(m[(w >= b[0]) & (w <= b[1])] - b[2]))) * b[3] for b in bands)
    hard.append({"function": "scipy.signal.remez + scipy.signal.freqz (65536 points)", "length": n,
                 "fs": 1.0, "bands": bands, "weightedError": worst})
out["equirippleHard"] = hard

# Weighted least squares (firls needs an odd length). bands: [from, to, gainFrom, gainTo, weight].
ls = []
def ls_case(length, fs, bands):
    edges = [b for band in bands for b in band[:2]]
    desired = [g for band in bands for g in band[2:4]]
    weight = [band[4] for band in bands]
    taps = signal.firls(length, edges, desired, weight=weight, fs=fs)
    ls.append({"function": "scipy.signal.firls", "length": length, "fs": fs,
               "bands": [list(map(float, b)) for b in bands], "taps": arr(taps)})

ls_case(31, 1.0, [[0, 0.1, 1, 1, 1], [0.15, 0.5, 0, 0, 1]])
ls_case(51, 48000.0, [[0, 4000, 0, 0, 10], [5000, 9000, 1, 1, 1], [10000, 24000, 0, 0, 10]])
ls_case(41, 2.0, [[0, 0.4, 1, 1, 1], [0.5, 0.7, 0, 0, 2], [0.8, 1.0, 1, 1, 1]])
ls_case(25, 1.0, [[0, 0.3, 0, 0.6, 1], [0.35, 0.5, 0, 0, 4]])
out["leastSquares"] = ls

# Frequency sampling. points: frequency (Hz) and gain, repeated frequency = a jump.
fsamp = []
def fs_case(length, fs, freqs, gains, window, scipy_window, antisymmetric=False, grid=None):
    kw = {"window": scipy_window, "fs": fs, "antisymmetric": antisymmetric}
    if grid is not None:
        kw["nfreqs"] = grid
    taps = signal.firwin2(length, freqs, gains, **kw)
    fsamp.append({"function": "scipy.signal.firwin2", "length": length, "fs": fs,
                  "frequencies": list(map(float, freqs)), "gains": list(map(float, gains)),
                  "window": window, "antisymmetric": antisymmetric,
                  "gridPoints": grid, "taps": arr(taps)})

fs_case(31, 2.0, [0, 0.5, 0.5, 1.0], [1, 1, 0, 0], {"name": "hamming"}, "hamming")
fs_case(64, 1000.0, [0, 100, 150, 500], [1, 1, 0, 0], None, None)
fs_case(45, 48000.0, [0, 3000, 4000, 8000, 9000, 24000], [0, 0, 1, 1, 0, 0],
        {"name": "kaiser", "beta": 6.0}, ("kaiser", 6.0), grid=257)
fs_case(33, 1.0, [0, 0.1, 0.1, 0.2, 0.2, 0.5], [0, 0, 1, 0.39, 0, 0], {"name": "hann"}, "hann")
fs_case(33, 1.0, [0, 0.25, 0.5], [0, 1, 0], None, None, antisymmetric=True)
fs_case(32, 1.0, [0, 0.25, 0.5], [0, 1, 1], {"name": "hamming"}, "hamming", antisymmetric=True)
out["frequencySampling"] = fsamp

# Polyphase resampling against upsample-filter-downsample (full output; tapsheet
# produces the first ceil(len(x)*up/down) samples).
rng = np.random.default_rng(1234)
up = []
for u, d, ntaps, nx in [(1, 3, 24, 50), (4, 1, 17, 20), (3, 2, 31, 40), (2, 5, 40, 61), (1, 1, 5, 9)]:
    x = rng.standard_normal(nx)
    h = signal.firwin(ntaps, 0.9 / max(u, d))
    y = signal.upfirdn(h, x, up=u, down=d)
    up.append({"function": "scipy.signal.upfirdn", "up": u, "down": d, "taps": arr(h),
               "signal": arr(x), "output": arr(y)})
out["polyphase"] = up

# Half-band lowpass: the plain Remez design on the full band spec is the reference.
hb = []
for n, fs_, fp in [(23, 48000.0, 9000.0), (47, 1.0, 0.2), (11, 2.0, 0.3)]:
    taps = signal.remez(n, [0, fp, fs_ / 2 - fp, fs_ / 2], [1, 0], fs=fs_)
    hb.append({"function": "scipy.signal.remez", "length": n, "fs": fs_, "passbandEdge": fp,
               "taps": arr(taps)})
out["halfband"] = hb

# Zeros of FIR filters (numpy.roots on the taps, highest power first).
zs = []
for name, taps in [("remez 31-tap lowpass", signal.remez(31, [0, 0.1, 0.15, 0.5], [1, 0])),
                   ("firwin 20-tap lowpass", signal.firwin(20, 0.3)),
                   ("arbitrary", np.array([1.0, -2.5, 3.25, 0.5, -1.0, 0.0]))]:
    r = np.roots(taps)
    zs.append({"function": "numpy.roots", "name": name, "taps": arr(taps),
               "zeros": [[float(z.real), float(z.imag)] for z in r]})
out["zeros"] = zs

here = os.path.dirname(os.path.abspath(__file__))
with open(os.path.join(here, "fir_design.json"), "w") as f:
    json.dump(out, f, indent=1)
print("wrote", os.path.join(here, "fir_design.json"))
