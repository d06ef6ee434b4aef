#!/usr/bin/env python3
"""Reference data for org.roseate.digital.StationaryStateTest.

For a few second-order-section cascades (scipy's "sos" layout, transposed direct form II as in
scipy.signal.sosfilt), builds the one-step state-space matrices with scipy.signal.sosfilt itself
(column j of A = the final state after one zero-input step from unit state e_j; B = the final
state after one unit-input step from rest) and solves the discrete Lyapunov equation
P = A P A^T + B B^T with scipy.linalg.solve_discrete_lyapunov.

Writes src/test/resources/reference/digital/stationary_state.json.
Run from the project root:  python3 src/test/python/gen_stationary_state.py
"""
import json
import os

import numpy as np
import scipy
from scipy import linalg, signal

OUT = os.path.join(os.path.dirname(__file__), "..", "resources", "reference", "digital")
GENERATOR = f"gen_stationary_state.py, scipy {scipy.__version__}, numpy {np.__version__}"


def state_space(sos):
    n = 2 * len(sos)
    a = np.zeros((n, n))
    for j in range(n):
        zi = np.zeros((len(sos), 2))
        zi.flat[j] = 1.0
        _, zf = signal.sosfilt(sos, [0.0], zi=zi)
        a[:, j] = zf.reshape(n)
    _, zf = signal.sosfilt(sos, [1.0], zi=np.zeros((len(sos), 2)))
    return a, zf.reshape(n)


def case(name, sos):
    sos = np.asarray(sos, dtype=float)
    a, b = state_space(sos)
    p = linalg.solve_discrete_lyapunov(a, np.outer(b, b))
    return {"name": name, "sos": sos.tolist(), "covariance": p.tolist()}


def main():
    cases = [
        case("butter4-lowpass-0.1", signal.butter(4, 0.1, output="sos")),
        case("cheby1-6-bandpass", signal.cheby1(3, 1.0, [0.05, 0.3], btype="bandpass", output="sos")),
        # A slow one-pole low-pass (10 s time constant at 1 kHz: pole exp(-1/10000)) after a
        # resonant section: the kind of cascade a control-voltage design gives.
        case("slow-pole-and-resonance",
             np.vstack([signal.zpk2sos([], [np.exp(-1e-4)], 1 - np.exp(-1e-4)),
                        signal.zpk2sos([-1], [0.95 * np.exp(0.3j), 0.95 * np.exp(-0.3j)], 0.05)])),
    ]
    os.makedirs(OUT, exist_ok=True)
    with open(os.path.join(OUT, "stationary_state.json"), "w") as f:
        json.dump({"generator": GENERATOR, "cases": cases}, f, indent=1)


if __name__ == "__main__":
    main()
