#!/usr/bin/env python3
"""Reference responses of circuit stages from an independent nodal solver.

Textbook modified nodal analysis (Ho, Ruehli and Brennan, 1975; the stamps as in any circuit
simulation text), written here from that formulation and not from Roseate's code: every network
expression is expanded into elementary parts with internal nodes for series chains; a resistor or
capacitor stamps its admittance, an inductor adds its current as an unknown (v_a - v_b - sL i = 0);
the input is a voltage source with its own current unknown; an ideal op-amp is a nullor (its output
current is an unknown, its row says v+ - v- = 0) and a finite one a voltage-controlled voltage
source with A(s) = A0/(1 + s A0/(2 pi GBW)) (row: v_out - A (v+ - v-) = 0). numpy.linalg.solve
solves the full complex system at each frequency. Run from the project root:

    python3 src/test/python/gen_circuit_mna.py > src/test/resources/reference/model/circuits.json
"""
import json
import re
import numpy as np

PREFIX = {"p": 1e-12, "n": 1e-9, "u": 1e-6, "m": 1e-3, "k": 1e3, "M": 1e6, "": 1.0}


def value(text):
    """IEC 60062 letter code (4k7, 3n3, R47) or a number with an SI prefix (68k, 220n)."""
    m = re.fullmatch(r"(\d*)([pnumkMR])(\d+)", text)
    if m:
        mult = 1.0 if m.group(2) == "R" else PREFIX[m.group(2)]
        return float((m.group(1) or "0") + "." + m.group(3)) * mult
    m = re.fullmatch(r"([0-9.eE+-]+?)([pnumkM]?)", text)
    return float(m.group(1)) * PREFIX[m.group(2)]


def parse(expr):
    """Expression -> nested ('S'|'P', [parts]) or ('R'|'C'|'L', value)."""
    toks = re.findall(r"\|\||\+|\(|\)|[A-Za-z]+\d+\([^)]*\)", expr)
    pos = [0]

    def atom():
        t = toks[pos[0]]
        pos[0] += 1
        if t == "(":
            e = chain()
            pos[0] += 1  # ')'
            return e
        m = re.fullmatch(r"([A-Za-z])[A-Za-z]*\d+\(([^)]*)\)", t)
        return (m.group(1).upper(), value(m.group(2)))

    def chain():
        parts = [atom()]
        op = None
        while pos[0] < len(toks) and toks[pos[0]] in ("+", "||"):
            op = toks[pos[0]]
            pos[0] += 1
            parts.append(atom())
        if op is None:
            return parts[0]
        return ("S" if op == "+" else "P", parts)

    return chain()


class Netlist:
    def __init__(self):
        self.nodes = {"gnd": 0}
        self.elements = []  # (kind, a, b, value)
        self.count = 0

    def node(self, name):
        if name not in self.nodes:
            self.nodes[name] = len(self.nodes)
        return self.nodes[name]

    def fresh(self):
        self.count += 1
        return self.node("_internal%d" % self.count)

    def add(self, tree, a, b):
        kind = tree[0]
        if kind in ("R", "C", "L"):
            self.elements.append((kind, a, b, tree[1]))
        elif kind == "P":
            for p in tree[1]:
                self.add(p, a, b)
        else:
            parts = tree[1]
            prev = a
            for i, p in enumerate(parts):
                nxt = b if i == len(parts) - 1 else self.fresh()
                self.add(p, prev, nxt)
                prev = nxt


def response(stage, hz):
    net = Netlist()
    for key, expr in stage["branches"].items():
        n1, n2 = key.split(" ")
        net.add(parse(expr), net.node(n1), net.node(n2))
    ops = list(stage.get("opamps", {}).values())
    for op in ops:
        for k in ("plus", "minus", "output"):
            net.node(op[k])
    vin = net.node(stage["input"])
    vout = net.node(stage["output"])
    n = len(net.nodes) - 1  # node 0 is ground
    inductors = [e for e in net.elements if e[0] == "L"]
    size = n + 1 + len(inductors) + len(ops)
    out = []
    for f in hz:
        s = 2j * np.pi * f
        M = np.zeros((size, size), dtype=complex)
        rhs = np.zeros(size, dtype=complex)

        def add(r, c, v):
            if r > 0 and c > 0:
                M[r - 1, c - 1] += v

        li = 0
        for kind, a, b, v in net.elements:
            if kind == "L":
                row = n + 1 + li
                li += 1
                # current i from a to b through the inductor
                if a > 0:
                    M[a - 1, row] += 1
                    M[row, a - 1] += 1
                if b > 0:
                    M[b - 1, row] -= 1
                    M[row, b - 1] -= 1
                M[row, row] -= s * v
                continue
            y = 1.0 / v if kind == "R" else s * v
            add(a, a, y)
            add(b, b, y)
            add(a, b, -y)
            add(b, a, -y)
        # voltage source at the input: current unknown at column n, row n says v_in = 1
        M[vin - 1, n] += 1
        M[n, vin - 1] += 1
        rhs[n] = 1
        for k, op in enumerate(ops):
            row = n + 1 + len(inductors) + k
            o, p, m = net.nodes[op["output"]], net.nodes[op["plus"]], net.nodes[op["minus"]]
            M[o - 1, row] += 1  # output current into the KCL row of the output node
            if "gbwHz" in op:
                a0 = op.get("openLoopGain", 1e5)
                A = a0 / (1 + s * a0 / (2 * np.pi * op["gbwHz"]))
                M[row, o - 1] += 1
                if p > 0:
                    M[row, p - 1] -= A
                if m > 0:
                    M[row, m - 1] += A
            else:
                if p > 0:
                    M[row, p - 1] += 1
                if m > 0:
                    M[row, m - 1] -= 1
        x = np.linalg.solve(M, rhs)
        out.append(x[vout - 1])
    return np.array(out)


def op(plus, minus, output, **model):
    d = {"plus": plus, "minus": minus, "output": output}
    d.update(model)
    return d


# Our own circuits and values (invented for these tests).
CASES = [
    ("follower low-pass, unity gain", {
        "input": "in", "output": "out",
        "branches": {"in a": "R1(68k)", "a b": "R2(33k)", "a out": "C1(470n)", "b gnd": "C2(220n)"},
        "opamps": {"U1": op("b", "out", "out")}}),
    ("multiple-feedback low-pass", {
        "input": "in", "output": "out",
        "branches": {"in a": "R1(22k)", "a out": "R2(47k)", "a m": "R3(15k)", "a gnd": "C1(1u)", "m out": "C2(47n)"},
        "opamps": {"U1": op("gnd", "m", "out")}}),
    ("multiple-feedback low-pass, finite GBW", {
        "input": "in", "output": "out",
        "branches": {"in a": "R1(2k2)", "a out": "R2(4k7)", "a m": "R3(1k5)", "a gnd": "C1(4n7)", "m out": "C2(470p)"},
        "opamps": {"U1": op("gnd", "m", "out", gbwHz=1e6, openLoopGain=2e5)}}),
    ("pink ladder into an RC section, unbuffered, loaded", {
        "input": "in", "output": "out",
        "branches": {"in a": "R1(10k)",
                     "a gnd": "R2(91k) || (R3(27k) + C1(47n)) || (R4(8k2) + C2(15n)) || (R5(2k4) + C3(4n7)) || C4(1n)",
                     "a out": "R6(22k)", "out gnd": "C5(10n) || R7(100k)"}}),
    ("non-inverting stage whose ground leg is a ladder", {
        "input": "in", "output": "out",
        "branches": {"m gnd": "R1(1k) + (R2(4k7) || C1(100n)) + (R3(2k2) || C2(22n))", "m out": "R4(47k) || C3(1n)"},
        "opamps": {"U1": op("in", "m", "out")}}),
    ("bridged-T", {
        "input": "in", "output": "out",
        "branches": {"in out": "R1(10k)", "in t": "C1(22n)", "t out": "C2(22n)", "t gnd": "R2(1k)", "out gnd": "R3(100k)"}}),
    ("source with output resistance into an RC network", {
        "input": "in", "output": "out",
        "branches": {"in s": "R1(600)", "s gnd": "R2(10k) || C1(2n2)", "s out": "R3(4k7)", "out gnd": "C2(10n)"}}),
    ("inverting kind as a circuit", {
        "input": "in", "output": "out",
        "branches": {"in m": "R1(47k)", "m out": "R2(75k) || C1(3n3) || (R3(51k) + C2(39n)) || (R4(16k) + C3(15n))"},
        "opamps": {"U1": op("gnd", "m", "out", gbwHz=3e6, openLoopGain=2e5)}}),
    ("noninverting kind as a circuit", {
        "input": "in", "output": "out",
        "branches": {"m gnd": "R1(10k)", "m out": "R2(100k) || C1(1n)"},
        "opamps": {"U1": op("in", "m", "out")}}),
    ("divider kind as a circuit", {
        "input": "in", "output": "out",
        "branches": {"in out": "R1(39k)", "out gnd": "R2(91k) || (R3(27k) + C1(47n)) || R4(220k)"}}),
    ("RLC band-pass with an inductor", {
        "input": "in", "output": "out",
        "branches": {"in a": "R1(1k)", "a out": "L1(100m) + C1(100n)", "out gnd": "R2(2k2)"}}),
    ("two op-amps: follower low-pass then inverting gain", {
        "input": "in", "output": "out",
        "branches": {"in a": "R1(100k)", "a b": "R2(100k)", "a x": "C1(2u2)", "b gnd": "C2(1u)",
                     "x n": "R3(10k)", "n out": "R4(22k) || C3(1n)"},
        "opamps": {"U1": op("b", "x", "x", gbwHz=1e6), "U2": op("gnd", "n", "out")}}),
]


def main():
    hz = np.logspace(-1, 5, 121)
    cases = []
    for name, stage in CASES:
        st = dict(stage)
        st = {"kind": "circuit", **st}
        h = response(stage, hz)
        cases.append({"name": name, "stage": st, "hz": hz.tolist(),
                      "db": (20 * np.log10(np.abs(h))).tolist(),
                      "deg": np.degrees(np.angle(h)).tolist()})
    print(json.dumps({"generator": "src/test/python/gen_circuit_mna.py",
                      "numpy": np.__version__, "cases": cases}, indent=1))


if __name__ == "__main__":
    main()
