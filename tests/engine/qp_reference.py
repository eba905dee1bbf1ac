#!/usr/bin/env python3
"""Reference solutions of blend QPs with SciPy, for tests/engine/blend_solver_test.cpp.

Reads a JSON list of problems from argv[1]; each has A (rows = axes, columns = shares), b, w, C, d
and optionally e, e0. Minimises J(x) = (A x - b)^T diag(w) (A x - b) subject to x >= 0,
sum(x) = 1, C x <= d and e^T x = e0 with scipy.optimize.minimize(method="SLSQP") from several
starting points, keeps the best point that satisfies the constraints to 1e-8, and prints a JSON
list of objectives (null when no start converged to a feasible point).
"""
import json
import sys

import numpy as np
from scipy.optimize import minimize


def solve(problem):
    a = np.array(problem["A"], dtype=float)
    b = np.array(problem["b"], dtype=float)
    w = np.array(problem["w"], dtype=float)
    n = a.shape[1]
    c = np.array(problem["C"], dtype=float).reshape(-1, n)
    d = np.array(problem["d"], dtype=float)

    def objective(x):
        r = a @ x - b
        return float(r @ (w * r))

    def gradient(x):
        return 2.0 * a.T @ (w * (a @ x - b))

    constraints = [{"type": "eq", "fun": lambda x: np.sum(x) - 1.0, "jac": lambda x: np.ones(n)}]
    if len(d):
        constraints.append({"type": "ineq", "fun": lambda x: d - c @ x, "jac": lambda x: -c})
    if "e" in problem:
        e = np.array(problem["e"], dtype=float)
        e0 = float(problem["e0"])
        constraints.append({"type": "eq", "fun": lambda x: np.array([e @ x - e0]), "jac": lambda x: e.reshape(1, n)})

    starts = [np.full(n, 1.0 / n)] + [np.eye(n)[i] for i in range(n)]
    rng = np.random.default_rng(12345)
    starts += [rng.dirichlet(np.ones(n)) for _ in range(4)]
    best = None
    for x0 in starts:
        result = minimize(objective, x0, jac=gradient, method="SLSQP", bounds=[(0.0, None)] * n,
                          constraints=constraints, options={"ftol": 1e-15, "maxiter": 1000})
        x = result.x
        feasible = (x.min() >= -1e-8 and abs(x.sum() - 1.0) <= 1e-8
                    and (len(d) == 0 or (c @ x - d).max() <= 1e-8)
                    and ("e" not in problem or abs(e @ x - e0) <= 1e-8))
        if feasible and (best is None or objective(x) < best):
            best = objective(x)
    return best


def main():
    with open(sys.argv[1]) as f:
        problems = json.load(f)
    print(json.dumps([solve(p) for p in problems]))


if __name__ == "__main__":
    main()
