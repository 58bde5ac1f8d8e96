"""Least-squares fits of a series model, and 95 % intervals for lambda: profile likelihood or parametric
bootstrap (crossrate.services.series_models.Problem). lambda is always the first parameter (kJ/mol)."""

import numpy as np

from .series_models import LAMBDA_BOUNDS_KJ

#: chi-square(1 dof) 95 % point for the profile-likelihood interval (scipy.stats.chi2.ppf(0.95, 1)).
CHI2_95_1DOF = 3.841458820694124


def _least_squares():
    from scipy.optimize import least_squares  # only when a fit actually runs

    return least_squares


def best_fit(prob, starts, tol=1e-10, max_nfev=2000):
    """The least-squares solution (scipy OptimizeResult) with the lowest cost over the starting points;
    max_nfev caps the model evaluations of each start (a flat, badly determined direction can otherwise make
    the solver crawl for thousands of steps with no gain that matters)."""
    ls = _least_squares()
    lo, hi = prob.bounds()
    best = None
    for th0 in starts:
        th0 = np.clip(np.asarray(th0, dtype=float), lo + 1e-9, hi - 1e-9)
        r = ls(prob.residuals, th0, jac=prob.jacobian, bounds=(lo, hi), x_scale="jac", xtol=tol, ftol=tol, gtol=tol,
               max_nfev=max_nfev)
        if best is None or r.cost < best.cost:
            best = r
    return best


def _profile(prob, theta_hat, s2, chi2_min):
    """chi2(lambda) / s2 minimized over the other parameters, as a function of lambda (kJ/mol). Each inner
    fit starts from the last one; the values are kept, so that a bracket's ends keep the values that made it
    a bracket (an inner fit with several local minima need not land in the same one twice)."""
    ls = _least_squares()
    lo, hi = prob.bounds()
    state = {"rest": np.asarray(theta_hat[1:], dtype=float)}
    known = {float(theta_hat[0]): chi2_min}

    def value(lam):
        lam = float(lam)
        if lam in known:
            return known[lam]

        def res(rest):
            return prob.residuals(np.concatenate(([lam], rest)))

        def jac(rest):
            return prob.jacobian(np.concatenate(([lam], rest)))[:, 1:]

        r = ls(res, np.clip(state["rest"], lo[1:] + 1e-9, hi[1:] - 1e-9), jac=jac, bounds=(lo[1:], hi[1:]),
               x_scale="jac", xtol=1e-8, ftol=1e-8, max_nfev=1000)
        state["rest"] = r.x
        known[lam] = 2.0 * r.cost / s2
        return known[lam]

    return value


def profile_interval(prob, theta_hat, s2, chi2_min, se_guess=None):
    """(low, high) of the 95 % profile-likelihood interval for lambda (kJ/mol); a side is None when the
    profile stays below the 95 % level up to the edge of the search range (1-2000 kJ/mol).

    Steps out from the estimate (first step from the Jacobian SE when given, growing by 1.6 each time),
    then finds the crossing by Brent's method to 0.2 % of lambda.
    """
    from scipy.optimize import brentq

    lam_hat = float(theta_hat[0])
    first = 0.08 if not se_guess or not np.isfinite(se_guess) else min(max(1.5 * se_guess / lam_hat, 0.02), 0.5)
    out = []
    for direction in (-1.0, 1.0):
        prof = _profile(prob, theta_hat, s2, chi2_min)
        prev, step, bound = lam_hat, first, None
        for _ in range(40):
            lam = lam_hat * (1.0 + step) if direction > 0 else lam_hat / (1.0 + step)
            edge = LAMBDA_BOUNDS_KJ[1] if direction > 0 else LAMBDA_BOUNDS_KJ[0]
            if (lam - edge) * direction >= 0:
                lam = edge
            if prof(lam) - chi2_min > CHI2_95_1DOF:
                def g(v, prof=prof):
                    return prof(v) - chi2_min - CHI2_95_1DOF

                bound = brentq(g, min(prev, lam), max(prev, lam), xtol=2e-3 * lam_hat, rtol=1e-3)
                break
            if lam == edge:
                break
            prev, step = lam, step * 1.6
        out.append(bound)
    return out[0], out[1]


def bootstrap_interval(prob, theta_hat, sigma_used, n_boot, seed, progress):
    """(low, high) 2.5 and 97.5 percentiles of lambda over n_boot refits of data simulated from the fit."""
    ls = _least_squares()
    lo, hi = prob.bounds()
    rng = np.random.default_rng(seed)
    m_hat = prob.predict(theta_hat)
    lams = []
    y0 = prob.y
    try:
        for k in range(n_boot):
            prob.y = m_hat + sigma_used * rng.standard_normal(len(m_hat))
            r = ls(prob.residuals, np.clip(theta_hat, lo + 1e-9, hi - 1e-9), jac=prob.jacobian, bounds=(lo, hi), x_scale="jac",
                   xtol=1e-8, ftol=1e-8, max_nfev=1000)
            lams.append(r.x[0])
            if progress is not None:
                progress(k + 1, n_boot)
    finally:
        prob.y = y0
    q = np.percentile(lams, [2.5, 97.5])
    return float(q[0]), float(q[1])


def covariance(result, s2):
    """Parameter covariance (J^T J)^+ s2 at the solution; its diagonal gives the Jacobian standard errors."""
    J = result.jac
    return np.linalg.pinv(J.T @ J) * s2
