#!/usr/bin/env python3
"""Reference data for the org.roseate.digital tests.

Writes JSON files under src/test/resources/reference/digital/ from scipy.signal and numpy:
  bilinear_none.json  scipy.signal.bilinear_zpk on analog zpks (no prewarping)
  zpk2sos.json        scipy.signal.zpk2sos (pairing='nearest') of digital zpks, and
                      scipy.signal.freqz_sos of those sections on a frequency grid
  sosfilt.json        scipy.signal.sosfilt of seeded white noise through two of those cascades
  halfband.json       numpy Kaiser-window half-band taps, scipy.signal.upfirdn(h, x, down=2)
                      of seeded noise and scipy.signal.freqz of the taps

Run from the project root:  python3 src/test/python/gen_digital_reference.py
Versions used for the committed output are recorded in each file ("generator" field).
"""
import json
import os

import numpy as np
import scipy
from scipy import signal

OUT = os.path.join(os.path.dirname(__file__), "..", "resources", "reference", "digital")
GENERATOR = f"gen_digital_reference.py, scipy {scipy.__version__}, numpy {np.__version__}"
TWO_PI = 2 * np.pi


def cplx(values):
    return [[float(np.real(v)), float(np.imag(v))] for v in np.atleast_1d(values)]


def analog_cases():
    cases = []
    z, p, k = signal.butter(2, TWO_PI * 1000, analog=True, output="zpk")
    cases.append(("butter2_lowpass", 48000.0, z, p, k))
    z, p, k = signal.butter(2, [TWO_PI * 100, TWO_PI * 5000], btype="band", analog=True, output="zpk")
    cases.append(("butter_bandpass_origin_zeros", 44100.0, z, p, k))
    # our own interleaved pink network: real poles and zeros, one more pole than zeros
    pz = -TWO_PI * np.array([24.0, 150.0, 950.0, 6000.0])
    pp = -TWO_PI * np.array([10.0, 60.0, 380.0, 2400.0, 16000.0])
    cases.append(("pink_network", 44100.0, pz, pp, TWO_PI * 16000.0))
    # mixed: zero at the origin, a lightly damped complex zero pair (notch), two pole pairs, one real pole
    w0 = TWO_PI * 3000.0
    zn = np.array([0.0, w0 * (-0.02 + 1j), w0 * (-0.02 - 1j)])
    w1, w2 = TWO_PI * 800.0, TWO_PI * 7000.0
    pn = np.array([w1 * (-0.3 + 0.954j), w1 * (-0.3 - 0.954j), w2 * (-0.1 + 0.995j), w2 * (-0.1 - 0.995j),
                   -TWO_PI * 150.0])
    cases.append(("mixed_notch_negative_gain", 96000.0, zn, pn, -2.5e4))
    z, p, k = signal.cheby1(3, 1.0, TWO_PI * 8000, analog=True, output="zpk")
    cases.append(("cheby1_3_lowpass", 32000.0, z, p, k))
    return cases


def main():
    os.makedirs(OUT, exist_ok=True)
    bil, sos_cases, filt_cases = [], [], []
    rng = np.random.default_rng(20261201)
    for name, fs, z, p, k in analog_cases():
        zd, pd, kd = signal.bilinear_zpk(z, p, k, fs)
        bil.append({"name": name, "sampleRateHz": fs,
                    "analog": {"zeros": cplx(z), "poles": cplx(p), "gain": float(k)},
                    "digital": {"zeros": cplx(zd), "poles": cplx(pd), "gain": float(kd)}})
        sos_cases.append((name, fs, zd, pd, kd))
    # scipy's own zpk2sos docstring example (odd order, extra pole and zero at the origin)
    sos_cases.append(("scipy_docstring_odd", 48000.0, np.array([-1, -0.5 - 0.5j, -0.5 + 0.5j]),
                      np.array([0.75, 0.8 + 0.1j, 0.8 - 0.1j]), 1.0))
    zpk2sos = []
    for name, fs, zd, pd, kd in sos_cases:
        sos = signal.zpk2sos(zd, pd, kd, pairing="nearest")
        freqs = np.geomspace(10.0, 0.49 * fs, 40)
        _, h = signal.freqz_sos(sos, worN=freqs, fs=fs)
        zpk2sos.append({"name": name, "sampleRateHz": fs, "zeros": cplx(zd), "poles": cplx(pd), "gain": float(kd),
                        "sos": sos.tolist(), "freqHz": freqs.tolist(),
                        "hRe": np.real(h).tolist(), "hIm": np.imag(h).tolist()})
        if name in ("pink_network", "mixed_notch_negative_gain"):
            x = rng.standard_normal(3000)
            y = signal.sosfilt(sos, x)
            filt_cases.append({"name": name, "sampleRateHz": fs, "sos": sos.tolist(),
                               "input": x.tolist(), "output": y.tolist()})
    with open(os.path.join(OUT, "bilinear_none.json"), "w") as f:
        json.dump({"generator": GENERATOR, "cases": bil}, f, indent=1)
    with open(os.path.join(OUT, "zpk2sos.json"), "w") as f:
        json.dump({"generator": GENERATOR, "cases": zpk2sos}, f, indent=1)
    with open(os.path.join(OUT, "sosfilt.json"), "w") as f:
        json.dump({"generator": GENERATOR, "cases": filt_cases}, f, indent=1)

    # half-band: h[n] = 0.5*sinc((n-2K)/2)*kaiser(4K+1, beta), even offsets other than the centre set to 0,
    # odd taps scaled to sum to 0.5, centre 0.5
    fs_in, k_half = 88200.0, 38
    beta = 0.1102 * (100 - 8.7)
    n = np.arange(4 * k_half + 1) - 2 * k_half
    h = 0.5 * np.sinc(n / 2) * np.kaiser(4 * k_half + 1, beta)
    odd = n % 2 != 0
    h[~odd] = 0.0
    h[odd] *= 0.5 / h[odd].sum()
    h[2 * k_half] = 0.5
    x = rng.standard_normal(1001)
    y = signal.upfirdn(h, x, up=1, down=2)[: (len(x) + 1) // 2]
    freqs = np.concatenate((np.linspace(0, 20000, 21), np.linspace(24100, 44100, 21)))
    _, hf = signal.freqz(h, 1, worN=freqs, fs=fs_in)
    with open(os.path.join(OUT, "halfband.json"), "w") as f:
        json.dump({"generator": GENERATOR, "inputRateHz": fs_in, "halfLength": k_half, "beta": beta,
                   "taps": h.tolist(), "input": x.tolist(), "output": y.tolist(), "freqHz": freqs.tolist(),
                   "hRe": np.real(hf).tolist(), "hIm": np.imag(hf).tolist()}, f, indent=1)


if __name__ == "__main__":
    main()
