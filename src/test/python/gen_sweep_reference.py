#!/usr/bin/env python3
"""Reference data for the org.roseate.sweep tests.

Writes src/test/resources/reference/sweep/filter.json: a known digital filter (second-order
sections from scipy.signal.butter: a 2nd-order high-pass at 40 Hz and a 2nd-order low-pass at
6 kHz, at 48 kHz) and its response from scipy.signal.sosfreqz at the analyzer's grid
frequencies 1 kHz * 2**(i/24) from 20 Hz to 22 kHz. The Java tests filter with these sections
in their own loop and compare the measured |H| and phase with the stored response.

Run from the project root:  python3 src/test/python/gen_sweep_reference.py
"""
import json
import os

import numpy as np
import scipy
from scipy import signal

OUT = os.path.join(os.path.dirname(__file__), "..", "resources", "reference", "sweep")
GENERATOR = f"gen_sweep_reference.py, scipy {scipy.__version__}, numpy {np.__version__}"


def main():
    os.makedirs(OUT, exist_ok=True)
    fs = 48000.0
    sos = np.concatenate([signal.butter(2, 40.0, btype="highpass", fs=fs, output="sos"),
                          signal.butter(2, 6000.0, btype="lowpass", fs=fs, output="sos")])
    i = np.arange(int(np.ceil(24 * np.log2(20 / 1000))), int(np.floor(24 * np.log2(22000 / 1000))) + 1)
    hz = 1000.0 * 2.0 ** (i / 24.0)
    _, h = signal.sosfreqz(sos, worN=hz, fs=fs)
    data = {
        "generator": GENERATOR,
        "sampleRateHz": fs,
        "sos": [[float(v) for v in row] for row in sos],
        "hz": [float(v) for v in hz],
        "magnitudeDb": [float(v) for v in 20 * np.log10(np.abs(h))],
        "phaseDeg": [float(v) for v in np.degrees(np.angle(h))],
    }
    with open(os.path.join(OUT, "filter.json"), "w") as f:
        json.dump(data, f, indent=1)
        f.write("\n")


if __name__ == "__main__":
    main()
