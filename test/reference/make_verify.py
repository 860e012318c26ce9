#!/usr/bin/python3
"""Reference values for test/lib/verify and test/lib/fixed (tapsheet).

Run with Debian's SciPy:  /usr/bin/python3 test/reference/make_verify.py
Writes test/reference/verify.json. Each case names the SciPy functions used and
the version. Magnitudes are evaluated with scipy.signal.freqz / sosfreqz on a
dense grid (200001 points per band, band edges included); group delay with
scipy.signal.group_delay; poles with numpy.roots; step and impulse responses
with scipy.signal.sosfilt / lfilter.
"""
import json
import hashlib
import numpy as np
import scipy
import scipy.signal as sig

FS = 8000.0
N_GRID = 200001
out = {"generator": "test/reference/make_verify.py", "scipy": scipy.__version__,
       "numpy": np.__version__, "fs": FS, "cases": []}


def band_db(h_of, lo, hi):
    f = np.linspace(lo, hi, N_GRID)
    with np.errstate(divide="ignore"):
        db = np.maximum(20 * np.log10(np.abs(h_of(f))), -400.0)  # exact nulls floored like tapsheet
    return f, db


def summary(h_of, lo, hi):
    f, db = band_db(h_of, lo, hi)
    return {"from": lo, "to": hi, "maxDb": float(db.max()), "maxAt": float(f[db.argmax()]),
            "minDb": float(db.min()), "minAt": float(f[db.argmin()])}


def settling(y, final, tol):
    outside = np.nonzero(np.abs(y - final) > tol * abs(final))[0]
    return 0 if len(outside) == 0 else int(outside[-1] + 1)


# Case 1: windowed-sinc FIR from scipy.signal.firwin (Hamming), 31 taps, 1 kHz.
taps = sig.firwin(31, 1000, fs=FS)
fir_h = lambda f: sig.freqz(taps, [1], worN=f, fs=FS)[1]
w, gd = sig.group_delay((taps, [1]), w=np.linspace(0, 600, 101), fs=FS)
out["cases"].append({
    "name": "fir31", "source": "scipy.signal.firwin(31, 1000, fs=8000); freqz; group_delay",
    "design": {"kind": "fir", "taps": taps.tolist()},
    "passband": summary(fir_h, 0.0, 600.0),
    "stopband": summary(fir_h, 1600.0, 4000.0),
    "groupDelay": {"from": 0.0, "to": 600.0, "max": float(gd.max()), "min": float(gd.min())},
    "sha256": hashlib.sha256(np.asarray(taps, "<f8").tobytes()).hexdigest(),
})

# Case 2: Butterworth order 4, 1 kHz, as second-order sections.
sos = sig.butter(4, 1000, fs=FS, output="sos")
sos_h = lambda s: (lambda f: sig.sosfreqz(s, worN=f, fs=FS)[1])
b, a = sig.sos2tf(sos)
w, gd = sig.group_delay((b, a), w=np.linspace(0, 800, 401), fs=FS)
poles = np.roots(a)
step = sig.sosfilt(sos, np.ones(4000))
imp = sig.sosfilt(sos, np.r_[1.0, np.zeros(3999)])
out["cases"].append({
    "name": "butter4", "source": "scipy.signal.butter(4, 1000, fs=8000, output='sos'); sosfreqz; "
    "sos2tf + group_delay; numpy.roots; sosfilt",
    "design": {"kind": "sections", "sections": [
        {"b0": s[0], "b1": s[1], "b2": s[2], "a1": s[4], "a2": s[5]} for s in sos.tolist()]},
    "passband": summary(sos_h(sos), 0.0, 800.0),
    "stopband": summary(sos_h(sos), 2000.0, 4000.0),
    "groupDelay": {"from": 0.0, "to": 800.0, "max": float(gd.max()), "min": float(gd.min())},
    "poleRadius": float(np.abs(poles).max()),
    "settlingSamples2pct": settling(step, step[-1], 0.02),
    "impulseL1": float(np.abs(imp).sum()),
    "impulseL2": float(np.sqrt((imp ** 2).sum())),
    "sha256": hashlib.sha256(np.asarray([[s[0], s[1], s[2], s[4], s[5]] for s in sos], "<f8")
                             .tobytes()).hexdigest(),
})

# Case 3: elliptic order 6, 0.5 dB ripple, 60 dB attenuation, 1 kHz passband edge.
sos = sig.ellip(6, 0.5, 60, 1000, fs=FS, output="sos")
f, db = band_db(sos_h(sos), 1000.0, 4000.0)
stop_edge = float(np.ceil(f[np.nonzero(db <= -60)[0][0]]))  # first -60 dB crossing, rounded up to 1 Hz
out["cases"].append({
    "name": "ellip6", "source": "scipy.signal.ellip(6, 0.5, 60, 1000, fs=8000, output='sos'); sosfreqz",
    "design": {"kind": "sections", "sections": [
        {"b0": s[0], "b1": s[1], "b2": s[2], "a1": s[4], "a2": s[5]} for s in sos.tolist()]},
    "passband": summary(sos_h(sos), 0.0, 1000.0),
    "stopband": summary(sos_h(sos), stop_edge, 4000.0),
})

# Norms of a two-pole resonator 1/(1 - 2 r cos(t) z^-1 + r^2 z^-2), r = 0.9, t = pi/4, by lfilter.
r, t = 0.9, np.pi / 4
a_res = [1.0, -2 * r * np.cos(t), r * r]
h_res = sig.lfilter([1.0], a_res, np.r_[1.0, np.zeros(5999)])
out["resonator"] = {"source": "scipy.signal.lfilter([1], a, impulse of 6000 samples)",
                    "denominator": a_res, "l1": float(np.abs(h_res).sum()),
                    "l2": float(np.sqrt((h_res ** 2).sum())), "linf": float(np.abs(h_res).max())}

with open(__file__.replace("make_verify.py", "verify.json"), "w") as fh:
    json.dump(out, fh, indent=1)
    fh.write("\n")
print("wrote verify.json with", len(out["cases"]), "cases")
