#!/usr/bin/env python3
"""Reference responses for the org.roseate.spectrum.FilterBank tests.

Writes src/test/resources/reference/spectrum/filterbank/butter.json: for each case (band fraction 1/b,
band index x, sample rate fs), the IEC 61260-1:2014 base-ten band (fm = 1000 * 10**(3x/(10b)),
edges fm * 10**(-+3/(20b)), in 40-digit decimal), then

  sos = scipy.signal.butter(3, [f1, f2], btype='bandpass', fs=fs, output='sos')
  h   = scipy.signal.sosfreqz(sos, worN=freqs, fs=fs)

(scipy prewarps the edges with 2*fs*tan(pi*f/fs), transforms the order-3 low-pass prototype with
lp2bp_zpk and applies bilinear_zpk: an independent implementation of the same design), stored as
|h| in dB at fm, the edges, and fm times a spread of normalised frequencies below fs/2.

Run from the project root:  python3 src/test/python/gen_filterbank_butter.py
"""
import json
import os
from decimal import Decimal, getcontext

import numpy as np
import scipy
from scipy import signal

OUT = os.path.join(os.path.dirname(__file__), "..", "resources", "reference", "spectrum", "filterbank")
GENERATOR = f"gen_filterbank_butter.py, scipy {scipy.__version__}, numpy {np.__version__}"

CASES = [  # (b, x, fs)
    (3, -17, 48000.0),   # 20 Hz third-octave
    (3, -17, 192000.0),  # 20 Hz third-octave at 192 kHz: the narrowest, poles closest to z = 1
    (3, 0, 48000.0),     # 1 kHz third-octave
    (3, 13, 48000.0),    # 20 kHz third-octave: strong warping near Nyquist
    (3, 13, 44100.0 * 2),
    (1, -5, 48000.0),    # 31.5 Hz octave
    (1, 0, 44100.0),     # 1 kHz octave
    (1, 4, 48000.0),     # 16 kHz octave: upper edge 22.4 kHz, real poles after the transform
]

RATIOS = [1.02, 1.05, 1.1, 1.2, 1.3, 1.5, 2.0, 3.0, 5.0, 10.0]


def band(b, x):
    getcontext().prec = 40
    ten = Decimal(10)
    fm = Decimal(1000) * ten ** (Decimal(3 * x) / Decimal(10 * b))
    half = ten ** (Decimal(3) / Decimal(20 * b))
    return float(fm), float(fm / half), float(fm * half)


def main():
    os.makedirs(OUT, exist_ok=True)
    cases = []
    for b, x, fs in CASES:
        fm, f1, f2 = band(b, x)
        sos = signal.butter(3, [f1, f2], btype="bandpass", fs=fs, output="sos")
        freqs = [fm, f1, f2] + [fm / r for r in RATIOS] + [fm * r for r in RATIOS if fm * r < 0.499 * fs]
        _, h = signal.sosfreqz(sos, worN=np.array(freqs), fs=fs)
        cases.append({
            "b": b, "index": x, "fs": fs, "fm": fm, "f1": f1, "f2": f2,
            "freqs": [float(f) for f in freqs],
            "magDb": [float(v) for v in 20 * np.log10(np.abs(h))],
        })
    with open(os.path.join(OUT, "butter.json"), "w") as f:
        json.dump({"generator": GENERATOR, "cases": cases}, f, indent=1)
        f.write("\n")


if __name__ == "__main__":
    main()
