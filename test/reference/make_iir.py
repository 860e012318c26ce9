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

path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "iir.json")
with open(path, "w") as f:
    json.dump(out, f, indent=1)
print("wrote", path)
