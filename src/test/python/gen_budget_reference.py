#!/usr/bin/env python3
"""Independent nodal noise computation for org.roseate.budget (issue 13).

Two multi-stage designs are written here as nested series/parallel networks. This script
  1. writes each as a Roseate design file (src/test/resources/reference/budget/<name>.json), and
  2. builds ONE flat netlist of the whole cascade: every series/parallel network expanded into
     its single parts with explicit internal nodes, the stages joined by ideal unity-gain
     followers, and solves it by modified nodal analysis with numpy.linalg.solve at each
     frequency. Noise generators (Nyquist 1928; common practice for op-amps):
       - each resistor: a Norton current 4kT/R (A^2/Hz) across its own two nodes
         (so no impedance-tree transfer is used here: an independent route);
       - each op-amp: en^2 (1 + fce/f) as a voltage in series with its + input;
         in^2 (1 + fci/f) as a current into each input, uncorrelated;
       - the source: S(f) = d^2 (1 + fc/f) driving the first stage.
     Densities add as powers (uncorrelated generators). Range integrals use the trapezoid rule
     in ln f on 400 001 points (relative error below 1e-9 for these smooth responses).
The Java test (org.roseate.budget.NodalNoiseReferenceTest) reads the design files and compares.
Run from the project root:

    python3 src/test/python/gen_budget_reference.py
"""
import json
import math
import os
import numpy as np

K_B = 1.380649e-23  # J/K, exact (SI 2019)
OUT = "src/test/resources/reference/budget"


def R(d, text, v):
    return ("R", d, text, v)


def C(d, text, v):
    return ("C", d, text, v)


def L(d, text, v):
    return ("L", d, text, v)


def S(*parts):
    return ("S", list(parts))


def P(*parts):
    return ("P", list(parts))


def expr(n, nested=False):
    if n[0] in "RCL":
        return f"{n[1]}({n[2]})"
    sep = " + " if n[0] == "S" else " || "
    s = sep.join(expr(p, True) for p in n[1])
    return f"({s})" if nested else s


# --- design A: inverting (nested branch) -> divider with load -> noninverting with finite GBW
DESIGN_A = {
    "name": "budget reference A",
    "temperatureC": 40.0,
    "source": {"densityVPerRtHz": 150e-6, "flickerCornerHz": 250.0},
    "stages": [
        {"kind": "inverting", "roles": {"input": R("R1", "10k", 10e3),
                                        "feedback": P(R("R2", "100k", 100e3), S(R("R3", "10k", 10e3), C("C1", "22n", 22e-9)))},
         "opamp": {"enVPerRtHz": 10e-9, "inAPerRtHz": 1e-12, "enCornerHz": 100.0, "inCornerHz": 200.0,
                   "swingV": 13.0, "slewVPerUs": 13.0}},
        {"kind": "divider", "roles": {"series": R("R4", "4k7", 4.7e3),
                                      "shunt": P(C("C2", "100n", 100e-9), S(R("R5", "22k", 22e3), C("C3", "10n", 10e-9))),
                                      "load": R("R6", "100k", 100e3)}},
        {"kind": "noninverting", "roles": {"ground": S(R("R7", "2k2", 2.2e3), C("C4", "10u", 10e-6)),
                                           "feedback": P(R("R8", "22k", 22e3), C("C5", "1n", 1e-9))},
         "opamp": {"gbwHz": 1e6, "openLoopGain": 1e5, "enVPerRtHz": 8e-9, "inAPerRtHz": 2e-13,
                   "swingV": 10.0, "slewVPerUs": 0.5}},
    ],
}

# --- design B: a two-op-amp circuit stage (follower low-pass, then inverting shelf) -> inverting
DESIGN_B = {
    "name": "budget reference B",
    "source": {"densityVPerRtHz": 50e-6, "flickerCornerHz": 1000.0},
    "stages": [
        {"kind": "circuit", "input": "in", "output": "out",
         "branches": {"in a": R("R1", "10k", 10e3), "a b": P(R("R2", "10k", 10e3), S(R("R9", "47k", 47e3), C("C6", "1n", 1e-9))),
                      "b gnd": C("C1", "10n", 10e-9), "a o1": C("C2", "22n", 22e-9),
                      "o1 c": P(R("R3", "4k7", 4.7e3), C("C3", "2n2", 2.2e-9)), "c out": P(R("R4", "33k", 33e3), C("C4", "1n", 1e-9))},
         "opamps": {"U1": {"plus": "b", "minus": "o1", "output": "o1", "gbwHz": 3e6, "openLoopGain": 2e5,
                           "enVPerRtHz": 5e-9, "inAPerRtHz": 0.5e-12, "enCornerHz": 50.0, "inCornerHz": 100.0,
                           "swingV": 12.0, "slewVPerUs": 13.0},
                    "U2": {"plus": "gnd", "minus": "c", "output": "out", "enVPerRtHz": 20e-9, "inAPerRtHz": 1e-14,
                           "swingV": 4.0}}},
        {"kind": "inverting", "roles": {"input": R("R5", "10k", 10e3), "feedback": P(R("R6", "10k", 10e3), C("C5", "4n7", 4.7e-9))},
         "opamp": {"gbwHz": 1e6, "enVPerRtHz": 18e-9, "swingV": 13.5, "slewVPerUs": 13.0}},
    ],
}

MODEL_KEYS = ("gbwHz", "openLoopGain", "enVPerRtHz", "inAPerRtHz", "enCornerHz", "inCornerHz", "swingV", "slewVPerUs")


def design_json(d):
    out = {"name": d["name"], "description": "reference design for the budget tests (invented values)"}
    if "source" in d:
        out["source"] = d["source"]
    if "temperatureC" in d:
        out["temperatureC"] = d["temperatureC"]
    stages = []
    for st in d["stages"]:
        o = {"kind": st["kind"]}
        if st["kind"] == "circuit":
            o["input"], o["output"] = st["input"], st["output"]
            o["branches"] = {k: expr(v) for k, v in st["branches"].items()}
            o["opamps"] = st["opamps"]
        else:
            o.update({k: expr(v) for k, v in st["roles"].items()})
            if "opamp" in st:
                o["opamp"] = st["opamp"]
        stages.append(o)
    out["stages"] = stages
    return out


class Netlist:
    """Flat netlist: nodes by name ('gnd' is the reference), two-terminal parts, op-amps."""

    def __init__(self):
        self.nodes = []
        self.parts = []      # (kind, designator, value, a, b)
        self.opamps = []     # dict(name, plus, minus, out, model)
        self.count = 0

    def node(self, name):
        if name != "gnd" and name not in self.nodes:
            self.nodes.append(name)
        return name

    def fresh(self, prefix):
        self.count += 1
        return self.node(f"{prefix}#{self.count}")

    def expand(self, net, a, b, prefix):
        if net[0] in "RCL":
            self.parts.append((net[0], net[1], net[3], a, b))
        elif net[0] == "S":
            nodes = [a] + [self.fresh(prefix) for _ in net[1][:-1]] + [b]
            for i, p in enumerate(net[1]):
                self.expand(p, nodes[i], nodes[i + 1], prefix)
        else:
            for p in net[1]:
                self.expand(p, a, b, prefix)


def build(design):
    """The whole cascade as one netlist; returns it, the watched nodes and their labels."""
    n = Netlist()
    n.node("src")
    drive = "src"
    watched = []
    for i, st in enumerate(design["stages"], start=1):
        pre = f"s{i}."
        if st["kind"] == "circuit":
            name = lambda x: "gnd" if x == "gnd" else pre + x
            inp = name(st["input"])
            for key, net in st["branches"].items():
                a, b = key.split(" ")
                n.expand(net, n.node(name(a)), n.node(name(b)), pre)
            for u, op in st["opamps"].items():
                n.opamps.append(dict(name=u, stage=i, plus=name(op["plus"]), minus=name(op["minus"]),
                                     out=n.node(name(op["output"])), model=op))
            out = name(st["output"])
            watched.append((i, st["output"], out))
            watched += [(i, op["output"], name(op["output"])) for op in st["opamps"].values() if op["output"] != st["output"]]
        else:
            inp, out = n.node(pre + "in"), n.node(pre + "out")
            m = n.node(pre + "m") if st["kind"] != "divider" else None
            r = st["roles"]
            if st["kind"] == "inverting":
                n.expand(r["input"], inp, m, pre)
                n.expand(r["feedback"], m, out, pre)
                n.opamps.append(dict(name="U1", stage=i, plus="gnd", minus=m, out=out, model=st.get("opamp", {})))
            elif st["kind"] == "noninverting":
                n.expand(r["ground"], m, "gnd", pre)
                n.expand(r["feedback"], m, out, pre)
                n.opamps.append(dict(name="U1", stage=i, plus=inp, minus=m, out=out, model=st.get("opamp", {})))
            else:
                n.expand(r["series"], inp, out, pre)
                n.expand(r["shunt"], out, "gnd", pre)
                if "load" in r:
                    n.expand(r["load"], out, "gnd", pre)
            watched.append((i, "out", out))
        # the previous output drives this input through an ideal unity-gain follower
        n.opamps.append(dict(name=None, stage=i, plus=drive, minus=inp, out=inp, model={}))
        drive = out
    return n, watched, drive


def inv_gain(model, s):
    if "gbwHz" not in model:
        return 0.0
    return 1.0 / model.get("openLoopGain", 1e5) + s / (2 * math.pi * model["gbwHz"])


def solve_all(n, f):
    """MNA at f: returns (M, index) with unknowns = node voltages, op-amp currents, source current."""
    s = 2j * math.pi * f
    idx = {name: k for k, name in enumerate(n.nodes)}
    no = len(n.nodes)
    size = no + len(n.opamps) + 1
    M = np.zeros((size, size), dtype=complex)

    def stamp(a, b, y):
        ia, ib = idx.get(a), idx.get(b)
        if ia is not None:
            M[ia, ia] += y
        if ib is not None:
            M[ib, ib] += y
        if ia is not None and ib is not None:
            M[ia, ib] -= y
            M[ib, ia] -= y

    for kind, _, v, a, b in n.parts:
        y = 1 / v if kind == "R" else s * v if kind == "C" else 1 / (s * v)
        stamp(a, b, y)
    for k, op in enumerate(n.opamps):
        row = no + k
        io = idx[op["out"]]
        M[io, row] += 1.0  # op-amp output current leaves into the node
        if op["plus"] in idx:
            M[row, idx[op["plus"]]] += 1.0
        if op["minus"] in idx:
            M[row, idx[op["minus"]]] -= 1.0
        M[row, io] -= inv_gain(op["model"], s)
    srow = size - 1
    M[idx["src"], srow] += 1.0
    M[srow, idx["src"]] = 1.0
    return M, idx, no


def densities(design, freqs):
    """Per contributor and per watched node: output density (V^2/Hz) at each frequency."""
    n, watched, outnode = build(design)
    T = 273.15 + design.get("temperatureC", 25.0)
    src = design.get("source")
    labels = ["source"] + [p[1] for p in n.parts if p[0] == "R"]
    uses = {}
    for op in n.opamps:
        if op["name"]:
            uses[op["name"]] = uses.get(op["name"], 0) + 1
    oplabel = lambda op: op["name"] if uses[op["name"]] == 1 else f"stage {op['stage']} {op['name']}"
    for op in n.opamps:
        if op["name"] and op["model"].get("enVPerRtHz", 0) > 0:
            labels.append(oplabel(op) + " en")
        if op["name"] and op["model"].get("inAPerRtHz", 0) > 0:
            labels.append(oplabel(op) + " in")
    W = [w[2] for w in watched]
    out = np.zeros((len(freqs), len(labels)))
    wat = np.zeros((len(freqs), len(W)))
    for fi, f in enumerate(freqs):
        M, idx, no = solve_all(n, f)
        size = M.shape[0]
        rhs, pw = [], []
        e = np.zeros(size, dtype=complex)
        e[size - 1] = 1.0
        rhs.append(e)
        pw.append(src["densityVPerRtHz"] ** 2 * (1 + src.get("flickerCornerHz", 0) / f) if src else 0.0)
        for kind, d, v, a, b in n.parts:
            if kind != "R":
                continue
            e = np.zeros(size, dtype=complex)
            if a in idx:
                e[idx[a]] += 1.0
            if b in idx:
                e[idx[b]] -= 1.0
            rhs.append(e)
            pw.append(4 * K_B * T / v)
        inj = []  # (label index, list of rhs indices) for 'in' with two pins
        for k, op in enumerate(n.opamps):
            m = op["model"]
            if not op["name"]:
                continue
            if m.get("enVPerRtHz", 0) > 0:
                e = np.zeros(size, dtype=complex)
                e[no + k] = 1.0
                rhs.append(e)
                pw.append(m["enVPerRtHz"] ** 2 * (1 + m.get("enCornerHz", 0) / f))
            if m.get("inAPerRtHz", 0) > 0:
                d2 = m["inAPerRtHz"] ** 2 * (1 + m.get("inCornerHz", 0) / f)
                group = []
                for pin in (op["plus"], op["minus"]):
                    e = np.zeros(size, dtype=complex)
                    if pin in idx:
                        e[idx[pin]] = 1.0
                    group.append(len(rhs))
                    rhs.append(e)
                    pw.append(d2)
                inj.append(group)
        X = np.linalg.solve(M, np.array(rhs).T)
        p_all = np.abs(X) ** 2 * np.array(pw)[None, :]
        # fold the two 'in' pins of each op-amp into one contributor
        cols, skip = [], set()
        for g in inj:
            skip.add(g[1])
        for j in range(len(rhs)):
            if j in skip:
                continue
            cols.append(j)
        per = p_all[idx[outnode], :]
        merged = []
        gi = {g[0]: g[1] for g in inj}
        for j in cols:
            merged.append(per[j] + (per[gi[j]] if j in gi else 0.0))
        out[fi, :] = merged
        for wi, node in enumerate(W):
            wat[fi, wi] = p_all[idx[node], :].sum()
    return labels, watched, out, wat


def main():
    os.makedirs(OUT, exist_ok=True)
    ref = {"generator": "src/test/python/gen_budget_reference.py", "numpy": np.__version__, "designs": []}
    for file, d in (("reference-a.json", DESIGN_A), ("reference-b.json", DESIGN_B)):
        with open(os.path.join(OUT, file), "w") as fh:
            json.dump(design_json(d), fh, indent=2)
            fh.write("\n")
        points = [1.0, 7.3, 20.0, 63.0, 250.0, 1000.0, 3170.0, 10000.0, 20000.0, 47000.0]
        labels, watched, dens, _ = densities(d, points)
        lo, hi = 20.0, 20000.0
        u = np.linspace(math.log(lo), math.log(hi), 400001)
        f = np.exp(u)
        _, _, dgrid, wgrid = densities(d, f)
        def integ(y):
            return np.trapezoid(y * f, u)
        per_c = [integ(dgrid[:, j]) for j in range(len(labels))]
        total = dgrid.sum(axis=1)
        w2 = (2 * math.pi * f) ** 2
        ref["designs"].append({
            "file": file, "loHz": lo, "hiHz": hi,
            "points": [{"hz": p, "contributors": dict(zip(labels, dens[i].tolist()))} for i, p in enumerate(points)],
            "outputRmsV": math.sqrt(integ(total)),
            "sourceRmsV": math.sqrt(per_c[0]),
            "selfNoiseRmsV": math.sqrt(sum(per_c[1:])),
            "rateRmsVPerS": math.sqrt(integ(w2 * total)),
            "contributors": {lab: math.sqrt(v) for lab, v in zip(labels, per_c)},
            "watched": [{"stage": w[0], "node": w[1], "rmsV": math.sqrt(integ(wgrid[:, k])),
                         "slewRmsVPerUs": 1e-6 * math.sqrt(integ(w2 * wgrid[:, k]))} for k, w in enumerate(watched)],
        })
    with open(os.path.join(OUT, "nodal_noise.json"), "w") as fh:
        json.dump(ref, fh, indent=1)
        fh.write("\n")


if __name__ == "__main__":
    main()
