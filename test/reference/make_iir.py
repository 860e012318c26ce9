#!/usr/bin/python3
"""Reference vectors for tapsheet's IIR half (lib/poly, lib/iir).

Run with Debian's interpreter:  /usr/bin/python3 test/reference/make_iir.py
It writes test/reference/iir.json next to this script. Every case names the
reference function that produced it and the SciPy / NumPy versions.
"""
import json
import os

import numpy as np
import scipy
from scipy import signal, special

VERSION = f"SciPy {scipy.__version__}, NumPy {np.__version__} (Debian python3-scipy)"


def cplx(values):
    return [[float(np.real(v)), float(np.imag(v))] for v in np.atleast_1d(values)]


def sos_rows(sos):
    # SciPy rows are [b0 b1 b2 a0 a1 a2] with a0 = 1.
    return [[float(v) for v in row] for row in sos]


out = {"generator": "test/reference/make_iir.py", "versions": VERSION}

# ---------------------------------------------------------------- polynomial roots
rng = np.random.default_rng(20261202)
poly_cases = []
for name, c in [
    ("cubic with one real and a complex pair", [1.0, -1.0, 1.0, -1.0]),
    ("Wilkinson-like degree 10 (roots 1..10)", np.poly(np.arange(1, 11)).tolist()),
    ("reverse Bessel polynomial degree 8", [1, 36, 630, 6930, 51975, 270270, 945945, 2027025, 2027025]),
    ("random degree 12", rng.standard_normal(13).tolist()),
    ("random degree 30", rng.standard_normal(31).tolist()),
    ("roots spread over six decades", np.poly([1e-3, -2e-2, 0.5, 3 + 4j, 3 - 4j, 250, -1e3]).real.tolist()),
    ("unit-circle roots of a linear-phase FIR", signal.firwin(21, 0.27, window=("kaiser", 5.0)).tolist()),
]:
    poly_cases.append({
        "name": name,
        "reference": "numpy.roots",
        "version": VERSION,
        "coefficients": [float(v) for v in c],
        "roots": cplx(np.roots(c)),
    })
out["polynomialRoots"] = poly_cases

# ---------------------------------------------------------------- analog prototypes
protos = []
for n in range(1, 11):
    z, p_, k = signal.buttap(n)
    protos.append({"name": f"Butterworth N={n}", "reference": "scipy.signal.buttap", "version": VERSION,
                   "family": "butterworth", "order": n, "zeros": cplx(z), "poles": cplx(p_), "gain": float(k)})
for n, rp in [(1, 0.5), (2, 1), (3, 0.1), (4, 3), (5, 0.5), (8, 0.01), (12, 1)]:
    z, p_, k = signal.cheb1ap(n, rp)
    protos.append({"name": f"Chebyshev I N={n} Rp={rp}", "reference": "scipy.signal.cheb1ap", "version": VERSION,
                   "family": "chebyshev1", "order": n, "rippleDb": rp, "zeros": cplx(z), "poles": cplx(p_), "gain": float(k)})
for n, rs in [(1, 20), (2, 40), (3, 60), (4, 30), (7, 80), (10, 100)]:
    z, p_, k = signal.cheb2ap(n, rs)
    protos.append({"name": f"Chebyshev II N={n} As={rs}", "reference": "scipy.signal.cheb2ap", "version": VERSION,
                   "family": "chebyshev2", "order": n, "attenuationDb": rs, "zeros": cplx(z), "poles": cplx(p_), "gain": float(k)})
for n, rp, rs in [(1, 1, 40), (2, 0.5, 30), (3, 0.1, 50), (4, 1, 60), (5, 0.5, 70), (6, 0.01, 90), (8, 0.5, 80), (9, 2, 100), (12, 0.1, 120)]:
    z, p_, k = signal.ellipap(n, rp, rs)
    protos.append({"name": f"Elliptic N={n} Rp={rp} As={rs}", "reference": "scipy.signal.ellipap", "version": VERSION,
                   "family": "elliptic", "order": n, "rippleDb": rp, "attenuationDb": rs,
                   "zeros": cplx(z), "poles": cplx(p_), "gain": float(k)})
for norm, ours in [("phase", "phase"), ("delay", "delay"), ("mag", "magnitude")]:
    for n in [1, 2, 3, 4, 5, 6, 8, 10, 12, 16, 20, 25]:
        z, p_, k = signal.besselap(n, norm=norm)
        protos.append({"name": f"Bessel N={n} norm={norm}", "reference": f"scipy.signal.besselap(norm='{norm}')",
                       "version": VERSION, "family": "bessel", "order": n, "normalisation": ours,
                       "zeros": cplx(z), "poles": cplx(p_), "gain": float(k)})
out["prototypes"] = protos

# ---------------------------------------------------------------- digital designs
ftype_name = {"butterworth": "butter", "chebyshev1": "cheby1", "chebyshev2": "cheby2",
              "elliptic": "ellip", "bessel": "bessel"}
designs = []
design_specs = [
    ("butterworth", "lowpass", 4, 48000.0, 1000.0, None, None, None),
    ("butterworth", "highpass", 5, 1000.0, 0.5, None, None, None),
    ("butterworth", "bandpass", 3, 8000.0, [300.0, 3400.0], None, None, None),
    ("butterworth", "bandstop", 2, 1000.0, [45.0, 55.0], None, None, None),
    ("chebyshev1", "lowpass", 6, 44100.0, 5000.0, 0.5, None, None),
    ("chebyshev1", "bandpass", 4, 16000.0, [1000.0, 2000.0], 1.0, None, None),
    ("chebyshev2", "lowpass", 5, 1000.0, 150.0, None, 60.0, None),
    ("chebyshev2", "highpass", 6, 48000.0, 40.0, None, 50.0, None),
    ("chebyshev2", "bandstop", 3, 2000.0, [90.0, 110.0], None, 40.0, None),
    ("elliptic", "lowpass", 8, 48000.0, 4000.0, 0.1, 80.0, None),
    ("elliptic", "highpass", 5, 8000.0, 300.0, 0.5, 60.0, None),
    ("elliptic", "bandpass", 8, 48000.0, [1000.0, 2000.0], 0.5, 70.0, None),
    ("elliptic", "bandstop", 4, 1000.0, [40.0, 70.0], 1.0, 50.0, None),
    ("bessel", "lowpass", 6, 1000.0, 100.0, None, None, "phase"),
    ("bessel", "highpass", 4, 1000.0, 100.0, None, None, "delay"),
    ("bessel", "bandpass", 3, 10000.0, [500.0, 1500.0], None, None, "magnitude"),
]
rng2 = np.random.default_rng(7)
x = rng2.standard_normal(3000)
for family, btype, n, fs, wn, rp, rs, norm in design_specs:
    kw = dict(N=n, Wn=wn, btype=btype, ftype=ftype_name[family], fs=fs)
    if rp is not None:
        kw["rp"] = rp
    if rs is not None:
        kw["rs"] = rs
    z, p_, k = signal.iirfilter(output="zpk", **kw) if family != "bessel" else signal.bessel(
        n, wn, btype=btype, output="zpk", norm={"phase": "phase", "delay": "delay", "magnitude": "mag"}[norm], fs=fs)
    if family != "bessel":
        sos = signal.iirfilter(output="sos", **kw)
        ref = f"scipy.signal.iirfilter(ftype='{ftype_name[family]}', output='zpk'/'sos')"
    else:
        sos = signal.bessel(n, wn, btype=btype, output="sos",
                            norm={"phase": "phase", "delay": "delay", "magnitude": "mag"}[norm], fs=fs)
        ref = "scipy.signal.bessel(output='zpk'/'sos')"
    freqs = np.linspace(0, fs / 2, 101)[:-1] + fs / 2 / 100 * 0.37
    w, h = signal.sosfreqz(sos, worN=freqs, fs=fs)
    case = {"name": f"{family} {btype} N={n}", "reference": ref, "version": VERSION,
            "options": {"family": family, "response": btype, "order": n, "fs": fs, "edges": wn},
            "zeros": cplx(z), "poles": cplx(p_), "gain": float(k),
            "responseReference": "scipy.signal.sosfreqz", "frequencies": [float(f) for f in freqs],
            "response": cplx(h)}
    if rp is not None:
        case["options"]["passbandRippleDb"] = rp
    if rs is not None:
        case["options"]["stopbandAttenuationDb"] = rs
    if norm is not None:
        case["options"]["besselNormalisation"] = norm
    designs.append(case)
out["designs"] = designs

# ---------------------------------------------------------------- filtering
filt = []
xs = rng2.standard_normal(2000)
for family, btype, n, fs, wn, rp, rs in [
    ("ellip", "lowpass", 8, 48000.0, 4000.0, 0.1, 80.0),
    ("ellip", "bandpass", 4, 48000.0, [1000.0, 2000.0], 0.5, 70.0),
    ("butter", "highpass", 3, 1000.0, 20.0, None, None),
]:
    kw = dict(N=n, Wn=wn, btype=btype, ftype=family, fs=fs, output="sos")
    if rp is not None:
        kw["rp"] = rp
        kw["rs"] = rs
    sos = signal.iirfilter(**kw)
    filt.append({
        "name": f"{family} {btype} N={n}",
        "design": {"family": {"ellip": "elliptic", "butter": "butterworth"}[family], "response": btype, "order": n,
                   "fs": fs, "edges": wn, **({"passbandRippleDb": rp, "stopbandAttenuationDb": rs} if rp else {})},
        "sosReference": "scipy.signal.iirfilter(output='sos')",
        "sos": sos_rows(sos),
        "input": [float(v) for v in xs],
        "sectionsOutput": [float(v) for v in signal.sosfilt(sos, xs)],
        "sectionsReference": "scipy.signal.sosfilt",
        "zeroPhaseOutput": [float(v) for v in signal.sosfiltfilt(sos, xs)],
        "zeroPhaseReference": "scipy.signal.sosfiltfilt(padtype='odd', default padlen)",
        "version": VERSION,
    })
b, a = signal.butter(4, 0.2)
out["rationalFilter"] = {
    "name": "Butterworth lowpass N=4, cutoff 0.2·(fs/2), numerator/denominator form",
    "reference": "scipy.signal.butter(4, 0.2) then scipy.signal.lfilter", "version": VERSION,
    "numerator": b.tolist(), "denominator": a.tolist(), "input": [float(v) for v in xs[:500]],
    "output": [float(v) for v in signal.lfilter(b, a, xs[:500])],
}
out["filtering"] = filt

# ---------------------------------------------------------------- group delay
gd = []
for name, (b, a) in [("Butterworth N=4 lowpass 0.3", signal.butter(4, 0.3)),
                     ("Chebyshev I N=3 0.5 dB lowpass 0.2", signal.cheby1(3, 0.5, 0.2)),
                     ("Elliptic N=4 highpass 0.4", signal.ellip(4, 1, 40, 0.4, btype="highpass"))]:
    fs = 2.0
    # Up to 0.9 of Nyquist: near the zeros on the unit circle at z = −1 SciPy's polynomial
    # evaluation loses digits (it warns there), so the reference would not be accurate.
    freqs = np.linspace(0.0, 0.9, 60)
    w, g = signal.group_delay((b, a), w=freqs, fs=fs)
    sos = signal.tf2sos(b, a)
    gd.append({"name": name, "reference": "scipy.signal.group_delay((b, a), fs=2)", "version": VERSION,
               "sos": sos_rows(sos), "fs": fs, "frequencies": freqs.tolist(), "groupDelay": [float(v) for v in g]})
out["groupDelay"] = gd

# ---------------------------------------------------------------- order estimation
orders = []
for fam, fn in [("butterworth", signal.buttord), ("chebyshev1", signal.cheb1ord),
                ("chebyshev2", signal.cheb2ord), ("elliptic", signal.ellipord)]:
    for shape, wp, ws, gp, gs, fs in [
        ("lowpass", 1000.0, 1500.0, 1.0, 60.0, 8000.0),
        ("lowpass", 3000.0, 3800.0, 0.5, 60.0, 48000.0),
        ("highpass", 500.0, 300.0, 0.5, 40.0, 8000.0),
        ("bandpass", [1000.0, 2000.0], [800.0, 2400.0], 0.5, 70.0, 48000.0),
        ("bandpass", [45.0, 60.0], [30.0, 80.0], 1.0, 40.0, 500.0),
    ]:
        n, wn = fn(wp, ws, gp, gs, fs=fs)
        orders.append({"name": f"{fam} {shape} {wp}/{ws} Hz Ap={gp} As={gs}",
                       "reference": f"scipy.signal.{fn.__name__}", "version": VERSION,
                       "requirements": {"family": fam, "response": shape, "fs": fs, "passband": wp, "stopband": ws,
                                        "passbandRippleDb": gp, "stopbandAttenuationDb": gs},
                       "order": int(n), "edges": np.atleast_1d(wn).astype(float).tolist()})
out["orders"] = orders

# ---------------------------------------------------------------- elliptic functions
out["ellipticK"] = {"reference": "scipy.special.ellipk", "version": VERSION,
                    "m": [0.0, 1e-12, 0.1, 0.5, 0.9, 0.99, 0.999999, 1 - 1e-12],
                    "K": [float(special.ellipk(m)) for m in [0.0, 1e-12, 0.1, 0.5, 0.9, 0.99, 0.999999, 1 - 1e-12]]}
ej = []
for u, m in [(0.3, 0.1), (1.2, 0.5), (2.5, 0.9), (0.7, 0.999), (-1.1, 0.3), (5.0, 0.7), (0.4, 0.0), (0.4, 1.0)]:
    sn, cn, dn, ph = special.ellipj(u, m)
    ej.append({"u": u, "m": m, "sn": float(sn), "cn": float(cn), "dn": float(dn)})
out["jacobi"] = {"reference": "scipy.special.ellipj", "version": VERSION, "cases": ej}

# ---------------------------------------------------------------- mains notch
notch = []
for f0, q, fs in [(50.0, 30.0, 1000.0), (60.0, 20.0, 500.0), (150.0, 50.0, 2000.0)]:
    b, a = signal.iirnotch(f0, q, fs=fs)
    notch.append({"frequency": f0, "q": q, "fs": fs, "b": b.tolist(), "a": a.tolist()})
out["notch"] = {"reference": "scipy.signal.iirnotch (bandwidth f0/Q)", "version": VERSION, "cases": notch}

path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "iir.json")
with open(path, "w") as f:
    json.dump(out, f)
    f.write("\n")
print("wrote", path)
