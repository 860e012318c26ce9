#!/usr/bin/python3
"""Reference spectra for tapsheet's FFT kernel at every power of two from 1 to
2^16 (and a few other lengths), from NumPy's pocketfft.

Run with Debian's interpreter:  /usr/bin/python3 test/reference/make_fft_sizes.py
Writes test/reference/fft_sizes.json next to this script.

The inputs are not stored: both this script and the test make them with the
same integer recurrence (Park & Miller's minimal standard generator,
s <- 16807 s mod (2^31 - 1), value s / (2^31 - 1) - 0.5), which is exact in
Python integers and in JavaScript doubles. To keep the file small, lengths
above 256 store a sample of the outputs: the first and last 8 and 128 evenly
spaced in between, with their indices.
"""
import json
import os
import platform

import numpy as np
import scipy

MODULUS = 2147483647
NUMPY = f"numpy {np.__version__}"


def lcg(n, seed):
    """n values of the minimal standard generator, mapped to [-0.5, 0.5)."""
    s = seed
    out = []
    for _ in range(n):
        s = (s * 16807) % MODULUS
        out.append(s / MODULUS - 0.5)
    return np.array(out)


def sample(length):
    """Indices kept for an output of `length` values."""
    if length <= 257:
        return list(range(length))
    middle = np.linspace(8, length - 9, 128).round().astype(int).tolist()
    return sorted(set(range(8)) | set(middle) | set(range(length - 8, length)))


def floats(a, idx):
    return [float(a[i]) for i in idx]


powers = [2 ** e for e in range(17)]
others = [3, 5, 6, 12, 100, 1000, 4095]
cases = []
for n in powers + others:
    seed = 1000 + n
    x = lcg(n, seed)
    X = np.fft.rfft(x)
    idx = sample(len(X))
    cases.append({"kind": "real", "length": n, "seed": seed,
                  "reference": f"numpy.fft.rfft, {NUMPY}",
                  "indices": idx, "re": floats(X.real, idx), "im": floats(X.imag, idx)})

    bins = n // 2 + 1
    seed_re, seed_im = 2000 + n, 3000 + n
    spectrum = lcg(bins, seed_re) + 1j * lcg(bins, seed_im)
    y = np.fft.irfft(spectrum, n)
    idx = sample(n)
    cases.append({"kind": "inverseReal", "length": n, "seedRe": seed_re, "seedIm": seed_im,
                  "reference": f"numpy.fft.irfft(n={n}), {NUMPY}",
                  "indices": idx, "output": floats(y, idx)})

    z = lcg(n, seed_re) + 1j * lcg(n, seed_im)
    Z = np.fft.fft(z)
    idx = sample(n)
    cases.append({"kind": "complex", "length": n, "seedRe": seed_re, "seedIm": seed_im,
                  "reference": f"numpy.fft.fft, {NUMPY}",
                  "indices": idx, "re": floats(Z.real, idx), "im": floats(Z.imag, idx)})

out = {
    "generator": "test/reference/make_fft_sizes.py",
    "versions": {"numpy": np.__version__, "scipy": scipy.__version__,
                 "python": platform.python_version()},
    "input": "minimal standard generator: s <- 16807 s mod (2^31 - 1) from the seed, "
             "value s / (2^31 - 1) - 0.5",
    "cases": cases,
}
path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "fft_sizes.json")
with open(path, "w") as fh:
    json.dump(out, fh, separators=(",", ":"))
    fh.write("\n")
print(f"wrote {path}: {len(cases)} cases")
