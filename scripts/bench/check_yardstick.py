#!/usr/bin/env python3
"""Checks the SciPy yardstick on small circuits whose answers are known in
closed form, so the benchmark compares against a correct reference.

    python3 scripts/bench/check_yardstick.py   (exit 0 when every check holds)
"""
import cmath
import json
import math
import os
import subprocess
import sys
import tempfile

HERE = os.path.dirname(os.path.abspath(__file__))
YARDSTICK = os.path.join(HERE, "scipy_yardstick.py")
failures = []


def run(model, *args):
    with tempfile.NamedTemporaryFile("w", suffix=".json", delete=False) as fh:
        json.dump(model, fh)
        path = fh.name
    try:
        cmd = [sys.executable, YARDSTICK, args[0] if args else "solve", path, *args[1:]]
        out = subprocess.run(cmd, capture_output=True, text=True)
        if out.returncode != 0:
            raise RuntimeError(out.stderr)
        return json.loads(out.stdout)
    finally:
        os.unlink(path)


def c(j):
    return complex(j["re"], j["im"])


def close(name, got, want, rel=1e-9):
    ok = abs(got - want) <= rel * max(abs(want), 1e-300)
    print(("ok   " if ok else "FAIL ") + f"{name}: got {got:.12g}, want {want:.12g}")
    if not ok:
        failures.append(name)


def graph(elements, couplings=(), f=50.0, amplitudes="rms"):
    return {"schema": "coilwright.graph/1", "frequencyHz": f, "amplitudes": amplitudes, "ground": "gnd",
            "elements": list(elements), "couplings": list(couplings)}


def tellegen(name, res):
    total = sum(complex(e["power"]["watts"], e["power"]["vars"]) for e in res["elements"].values())
    biggest = max(abs(complex(e["power"]["watts"], e["power"]["vars"])) for e in res["elements"].values())
    ok = abs(total) <= 1e-9 * biggest
    print(("ok   " if ok else "FAIL ") + f"{name}: Tellegen residual {abs(total):.3g} of largest power {biggest:.3g}")
    if not ok:
        failures.append(name)


# 1. Voltage divider: V(b) = V * R2 / (R1 + R2)  (closed form, Ohm's law)
res = run(graph([
    {"id": "V", "kind": "voltage-source", "nodes": ["a", "gnd"], "magnitude": 10, "phaseDeg": 0},
    {"id": "R1", "kind": "resistor", "nodes": ["a", "b"], "ohms": 1000},
    {"id": "R2", "kind": "resistor", "nodes": ["b", "gnd"], "ohms": 3000},
]))
close("divider V(b)", c(res["nodes"]["b"]), 10 * 3000 / 4000)
close("divider source current", c(res["elements"]["V"]["current"]), -10 / 4000)  # leaves nodes[0] into the circuit
close("divider source power", res["elements"]["V"]["power"]["watts"], -10 * 10 / 4000)  # delivers V^2/R
tellegen("divider", res)

# 2. Series RL at 50 Hz: I = V / (R + jwL)  (closed form, impedance of a series RL)
w = 2 * math.pi * 50
v = 230 * cmath.exp(1j * math.radians(30))
res = run(graph([
    {"id": "V", "kind": "voltage-source", "nodes": ["a", "gnd"], "magnitude": 230, "phaseDeg": 30},
    {"id": "R", "kind": "resistor", "nodes": ["a", "b"], "ohms": 10},
    {"id": "L", "kind": "inductor", "nodes": ["b", "gnd"], "henries": 0.05},
]))
i_rl = v / (10 + 1j * w * 0.05)
close("series RL current", c(res["elements"]["L"]["current"]), i_rl)
close("series RL inductor voltage", c(res["elements"]["L"]["voltage"]), 1j * w * 0.05 * i_rl)
close("series RL reactive power", res["elements"]["L"]["power"]["vars"], w * 0.05 * abs(i_rl) ** 2)  # Q = wL|I|^2 (rms)
tellegen("series RL", res)

# 2b. Same circuit with peak amplitudes: phasors unchanged, powers halved  (S = 1/2 V I*)
res_peak = run(graph([
    {"id": "V", "kind": "voltage-source", "nodes": ["a", "gnd"], "magnitude": 230, "phaseDeg": 30},
    {"id": "R", "kind": "resistor", "nodes": ["a", "b"], "ohms": 10},
    {"id": "L", "kind": "inductor", "nodes": ["b", "gnd"], "henries": 0.05},
], amplitudes="peak"))
close("series RL peak power", res_peak["elements"]["R"]["power"]["watts"], 0.5 * 10 * abs(i_rl) ** 2)


# 3. Coupled pair: primary V - R1 - L1, secondary L2 loaded by RL, both dots on nodes[0].
#    Z_in = R1 + jwL1 + (wM)^2 / (RL + jwL2)   (reflected impedance, field notes)
#    I_load = jwM * I1 / (RL + jwL2)           (secondary loop equation, field notes' V2 = +jwM I1 + jwL2 I2)
def coupled(dot1, dot2, f=1000.0):
    return graph([
        {"id": "V", "kind": "voltage-source", "nodes": ["a", "gnd"], "magnitude": 12, "phaseDeg": 0},
        {"id": "R1", "kind": "resistor", "nodes": ["a", "b"], "ohms": 2},
        {"id": "L1", "kind": "inductor", "nodes": ["b", "gnd"], "henries": 0.01, "dot": dot1},
        {"id": "L2", "kind": "inductor", "nodes": ["c", "gnd"], "henries": 0.0025, "dot": dot2},
        {"id": "RL", "kind": "resistor", "nodes": ["c", "gnd"], "ohms": 8},
    ], [{"id": "K", "windings": ["L1", "L2"], "k": 0.8}], f=f)


w = 2 * math.pi * 1000
m = 0.8 * math.sqrt(0.01 * 0.0025)
zin = 2 + 1j * w * 0.01 + (w * m) ** 2 / (8 + 1j * w * 0.0025)
i1 = 12 / zin
i_load = 1j * w * m * i1 / (8 + 1j * w * 0.0025)
res = run(coupled("first", "first"))
close("coupled primary current", c(res["elements"]["L1"]["current"]), i1)
close("coupled load current", c(res["elements"]["RL"]["current"]), i_load)
tellegen("coupled pair", res)
res_flip_both = run(coupled("second", "second"))  # flipping both dots changes nothing (field notes)
close("coupled, both dots flipped", c(res_flip_both["elements"]["RL"]["current"]), i_load)
res_flip_one = run(coupled("first", "second"))  # one dot flipped: M -> -M, load current negates
close("coupled, one dot flipped", c(res_flip_one["elements"]["RL"]["current"]), -i_load)

# 4. Ideal transformer 4:1 into 100 ohm: the source sees 16 * 100 ohm  (ratio^2 impedance transformation)
res = run(graph([
    {"id": "V", "kind": "voltage-source", "nodes": ["a", "gnd"], "magnitude": 230, "phaseDeg": 0},
    {"id": "T", "kind": "ideal-transformer", "nodes": ["a", "gnd", "s", "gnd"], "ratio": 4},
    {"id": "R", "kind": "resistor", "nodes": ["s", "gnd"], "ohms": 100},
]))
close("transformer secondary voltage", c(res["nodes"]["s"]), 230 / 4)
close("transformer primary current", c(res["elements"]["T"]["currents"][0]), 230 / 1600)
close("transformer secondary current", c(res["elements"]["T"]["currents"][1]), -230 / 400)  # ratio*Ip + Is = 0
tellegen("ideal transformer", res)

# 5. Sweep of the series RL: each point matches V / (R + jwL)  (closed form)
sweep = run(graph([
    {"id": "V", "kind": "voltage-source", "nodes": ["a", "gnd"], "magnitude": 1, "phaseDeg": 0},
    {"id": "R", "kind": "resistor", "nodes": ["a", "b"], "ohms": 10},
    {"id": "L", "kind": "inductor", "nodes": ["b", "gnd"], "henries": 0.05},
]), "sweep", "--from", "10", "--to", "100000", "--points", "5", "--log", "--probe", "b,L")
close("sweep 3rd frequency", sweep["frequenciesHz"][2], 1000.0)  # log spacing 10..1e5 in 5 points
for f, vb in zip(sweep["frequenciesHz"], sweep["nodes"]["b"]):
    wf = 2 * math.pi * f
    close(f"sweep V(b) at {f:g} Hz", c(vb), 1j * wf * 0.05 / (10 + 1j * wf * 0.05))

print("all checks hold" if not failures else f"{len(failures)} checks FAILED")
sys.exit(1 if failures else 0)
