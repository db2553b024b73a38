"""Python twin of bench/kstep-game.ts: the Bellman equations of a crossbound/1 flat JSON model,
integrated by scipy's DOP853 (Dormand-Prince 8(5,3); Hairer, Norsett & Wanner, Solving Ordinary
Differential Equations I, 1993). No error guarantee: rtol and atol are local error targets.

    python3 bench/kstep_game_scipy.py MODEL.json OUT.json [rtol] [--fixed]

--fixed: every state takes its first action throughout (a CTMC, a smooth right-hand side), as a
diagnostic of how much of DOP853's work the kinks of the max/min cost (step rejections at switches).

With t the time left, v(0) = [s in G] and dv_s/dt = opt_a sum_s' R(s,a,s') (v_s' - v_s), goal states
frozen (mode within). Prints {"seconds": ..., "nfev": ...} (the integration alone, loading and
building the matrices excluded) and writes the values at T by state name to OUT.json.
Tested with scipy 1.17.1 and numpy 2.4.6.
"""
import json
import sys
import time

import numpy as np
from scipy.integrate import solve_ivp
from scipy.sparse import csr_matrix


def main() -> None:
    model_path, out_path = sys.argv[1], sys.argv[2]
    rtol = float(sys.argv[3]) if len(sys.argv) > 3 else 1e-12
    fixed = '--fixed' in sys.argv
    with open(model_path) as f:
        m = json.load(f)
    if m.get('goal_mode', 'within') != 'within':
        raise SystemExit('only goal mode within')
    index = {}
    for s, _a, t, _r in m['transitions']:
        for n in (s, t):
            if n not in index:
                index[n] = len(index)
    S = len(index)
    # action slot q of a state: its q-th action in order of first appearance
    slot = {}
    per_state = {}
    rows = {}
    for s, a, t, r in m['transitions']:
        key = (s, a)
        if key not in slot:
            q = per_state.get(s, 0)
            per_state[s] = q + 1
            slot[key] = q
        q = slot[key]
        rows.setdefault(q, ([], [], []))
        if s != t:
            rows[q][0].append(index[s])
            rows[q][1].append(index[t])
            rows[q][2].append(float(r))
    nq = max(rows) + 1
    goal = np.zeros(S, dtype=bool)
    for g in m['goal']:
        goal[index[g]] = True
    sign = np.ones(S)
    for n, o in m.get('owners', {}).items():
        if o == 'min':
            sign[index[n]] = -1.0
    has = np.zeros((nq, S), dtype=bool)
    for (s, _a), q in slot.items():
        has[q, index[s]] = True
    mats = []
    for q in range(nq):
        i, j, r = rows.get(q, ([], [], []))
        R = csr_matrix((np.array(r), (np.array(i, dtype=np.int64), np.array(j, dtype=np.int64))), shape=(S, S))
        E = np.asarray(R.sum(axis=1)).ravel()
        mats.append((R, E))
    active = ~goal & has.any(axis=0)

    def rhs(_t: float, v: np.ndarray) -> np.ndarray:
        best = np.full(S, -np.inf)
        for q, (R, E) in enumerate(mats[:1] if fixed else mats):
            d = sign * (R @ v - E * v)
            best = np.where(has[q], np.maximum(best, d), best)
        out = sign * best
        out[~active] = 0.0
        return out

    v0 = goal.astype(float)
    t0 = time.perf_counter()
    sol = solve_ivp(rhs, (0.0, float(m['time_bound'])), v0, method='DOP853', rtol=rtol, atol=rtol, t_eval=None)
    secs = time.perf_counter() - t0
    if not sol.success:
        raise SystemExit(sol.message)
    v = sol.y[:, -1]
    names = list(index)
    with open(out_path, 'w') as f:
        json.dump({names[i]: float(v[i]) for i in range(S)}, f)
    print(json.dumps({'seconds': secs, 'nfev': int(sol.nfev)}))


if __name__ == '__main__':
    main()
