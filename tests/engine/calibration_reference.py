#!/usr/bin/env python3
"""Reference brewhouse calibrations with SciPy, for tests/engine/calibration_test.cpp.

Reads a JSON object from argv[1]: {"fits": [{"boil": [...], "late": [...], "lab": [...]}],
"t": [[p, dof], ...], "f": [[x, d1, d2], ...], "normal": [p, ...]}. For each fit it prints, from
scipy.optimize.lsq_linear (least squares through the origin, one column model = boil + late, and two
columns boil, late), the factor, its standard error and 95 % interval with scipy.stats.t.ppf, the
residuals, the robust deviation scipy.stats.median_abs_deviation(scale="normal"), and for the two
columns each factor's interval and the extra-sum-of-squares F test's p (scipy.stats.f.sf). It also
prints t.ppf, t.cdf, f.sf and norm.ppf for the listed arguments.
"""
import json
import sys

import numpy as np
from scipy import stats
from scipy.optimize import lsq_linear


def fit(x, y):
    solution = lsq_linear(x, y, method="bvls", tol=1e-15, lsmr_tol=None)
    beta = solution.x
    residuals = y - x @ beta
    n, k = x.shape
    dof = n - k
    s2 = float(residuals @ residuals) / dof
    covariance = s2 * np.linalg.inv(x.T @ x)
    se = np.sqrt(np.diag(covariance))
    t = stats.t.ppf(0.975, dof)
    return beta, se, t, residuals, s2, dof


def one_fit(problem):
    boil = np.array(problem["boil"], dtype=float)
    late = np.array(problem["late"], dtype=float)
    y = np.array(problem["lab"], dtype=float)
    m = (boil + late).reshape(-1, 1)
    beta, se, t, residuals, s2, dof = fit(m, y)
    out = {
        "factor": beta[0], "se": se[0], "low": beta[0] - t * se[0], "high": beta[0] + t * se[0], "t": t,
        "s2": s2, "residuals": residuals.tolist(),
        "robust_sd": float(stats.median_abs_deviation(residuals, scale="normal")),
        "median": float(np.median(residuals)),
    }
    if problem.get("split"):
        x = np.column_stack([boil, late])
        beta2, se2, t2, residuals2, s2_2, dof2 = fit(x, y)
        rss1 = float(residuals @ residuals)
        rss2 = float(residuals2 @ residuals2)
        f = (rss1 - rss2) / (rss2 / dof2)
        out["split"] = {
            "boil": beta2[0], "late": beta2[1], "boil_low": beta2[0] - t2 * se2[0], "boil_high": beta2[0] + t2 * se2[0],
            "late_low": beta2[1] - t2 * se2[1], "late_high": beta2[1] + t2 * se2[1], "s2": s2_2, "f": f,
            "p": float(stats.f.sf(f, 1, dof2)),
        }
    return out


def main():
    request = json.loads(sys.argv[1])
    print(json.dumps({
        "fits": [one_fit(p) for p in request.get("fits", [])],
        "t": [float(stats.t.ppf(p, dof)) for p, dof in request.get("t", [])],
        "f": [float(stats.f.sf(x, d1, d2)) for x, d1, d2 in request.get("f", [])],
        "normal": [float(stats.norm.ppf(p)) for p in request.get("normal", [])],
        "t_cdf": [float(stats.t.cdf(t, dof)) for t, dof in request.get("t_cdf", [])],
    }))


if __name__ == "__main__":
    main()
