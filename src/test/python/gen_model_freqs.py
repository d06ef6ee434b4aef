#!/usr/bin/env python3
"""Reference responses for the exact analog model (org.roseate.model).

Each case is a design (stages as Roseate expression strings) and, independently, the same
circuit built here as numpy polynomials in s by the series/parallel rules, evaluated with
scipy.signal.freqs; poles and zeros come from scipy.signal.tf2zpk. The Java test parses the
expressions with Roseate's own parser and compares. Run from the project root:

    python3 src/test/python/gen_model_freqs.py > src/test/resources/reference/model/freqs.json
"""
import json
import numpy as np
import scipy
import scipy.signal as sig

P = np.polynomial.polynomial  # ascending coefficients internally; converted for freqs


class Z:
    """An impedance N(s)/D(s), coefficients in descending powers (numpy/scipy convention)."""

    def __init__(self, num, den):
        self.num = np.atleast_1d(np.asarray(num, dtype=float))
        self.den = np.atleast_1d(np.asarray(den, dtype=float))


def R(v):
    return Z([v], [1.0])


def C(v):
    return Z([1.0], [v, 0.0])  # 1/(sC)


def L(v):
    return Z([v, 0.0], [1.0])  # sL


def ser(*zs):
    acc = zs[0]
    for z in zs[1:]:
        acc = Z(np.polyadd(np.polymul(acc.num, z.den), np.polymul(z.num, acc.den)), np.polymul(acc.den, z.den))
    return acc


def par(*zs):
    acc = zs[0]
    for z in zs[1:]:
        acc = Z(np.polymul(acc.num, z.num), np.polyadd(np.polymul(acc.num, z.den), np.polymul(z.num, acc.den)))
    return acc


def inverting(zin, zf, opamp=None):
    # G = Zf/Zin = P/Q
    p = np.polymul(zf.num, zin.den)
    q = np.polymul(zf.den, zin.num)
    if opamp is None:
        return -p, q
    gbw, a0 = opamp
    tau = a0 / (2 * np.pi * gbw)
    # H = -P*A0 / (Q*A0 + (Q+P)(1+s*tau))
    return -a0 * p, np.polyadd(a0 * q, np.polymul(np.polyadd(q, p), [tau, 1.0]))


def noninverting(zg, zf, opamp=None):
    p = np.polymul(zf.num, zg.den)
    q = np.polymul(zf.den, zg.num)
    top = np.polyadd(q, p)
    if opamp is None:
        return top, q
    gbw, a0 = opamp
    tau = a0 / (2 * np.pi * gbw)
    return a0 * top, np.polyadd(a0 * q, np.polymul(top, [tau, 1.0]))


def divider(zse, zsh, zload=None):
    if zload is not None:
        zsh = par(zsh, zload)
    nadb = np.polymul(zsh.num, zse.den)
    return nadb, np.polyadd(np.polymul(zse.num, zsh.den), nadb)


def cascade(*tfs):
    b, a = np.array([1.0]), np.array([1.0])
    for bb, aa in tfs:
        b, a = np.polymul(b, bb), np.polymul(a, aa)
    return b, a


pink_fb = par(R(240e3), C(1e-9), ser(R(150e3), C(12e-9)), ser(R(56e3), C(3.9e-9)), ser(R(20e3), C(1.5e-9)))
PINK_FB = "R2(240k) || C1(1n) || (R3(150k) + C2(12n)) || (R4(56k) + C3(3n9)) || (R5(20k) + C4(1n5))"

cases = [
    {
        "name": "inverting lowpass",
        "stages": [{"kind": "inverting", "input": "R1(10k)", "feedback": "R2(100k) || C1(10n)"}],
        "tf": inverting(R(10e3), par(R(100e3), C(10e-9))),
    },
    {
        "name": "noninverting shelf",
        "stages": [{"kind": "noninverting", "ground": "R1(10k) + C1(1u)", "feedback": "R2(47k) || C2(2n2)"}],
        "tf": noninverting(ser(R(10e3), C(1e-6)), par(R(47e3), C(2.2e-9))),
    },
    {
        "name": "divider with inductor and load",
        "stages": [{"kind": "divider", "series": "R1(10k) + L1(10m)", "shunt": "C1(100n) || R2(4k7)", "load": "R3(100k)"}],
        "tf": divider(ser(R(10e3), L(10e-3)), par(C(100e-9), R(4.7e3)), R(100e3)),
    },
    {
        "name": "pink inverting, single-pole op-amp",
        "stages": [{"kind": "inverting", "input": "R1(47k)", "feedback": PINK_FB,
                    "opamp": {"gbwHz": 1e6, "openLoopGain": 1e5}}],
        "tf": inverting(R(47e3), pink_fb, (1e6, 1e5)),
    },
    {
        "name": "noninverting, op-amp with default gain",
        "stages": [{"kind": "noninverting", "ground": "R1(1k)", "feedback": "R2(99k)", "opamp": {"gbwHz": 1e6}}],
        "tf": noninverting(R(1e3), R(99e3), (1e6, 1e5)),
    },
    {
        "name": "two stages: pink then sub-audio low-pass",
        "stages": [
            {"kind": "inverting", "input": "R1(47k)", "feedback": PINK_FB},
            {"kind": "inverting", "input": "R6(100k)", "feedback": "R7(1M) || C5(100n)", "opamp": {"gbwHz": 3e6}},
        ],
        "tf": cascade(inverting(R(47e3), pink_fb), inverting(R(100e3), par(R(1e6), C(100e-9)), (3e6, 1e5))),
    },
    {
        "name": "capacitors in series, inductors in parallel",
        "stages": [{"kind": "divider", "series": "C1(10n) + C2(22n) + R1(1k)", "shunt": "L1(1m) || L2(2m2) || R2(3k3)"}],
        "tf": divider(ser(C(10e-9), C(22e-9), R(1e3)), par(L(1e-3), L(2.2e-3), R(3.3e3))),
    },
]

hz = np.logspace(-1, 5, 61)  # 0.1 Hz to 100 kHz, 10 points per decade
out = {"generator": "src/test/python/gen_model_freqs.py", "scipy": scipy.__version__, "numpy": np.__version__, "cases": []}
for c in cases:
    b, a = c["tf"]
    w, h = sig.freqs(b, a, worN=2 * np.pi * hz)
    # Remove common powers of s (exact zeros at the low end of both), as the Java model does.
    k0 = min(len(b) - len(np.trim_zeros(b, "b")), len(a) - len(np.trim_zeros(a, "b")))
    z, p, k = sig.tf2zpk(b[: len(b) - k0], a[: len(a) - k0])
    out["cases"].append({
        "name": c["name"],
        "stages": c["stages"],
        "hz": hz.tolist(),
        "re": h.real.tolist(),
        "im": h.imag.tolist(),
        "polesHz": sorted((np.abs(p) / (2 * np.pi)).tolist()),
        "zerosHz": sorted((np.abs(z) / (2 * np.pi)).tolist()),
    })
print(json.dumps(out, indent=1))
