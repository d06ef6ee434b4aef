#!/usr/bin/env python3
"""Noise bias of the filter bank's Butterworth band-pass (analog prototype) against the ideal band.

For the 1 kHz octave and third-octave bands (IEC 61260-1 base-ten edges) and the analog
scipy.signal.butter(3, [2*pi*f1, 2*pi*f2], 'bandpass', analog=True), integrates with scipy.integrate.quad:
  white: 10*log10( integral |H|^2 df / (f2 - f1) )
  pink:  10*log10( integral |H|^2 / f df / ln(f2/f1) )
Writes src/test/resources/reference/spectrum/filterbank/noise_bias.json.
Run from the project root:  python3 src/test/python/gen_filterbank_noise_bias.py
"""
import json
import os

import numpy as np
import scipy
from scipy import integrate, signal

OUT = os.path.join(os.path.dirname(__file__), "..", "resources", "reference", "spectrum", "filterbank")


def bias(b):
    g = 10 ** 0.3
    fm = 1000.0
    f1, f2 = fm * g ** (-1 / (2 * b)), fm * g ** (1 / (2 * b))
    num, den = signal.butter(3, [2 * np.pi * f1, 2 * np.pi * f2], "bandpass", analog=True)

    def h2(f):
        return abs(signal.freqs(num, den, [2 * np.pi * f])[1][0]) ** 2

    white = integrate.quad(h2, 1, 1e6, points=[f1, f2], limit=500)[0] / (f2 - f1)
    pink = integrate.quad(lambda f: h2(f) / f, 1, 1e6, points=[f1, f2], limit=500)[0] / np.log(f2 / f1)
    return {"whiteDb": 10 * np.log10(white), "pinkDb": 10 * np.log10(pink)}


def main():
    data = {"generator": f"gen_filterbank_noise_bias.py, scipy {scipy.__version__}",
            "octave": bias(1), "thirdOctave": bias(3)}
    with open(os.path.join(OUT, "noise_bias.json"), "w") as f:
        json.dump(data, f, indent=1)


if __name__ == "__main__":
    main()
