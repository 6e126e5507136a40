#!/usr/bin/env python3
"""Yardstick for the benchmark: the phasor solve a user would otherwise write
with SciPy's sparse LU (SuperLU), reading the same coilwright.graph/1 file.

    python3 scripts/bench/scipy_yardstick.py solve FILE.json
    python3 scripts/bench/scipy_yardstick.py sweep FILE.json --from 10 --to 100000 --points 50 --log [--probe a,b]
    python3 scripts/bench/scipy_yardstick.py transient FILE.json --stop T --step H --probe a

`transient` integrates A0·x + A1·dx/dt = b(t) (the same MNA read in the time
domain, each source its phasor as a cosine) with the trapezoidal rule at the
fixed step H from rest: (A0 + 2/H·A1) is factored once with splu and solved
once per step; it prints the probed node voltages at every step.

Modified nodal analysis: one unknown per non-ground node, plus a branch
current for every voltage source, every inductor and each side of every ideal
transformer. The matrix is A(w) = A0 + jw*A1; mutual terms jw*M*d_i*d_j sit
between the branch rows of coupled inductors (d = +1 with the dot on nodes[0],
-1 with it on nodes[1]). Each frequency is factored afresh with splu.

Galvanically isolated parts are not handled (they come out singular).
"""
import argparse
import json
import math
import sys

import numpy as np
import scipy.sparse as sp
from scipy.sparse.linalg import splu


class Refusal(Exception):
    pass


def phasor(el):
    return el["magnitude"] * complex(math.cos(math.radians(el["phaseDeg"])), math.sin(math.radians(el["phaseDeg"])))


class Mna:
    def __init__(self, model):
        if model.get("schema") != "coilwright.graph/1":
            raise Refusal("not a coilwright.graph/1 file")
        self.model = model
        self.ground = model["ground"]
        self.node_index = {}
        for el in model["elements"]:
            for n in el["nodes"]:
                if n != self.ground and n not in self.node_index:
                    self.node_index[n] = len(self.node_index)
        size = len(self.node_index)
        self.branch = {}  # element id -> first branch row
        self.inductors = {}
        for el in model["elements"]:
            kind = el["kind"]
            if kind in ("voltage-source", "inductor"):
                self.branch[el["id"]] = size
                size += 1
            elif kind == "ideal-transformer":
                self.branch[el["id"]] = size
                size += 2
            if kind == "inductor":
                self.inductors[el["id"]] = el
        self.size = size
        self._assemble()

    def idx(self, name):
        return -1 if name == self.ground else self.node_index[name]

    def _assemble(self):
        r0, c0, v0 = [], [], []  # frequency-independent part
        r1, c1, v1 = [], [], []  # coefficient of jw
        b = np.zeros(self.size, dtype=complex)

        def add(rows, cols, vals, i, j, v):
            if i >= 0 and j >= 0:
                rows.append(i)
                cols.append(j)
                vals.append(v)

        def stamp_admittance(rows, cols, vals, a, c, y):
            add(rows, cols, vals, a, a, y)
            add(rows, cols, vals, c, c, y)
            add(rows, cols, vals, a, c, -y)
            add(rows, cols, vals, c, a, -y)

        def stamp_branch_incidence(a, c, k):
            # current k leaves node a into the part and comes out at node c;
            # the branch row reads V(a) - V(c) + ...
            add(r0, c0, v0, a, k, 1.0)
            add(r0, c0, v0, c, k, -1.0)
            add(r0, c0, v0, k, a, 1.0)
            add(r0, c0, v0, k, c, -1.0)

        for el in self.model["elements"]:
            kind = el["kind"]
            n = [self.idx(x) for x in el["nodes"]]
            if kind == "resistor":
                stamp_admittance(r0, c0, v0, n[0], n[1], 1.0 / el["ohms"])
            elif kind == "capacitor":
                stamp_admittance(r1, c1, v1, n[0], n[1], el["farads"])
            elif kind == "inductor":
                k = self.branch[el["id"]]
                stamp_branch_incidence(n[0], n[1], k)
                add(r1, c1, v1, k, k, -el["henries"])
            elif kind == "voltage-source":
                k = self.branch[el["id"]]
                stamp_branch_incidence(n[0], n[1], k)
                b[k] = phasor(el)
            elif kind == "current-source":
                j = phasor(el)
                if n[0] >= 0:
                    b[n[0]] -= j
                if n[1] >= 0:
                    b[n[1]] += j
            elif kind == "ideal-transformer":
                kp = self.branch[el["id"]]
                ks = kp + 1
                ratio = el["ratio"]
                # primary and secondary currents enter their dotted terminals
                add(r0, c0, v0, n[0], kp, 1.0)
                add(r0, c0, v0, n[1], kp, -1.0)
                add(r0, c0, v0, n[2], ks, 1.0)
                add(r0, c0, v0, n[3], ks, -1.0)
                # Vp - ratio * Vs = 0
                add(r0, c0, v0, kp, n[0], 1.0)
                add(r0, c0, v0, kp, n[1], -1.0)
                add(r0, c0, v0, kp, n[2], -ratio)
                add(r0, c0, v0, kp, n[3], ratio)
                # ratio * Ip + Is = 0
                add(r0, c0, v0, ks, kp, ratio)
                add(r0, c0, v0, ks, ks, 1.0)
            else:
                raise Refusal(f"element {el['id']}: unknown kind {kind!r}")

        for cp in self.model.get("couplings", []) or []:
            names = cp["windings"]
            for i in range(len(names)):
                for j in range(i + 1, len(names)):
                    li, lj = self.inductors[names[i]], self.inductors[names[j]]
                    m = cp["k"] * math.sqrt(li["henries"] * lj["henries"]) if "k" in cp else cp["henries"]
                    di = 1.0 if li.get("dot", "first") == "first" else -1.0
                    dj = 1.0 if lj.get("dot", "first") == "first" else -1.0
                    ki, kj = self.branch[names[i]], self.branch[names[j]]
                    add(r1, c1, v1, ki, kj, -m * di * dj)
                    add(r1, c1, v1, kj, ki, -m * di * dj)

        shape = (self.size, self.size)
        self.a0 = sp.csc_matrix((np.array(v0, dtype=complex), (np.array(r0), np.array(c0))), shape=shape)
        self.a1 = sp.csc_matrix((np.array(v1, dtype=complex), (np.array(r1), np.array(c1))), shape=shape)
        self.b = b

    def solve(self, f):
        w = 2.0 * math.pi * f
        a = (self.a0 + (1j * w) * self.a1).tocsc()
        try:
            lu = splu(a)
        except RuntimeError as exc:
            raise Refusal(f"the matrix is singular at {f} Hz ({exc})")
        return lu.solve(self.b)


def element_values(mna, x, el, f):
    """(voltage, current) of a two-terminal element, or ([Vp, Vs], [Ip, Is])."""
    def v(name):
        i = mna.idx(name)
        return 0j if i < 0 else x[i]

    kind = el["kind"]
    nodes = el["nodes"]
    if kind == "ideal-transformer":
        k = mna.branch[el["id"]]
        return [v(nodes[0]) - v(nodes[1]), v(nodes[2]) - v(nodes[3])], [x[k], x[k + 1]]
    u = v(nodes[0]) - v(nodes[1])
    if kind == "resistor":
        i = u / el["ohms"]
    elif kind == "capacitor":
        i = 2j * math.pi * f * el["farads"] * u
    elif kind == "current-source":
        i = phasor(el)
    else:
        i = x[mna.branch[el["id"]]]
    return u, i


def cj(z):
    return {"re": float(z.real), "im": float(z.imag)}


def solve_result(mna, f):
    model = mna.model
    x = mna.solve(f)
    scale = 1.0 if model["amplitudes"] == "rms" or f == 0 else 0.5
    nodes = {mna.ground: {"re": 0.0, "im": 0.0}}
    xs = x.tolist()
    for name, i in mna.node_index.items():
        nodes[name] = cj(xs[i])
    elements = {}
    for el in model["elements"]:
        u, i = element_values(mna, xs, el, f)
        if el["kind"] == "ideal-transformer":
            s = scale * (u[0] * i[0].conjugate() + u[1] * i[1].conjugate())
            elements[el["id"]] = {"voltages": [cj(u[0]), cj(u[1])], "currents": [cj(i[0]), cj(i[1])],
                                  "power": {"watts": float(s.real), "vars": float(s.imag)}}
        else:
            s = scale * u * i.conjugate()
            elements[el["id"]] = {"voltage": cj(u), "current": cj(i),
                                  "power": {"watts": float(s.real), "vars": float(s.imag)}}
    return {"schema": "coilwright.result/1", "frequencyHz": f, "amplitudes": model["amplitudes"],
            "nodes": nodes, "elements": elements, "warnings": []}


def sweep_result(mna, freqs, probe):
    model = mna.model
    by_id = {el["id"]: el for el in model["elements"]}
    if probe is None:
        node_names = [mna.ground] + list(mna.node_index)
        element_ids = list(by_id)
    else:
        node_names, element_ids = [], []
        for name in probe:
            if name in by_id:
                element_ids.append(name)
            elif name == mna.ground or name in mna.node_index:
                node_names.append(name)
            else:
                raise ValueError(f"--probe: no node or element named {name!r}")
    nodes = {name: [] for name in node_names}
    elements = {}
    for eid in element_ids:
        if by_id[eid]["kind"] == "ideal-transformer":
            elements[eid] = {"voltages": [], "currents": []}
        else:
            elements[eid] = {"voltage": [], "current": []}
    for f in freqs:
        x = mna.solve(f)
        for name in node_names:
            i = mna.idx(name)
            nodes[name].append(cj(0j if i < 0 else x[i]))
        for eid in element_ids:
            u, i = element_values(mna, x, by_id[eid], f)
            if "voltages" in elements[eid]:
                elements[eid]["voltages"].append([cj(u[0]), cj(u[1])])
                elements[eid]["currents"].append([cj(i[0]), cj(i[1])])
            else:
                elements[eid]["voltage"].append(cj(u))
                elements[eid]["current"].append(cj(i))
    return {"schema": "coilwright.sweep/1", "amplitudes": model["amplitudes"],
            "frequenciesHz": [float(f) for f in freqs], "nodes": nodes, "elements": elements, "warnings": []}


def transient_result(mna, stop, step, probe):
    model = mna.model
    w = 2.0 * math.pi * float(model["frequencyHz"])
    crest = math.sqrt(2.0) if model["amplitudes"] == "rms" else 1.0
    a0 = mna.a0.real.tocsc()
    a1 = mna.a1.real.tocsc()
    bre = (mna.b * crest).real.copy()
    bim = (mna.b * crest).imag.copy()
    steps = int(math.floor(stop / step * (1 + 1e-12) + 1e-9))
    lu = splu((a0 + (2.0 / step) * a1).tocsc())
    w_mat = ((2.0 / step) * a1 - a0).tocsr()
    rows = [mna.idx(name) for name in probe]
    x = np.zeros(mna.size)
    out = np.zeros((steps + 1, len(rows)))
    b_prev = bre.copy()  # b(0): Re(B·e^(jw·0))
    for k in range(1, steps + 1):
        t = k * step
        b_now = bre * math.cos(w * t) - bim * math.sin(w * t)
        x = lu.solve(w_mat @ x + b_prev + b_now)
        b_prev = b_now
        out[k] = x[rows]
    times = [k * step for k in range(steps + 1)]
    return {"schema": "coilwright.transient/1", "timesS": times,
            "nodes": {name: out[:, j].tolist() for j, name in enumerate(probe)}, "elements": {}, "warnings": []}


def main(argv):
    parser = argparse.ArgumentParser(description="SciPy sparse-LU phasor solve of a coilwright.graph/1 file")
    parser.add_argument("command", choices=["solve", "sweep", "transient"])
    parser.add_argument("--stop", type=float)
    parser.add_argument("--step", type=float)
    parser.add_argument("file")
    parser.add_argument("--from", dest="f_from", type=float)
    parser.add_argument("--to", dest="f_to", type=float)
    parser.add_argument("--points", type=int)
    parser.add_argument("--log", action="store_true")
    parser.add_argument("--probe")
    args = parser.parse_args(argv)
    try:
        with open(args.file, encoding="utf-8") as fh:
            model = json.load(fh)
        mna = Mna(model)
        if args.command == "solve":
            out = solve_result(mna, float(model["frequencyHz"]))
        elif args.command == "transient":
            if not args.stop or not args.step or not args.probe:
                parser.error("transient needs --stop, --step and --probe")
            out = transient_result(mna, args.stop, args.step, args.probe.split(","))
        else:
            if args.f_from is None or args.f_to is None or not args.points or args.points < 1:
                parser.error("sweep needs --from, --to and --points")
            if args.points == 1:
                freqs = [args.f_from]
            elif args.log:
                freqs = np.geomspace(args.f_from, args.f_to, args.points).tolist()
            else:
                freqs = np.linspace(args.f_from, args.f_to, args.points).tolist()
            probe = args.probe.split(",") if args.probe else None
            try:
                out = sweep_result(mna, freqs, probe)
            except ValueError as exc:
                print(str(exc), file=sys.stderr)
                return 2
    except (Refusal, KeyError, TypeError, ValueError, OSError) as exc:
        print(f"refused: {exc}", file=sys.stderr)
        return 1
    json.dump(out, sys.stdout)
    sys.stdout.write("\n")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
