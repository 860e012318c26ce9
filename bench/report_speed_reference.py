"""Reference for bench/report_speed.ts: the same filter as
worksheets/pump_monitor_antialias.md, designed and plotted by hand with
Debian's SciPy and matplotlib: six SVG figures and an HTML page.

Run with /usr/bin/python3 (Debian's python3-scipy and python3-matplotlib).
Usage: report_speed_reference.py OUTDIR
"""
import os
import sys

import matplotlib

matplotlib.use("svg")
import matplotlib.pyplot as plt  # noqa: E402
import numpy as np  # noqa: E402
from scipy import signal  # noqa: E402

out = sys.argv[1]
os.makedirs(out, exist_ok=True)
fs, passband, stopband, taps = 8000.0, 1000.0, 1600.0, 41
h = signal.firwin(taps, (passband + stopband) / 2, window="hamming", fs=fs)
w, H = signal.freqz(h, worN=8193, fs=fs)
db = 20 * np.log10(np.maximum(np.abs(H), 1e-20))
deviation = np.max(np.abs(db[w <= passband]))
attenuation = -np.max(db[w >= stopband])


def save(name, draw):
    fig, ax = plt.subplots(figsize=(6.4, 3.0))
    draw(ax)
    ax.grid(True, alpha=0.3)
    fig.tight_layout()
    fig.savefig(os.path.join(out, name + ".svg"))
    plt.close(fig)


def magnitude(ax):
    ax.plot(w, db)
    ax.axhspan(-50, 5, xmin=stopband / (fs / 2), color="r", alpha=0.1)
    ax.set_ylim(-100, 5)
    ax.set(title="Magnitude", xlabel="Frequency (Hz)", ylabel="Magnitude (dB)")


def close_up(ax):
    keep = w <= passband * 1.1
    ax.plot(w[keep], db[keep])
    ax.set_ylim(-0.3, 0.3)
    ax.set(title="Passband", xlabel="Frequency (Hz)", ylabel="Magnitude (dB)")


def phase(ax):
    ax.plot(w, np.degrees(np.unwrap(np.angle(H))))
    ax.set(title="Phase", xlabel="Frequency (Hz)", ylabel="Phase (degrees)")


def delay(ax):
    wd, gd = signal.group_delay((h, [1.0]), w=2048, fs=fs)
    ax.plot(wd, gd)
    ax.set(title="Group delay", xlabel="Frequency (Hz)", ylabel="Samples")


def impulse(ax):
    ax.stem(np.arange(taps + 8), np.concatenate([h, np.zeros(8)]))
    ax.set(title="Impulse response", xlabel="Sample", ylabel="Amplitude")


def step(ax):
    ax.stem(np.arange(taps + 8), np.cumsum(np.concatenate([h, np.zeros(8)])))
    ax.set(title="Step response", xlabel="Sample", ylabel="Amplitude")


names = ["magnitude", "passband", "phase", "delay", "impulse", "step"]
for name, draw in zip(names, [magnitude, close_up, phase, delay, impulse, step]):
    save(name, draw)
with open(os.path.join(out, "index.html"), "w") as f:
    f.write("<!DOCTYPE html><html><body><h1>Anti-alias lowpass</h1>")
    f.write(f"<p>Passband deviation {deviation:.4f} dB, attenuation {attenuation:.2f} dB</p>")
    f.write("".join(f'<img src="{n}.svg">' for n in names))
    f.write("</body></html>")
