#!/usr/bin/env python3
"""An example external solver for crossbound: explicit Euler on the Bellman equations, pure Python.

    crossbound check corpus --solver 'python3 examples/solvers/euler_adapter.py {model} {precision}'

Two options play other kinds of solver, to show how crossbound records them:
  --refuse-games  refuses two-player games (a model with states of both the max and the min player),
                  as a solver for CTMCs and CTMDPs only would;
  --no-bound      prints no error_bound, as a solver that only knows the tolerance it was asked for
                  would (its answer is then a fault unless the user passes --default-bound).

It reads the model file the harness writes (format crossbound/1, JSON, the `states` form) and prints
one result (format crossbound-result/1) on standard output. It is honest and simple rather than fast:

- Method: explicit Euler with equal steps h = T/n and h <= 1/lam, lam the largest exit rate of a state
  that evolves (L. Euler's polygon method). With h <= 1/lam every step is a monotone, sup-norm
  non-expansive map, the exact flow is non-expansive too, and the error after n steps is at most
  lam^2 * n * h^2 = lam^2 * T * h (each step's local error is at most (lam*h)^2).
- Rounding: each step adds at most (d + 3) * u * lam * h per state to the increment (d = longest row,
  u = 2^-53) and u to the value when the increment is added: in all (d + 3) * u * lam * T + n * u, a
  first-order sum with a margin of 10 % (the second-order part is far smaller); the bound states it.
- It also returns a `trajectory`: the values at up to about 1000 of its step times (time left 0 ... T),
  which the harness may certify by itself; they are simply the iterates the loop below computes.
- It refuses (prints {"refused": ...}) when n * (states + transitions) would exceed WORK_CAP, so that
  it never runs near crossbound's default time limit of 60 s; a refusal is not a fault. (At 3e7 it
  took 13 s of CPU on 1.8e7 units, and a transformed copy near the cap passed 60 s of wall time on a
  loaded 2-core machine: a timeout, which is a fault. 1e7 units take about 7 s of CPU.) As n grows like (lam*T)^2 / precision, most
  models of the bundled corpus are refused at the default precision 1e-6 and answered at 1e-3.
Goal states are absorbing in goal mode `within` and keep their actions in mode `at`.
"""
import json
import math
import sys

WORK_CAP = 1e7
U = 2.0 ** -53
VERSION = "1.2"


FLAGS = {"--refuse-games", "--no-bound"}


def main() -> int:
    args = [a for a in sys.argv[1:] if a not in FLAGS]
    flags = set(sys.argv[1:]) & FLAGS
    if len(args) != 2:
        print("usage: euler_adapter.py MODEL.json PRECISION [--refuse-games] [--no-bound]", file=sys.stderr)
        return 2
    with open(args[0], encoding="utf-8") as f:
        model = json.load(f)
    precision = float(args[1])
    names = list(model["states"].keys())
    index = {s: i for i, s in enumerate(names)}
    goal = set(model["goal"])
    within = model.get("goal_mode", "within") == "within"
    T = float(model["time_bound"])
    # Rows: per state, a list of actions; per action a list of (successor, rate); self-loops dropped.
    rows, owner = [], []
    for s in names:
        st = model["states"][s]
        acts = []
        if not (within and s in goal):
            for succ in st.get("actions", {}).values():
                acts.append([(index[t], float(r)) for t, r in succ.items() if t != s and float(r) > 0])
        rows.append(acts)
        owner.append(-1 if st.get("owner") == "min" else 1)
    lam = max((sum(r for _, r in a) for acts in rows for a in acts), default=0.0)
    d = max((len(a) for acts in rows for a in acts), default=0)
    work = len(names) + sum(len(a) for acts in rows for a in acts)
    result = {"format": "crossbound-result/1", "model": model.get("name"), "method": "python-euler", "version": VERSION}
    players = {st.get("owner") for st in model["states"].values() if len(st.get("actions", {})) >= 2}
    if "--refuse-games" in flags and {"max", "min"} <= players:
        result["refused"] = "two-player games are not supported"
        print(json.dumps(result))
        return 0
    v = [1.0 if s in goal else 0.0 for s in names]
    if lam == 0.0:
        result.update(values=dict(zip(names, v)), params={"precision": precision})
        if "--no-bound" not in flags:
            result["error_bound"] = 0.0
        print(json.dumps(result))
        return 0
    lt = lam * T
    budget = precision - 1.1 * (d + 3) * U * lt - 2 * U
    n = math.ceil(max(lt * lt / budget, lt)) if budget > 0 else math.inf
    if not (n * work <= WORK_CAP):
        result["refused"] = f"{n} Euler steps over {work} states and transitions exceed this example's work cap"
        print(json.dumps(result))
        return 0
    h = T / n
    rounding = 1.1 * ((d + 3) * U * lt + n * U) + 2 * U
    every = max(1, math.ceil(n / 1000))
    times, path = [0.0], [v[:]]
    for i in range(1, n + 1):
        nxt = v[:]
        for s, acts in enumerate(rows):
            if not acts:
                continue
            best = None
            for a in acts:
                inc = sum(r * (v[t] - v[s]) for t, r in a)
                if best is None or (inc > best if owner[s] > 0 else inc < best):
                    best = inc
            nxt[s] = min(1.0, max(0.0, v[s] + h * best))
        v = nxt
        if i % every == 0 or i == n:
            times.append(T if i == n else i * h)
            path.append(v[:])
    bound = lam * lam * T * h * (1 + 1e-9) + rounding
    trajectory = {"time_left": times, "values": {s: [p[k] for p in path] for k, s in enumerate(names)}}
    result.update(values=dict(zip(names, v)), error_bound=bound, params={"precision": precision, "steps": n},
                  trajectory=trajectory)
    if "--no-bound" in flags:
        del result["error_bound"]
    print(json.dumps(result))
    return 0


if __name__ == "__main__":
    sys.exit(main())
