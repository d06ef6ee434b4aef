#!/usr/bin/env python3
"""Reference data for the org.roseate.spectrum tests.

Writes src/test/resources/reference/spectrum/welch.json from scipy.signal and numpy:
  windows    scipy.signal.get_window(name, n) (periodic, fftbins=True) for hann, flattop,
             blackmanharris and boxcar, even and odd n
  welch      scipy.signal.welch(x, fs, window='hann', nperseg, noverlap=nperseg//2,
             detrend='constant', scaling='density', average='mean') of a seeded signal, and the
             same with detrend=False and window='flattop'
  csd        scipy.signal.csd(x, y, ...) (same settings; scipy's convention Pxy = conj(X)·Y)
  coherence  scipy.signal.coherence(x, y, ...) (same settings)

The signals are stored too (x: seeded Gaussian noise plus a sine; y: x through a
scipy.signal.sosfilt band-pass, delayed, plus independent seeded noise), so the Java tests need
no random generator shared with numpy.

Run from the project root:  python3 src/test/python/gen_spectrum_reference.py
"""
import json
import os

import numpy as np
import scipy
from scipy import signal

OUT = os.path.join(os.path.dirname(__file__), "..", "resources", "reference", "spectrum")
GENERATOR = f"gen_spectrum_reference.py, scipy {scipy.__version__}, numpy {np.__version__}"


def floats(a):
    return [float(v) for v in np.asarray(a).ravel()]


def main():
    os.makedirs(OUT, exist_ok=True)
    windows = []
    for name in ("hann", "flattop", "blackmanharris", "boxcar"):
        for n in (16, 17, 256):
            windows.append({"name": name, "n": n, "w": floats(signal.get_window(name, n))})

    fs = 8000.0
    rng = np.random.default_rng(20260611)
    count = 3001  # odd, and not a whole number of hops: the tail must be carried, then ignored
    t = np.arange(count) / fs
    x = 0.3 * rng.standard_normal(count) + 0.5 * np.sin(2 * np.pi * 1234.5 * t) + 0.05
    sos = signal.butter(2, [300.0, 2000.0], btype="bandpass", fs=fs, output="sos")
    y = signal.sosfilt(sos, x)
    y = np.concatenate([np.zeros(3), y[:-3]]) + 0.05 * rng.standard_normal(count)

    cases = []
    for window, nperseg, detrend in (("hann", 256, "constant"), ("hann", 128, False),
                                     ("flattop", 200, "constant")):
        noverlap = nperseg // 2
        kw = dict(fs=fs, window=window, nperseg=nperseg, noverlap=noverlap, detrend=detrend,
                  scaling="density")
        f, pxx = signal.welch(x, **kw)
        _, pyy = signal.welch(y, **kw)
        _, pxy = signal.csd(x, y, **kw)
        kw.pop("scaling")
        _, cxy = signal.coherence(x, y, **kw)
        cases.append({"window": window, "nperseg": nperseg, "noverlap": noverlap,
                      "detrend": "constant" if detrend else "none",
                      "frequenciesHz": floats(f), "pxx": floats(pxx), "pyy": floats(pyy),
                      "pxyRe": floats(np.real(pxy)), "pxyIm": floats(np.imag(pxy)),
                      "coherence": floats(cxy)})

    with open(os.path.join(OUT, "welch.json"), "w") as fh:
        json.dump({"generator": GENERATOR, "sampleRateHz": fs, "windows": windows,
                   "x": floats(x), "y": floats(y), "cases": cases}, fh)
        fh.write("\n")


if __name__ == "__main__":
    main()
