"""Fitting a driving-force series (one couple, many partners) for lambda, A and k_D, and testing for an
inverted region.

Model (Marcus quadratic free-energy relationship with the diffusion limit, crossrate.core.driving_force_series):
    k_obs = (1/k_act + 1/k_D)^-1,   k_act = A exp(-(lambda + Delta G deg)^2 / (4 lambda RT)).
Weighted least squares on log10 k_obs (scipy.optimize.least_squares, several starts), standard errors from
the Jacobian, and a profile-likelihood (default) or parametric-bootstrap 95 % interval for lambda.

Scatter: with a log10_sd column the weights are 1/sd^2 and the SDs are taken as known; without one, the
scatter is estimated from the residuals (RSS/dof) but not below MIN_LOG10_SD, so a fit through a few
perfect points does not claim false precision.

Inverted-region test: the same data are fitted with a curve that has no inverted region (the barrier held
at 0 past -Delta G deg = lambda, so k_act rises through the normal region and levels off at A; same three
parameters). With equal parameter counts, Delta AIC = chi2(no inverted) - chi2(Marcus). The inverted region
is called supported when Delta AIC >= 2 ln 20 (the no-inverted model at most 1/20 as likely) AND at least
MIN_INVERTED_POINTS points lie past the fitted maximum and sit more than 2 SD below the plateau.
"""

import math
from collections.abc import Callable
from dataclasses import dataclass, field

import numpy as np

from ..core.constants import EV, KJ, STANDARD_TEMPERATURE
from ..core.driving_force_series import marcus_ln_k_act, plateau_ln_k_act, series_ln_k_obs
from ..core.regime import REGIME_NAMES, classify_regime, diffusion_controlled
from ..errors import ScienceError
from .measured_csv import SeriesData
from .results import _Record
from .series_evidence import inverted_region_evidence

LN10 = math.log(10.0)
#: Floor on the estimated scatter of log10 k_obs when the file gives no SDs (+-12 %; common practice).
MIN_LOG10_SD = 0.05
#: chi-square(1 dof) 95 % point for the profile-likelihood interval (scipy.stats.chi2.ppf(0.95, 1)).
CHI2_95_1DOF = 3.841458820694124
#: Delta AIC at and above which the no-inverted-region model is called unsupported: 2 ln 20.
AIC_THRESHOLD = 2.0 * math.log(20.0)
#: Points past the maximum, below the plateau, needed before an inverted region is called supported.
MIN_INVERTED_POINTS = 2
LAMBDA_BOUNDS_KJ = (1.0, 2000.0)
LOG10_A_BOUNDS = (-10.0, 20.0)
LOG10_KD_BOUNDS = (-5.0, 14.0)


@dataclass(frozen=True)
class SeriesPoint(_Record):
    """One point of the series with its fit: energies kJ/mol, rates log10 M^-1 s^-1, residual in log10."""

    line: int | None
    label: str
    dG0_kJ_per_mol: float
    log10_k_obs: float
    log10_sd: float
    log10_k_fit: float
    residual: float
    region: str
    diffusion_controlled: bool
    past_maximum: bool
    below_plateau: bool


@dataclass(frozen=True)
class SeriesFit(_Record):
    """Result of a series fit. lambda in kJ/mol (and eV), A and k_D as log10 M^-1 s^-1; *_se standard errors
    from the Jacobian; lambda_95 (low, high), a bound None when the interval is open within the search range.
    diffusion: 'fitted', 'fixed' or 'off'. delta_aic = AIC(no inverted region) - AIC(Marcus)."""

    n: int
    temperature_K: float
    diffusion: str
    lambda_kJ_per_mol: float
    lambda_se: float
    lambda_eV: float
    lambda_95: tuple[float | None, float | None]
    interval_method: str
    log10_A: float
    log10_A_se: float
    log10_k_diff: float | None
    log10_k_diff_se: float | None
    minus_dG0_at_max_kJ_per_mol: float
    minus_dG0_at_max_eV: float
    log10_k_plateau: float
    chi2: float
    dof: int
    scatter: str
    log10_sd_used: float | None
    delta_aic: float
    no_inverted_fit: dict
    inverted_region_supported: bool
    evidence: str
    points: tuple[SeriesPoint, ...]
    warnings: tuple[str, ...] = field(default=())

    def curve_log10_k(self, dG0_J_per_mol, no_inverted: bool = False):
        """log10 k_obs of the fitted curve (or of the no-inverted-region fit) at Delta G deg values (J/mol)."""
        if no_inverted:
            q = self.no_inverted_fit
            lam, la, lkd, fn = q["lambda_kJ_per_mol"], q["log10_A"], q["log10_k_diff"], plateau_ln_k_act
        else:
            lam, la, lkd, fn = self.lambda_kJ_per_mol, self.log10_A, self.log10_k_diff, marcus_ln_k_act
        ln_act = fn(np.asarray(dG0_J_per_mol, dtype=float), lam * KJ, la * LN10, self.temperature_K)
        return series_ln_k_obs(ln_act, None if lkd is None else lkd * LN10) / LN10


class _Problem:
    """The least-squares problem: data, weights, which parameters are free, and the model to use."""

    def __init__(self, x, y, sigma, T, diffusion, log10_kd_fixed, model):
        self.x, self.y, self.sigma, self.T = x, y, sigma, T
        self.diffusion, self.kd_fixed, self.model = diffusion, log10_kd_fixed, model

    def predict(self, theta):
        lam, la = theta[0], theta[1]
        lkd = theta[2] if self.diffusion == "fitted" else self.kd_fixed
        ln_act = self.model(self.x, lam * KJ, la * LN10, self.T)
        return series_ln_k_obs(ln_act, None if lkd is None else lkd * LN10) / LN10

    def residuals(self, theta):
        return (self.y - self.predict(theta)) / self.sigma

    def bounds(self):
        lo = [LAMBDA_BOUNDS_KJ[0], LOG10_A_BOUNDS[0]]
        hi = [LAMBDA_BOUNDS_KJ[1], LOG10_A_BOUNDS[1]]
        if self.diffusion == "fitted":
            lo.append(LOG10_KD_BOUNDS[0])
            hi.append(LOG10_KD_BOUNDS[1])
        return np.array(lo), np.array(hi)


def _least_squares():
    from scipy.optimize import least_squares  # only when a fit actually runs

    return least_squares


def _fit(prob: _Problem, starts):
    """Best least-squares solution over several starting points (fixed-lambda-free fit)."""
    ls = _least_squares()
    lo, hi = prob.bounds()
    best = None
    for th0 in starts:
        th0 = np.clip(np.asarray(th0, dtype=float), lo + 1e-9, hi - 1e-9)
        r = ls(prob.residuals, th0, bounds=(lo, hi), x_scale="jac", xtol=1e-12, ftol=1e-12, gtol=1e-12,
               max_nfev=2000)
        if best is None or r.cost < best.cost:
            best = r
    return best


def _starts(prob: _Problem):
    y = prob.y
    out = []
    for lam in np.geomspace(10.0, 400.0, 7):
        th = [lam, float(y.max()) + 0.5]
        if prob.diffusion == "fitted":
            th.append(float(y.max()) + 0.3)
        out.append(th)
    return out


def _profile(prob: _Problem, theta_hat, s2):
    """chi2(lambda) / s2 minimized over the other parameters, as a function of lambda (kJ/mol)."""
    ls = _least_squares()
    lo, hi = prob.bounds()
    state = {"rest": np.asarray(theta_hat[1:], dtype=float)}

    def value(lam):
        def res(rest):
            return prob.residuals(np.concatenate(([lam], rest)))

        r = ls(res, np.clip(state["rest"], lo[1:] + 1e-9, hi[1:] - 1e-9), bounds=(lo[1:], hi[1:]),
               x_scale="jac", xtol=1e-12, ftol=1e-12, max_nfev=1000)
        state["rest"] = r.x
        return 2.0 * r.cost / s2

    return value


def _profile_interval(prob, theta_hat, s2, chi2_min):
    from scipy.optimize import brentq

    lam_hat = float(theta_hat[0])
    out = []
    for direction in (-1.0, 1.0):
        prof = _profile(prob, theta_hat, s2)
        prev, lam = lam_hat, lam_hat
        bound = None
        for _ in range(80):
            lam = lam * (1.08 ** direction)
            if not LAMBDA_BOUNDS_KJ[0] <= lam <= LAMBDA_BOUNDS_KJ[1]:
                break
            if prof(lam) - chi2_min > CHI2_95_1DOF:
                def g(v, prof=prof):
                    return prof(v) - chi2_min - CHI2_95_1DOF

                bound = brentq(g, min(prev, lam), max(prev, lam), xtol=1e-6 * lam_hat)
                break
            prev = lam
        out.append(bound)
    return out[0], out[1]


def _bootstrap_interval(prob, theta_hat, sigma_used, n_boot, seed, progress):
    ls = _least_squares()
    lo, hi = prob.bounds()
    rng = np.random.default_rng(seed)
    m_hat = prob.predict(theta_hat)
    lams = []
    y0 = prob.y
    for k in range(n_boot):
        prob.y = m_hat + sigma_used * rng.standard_normal(len(m_hat))
        r = ls(prob.residuals, np.clip(theta_hat, lo + 1e-9, hi - 1e-9), bounds=(lo, hi), x_scale="jac",
               xtol=1e-10, ftol=1e-10, max_nfev=1000)
        lams.append(r.x[0])
        if progress is not None:
            progress(k + 1, n_boot)
    prob.y = y0
    q = np.percentile(lams, [2.5, 97.5])
    return float(q[0]), float(q[1])


def fit_series(
    series: SeriesData,
    temperature_K: float = STANDARD_TEMPERATURE,
    diffusion: str = "fitted",
    k_diff: float | None = None,
    interval: str = "profile",
    bootstrap: int = 200,
    seed: int | None = 0,
    progress: Callable[[int, int], None] | None = None,
) -> SeriesFit:
    """Fit log10 k_obs of a driving-force series for lambda, A and k_D; test for an inverted region.

    Args:
        series: the points (read_series_csv): Delta G deg in J/mol, k_obs in M^-1 s^-1, optional log10 SDs.
        temperature_K: temperature of the series, K.
        diffusion: 'fitted' (k_D a free parameter), 'fixed' (k_D = k_diff, M^-1 s^-1) or 'off' (k_obs = k_act).
        interval: 'profile' (profile likelihood) or 'bootstrap' (parametric, `bootstrap` refits, `seed`,
            progress(done, total) after each).

    Returns:
        SeriesFit. ScienceError for too few points, all points on the plateau, or a bad option.
    """
    if diffusion not in ("fitted", "fixed", "off"):
        raise ScienceError(f"diffusion {diffusion!r}: expected fitted, fixed or off")
    if diffusion == "fixed" and not (k_diff is not None and math.isfinite(k_diff) and k_diff > 0):
        raise ScienceError("a fixed diffusion limit needs k_D > 0 in M^-1 s^-1 (--k-diff K)")
    if interval not in ("profile", "bootstrap"):
        raise ScienceError(f"interval {interval!r}: expected profile or bootstrap")
    x = np.asarray(series.dG0_J_per_mol, dtype=float)
    y = np.log10(np.asarray(series.k_obs, dtype=float))
    n = len(y)
    p = 3 if diffusion == "fitted" else 2
    names = "lambda, A and k_D" if p == 3 else "lambda and A"
    if n < p + 1:
        raise ScienceError(
            f"{series.path}: {n} point{'s' if n != 1 else ''} is too few to fit {names}: at least {p + 1} are "
            "needed (one more than the parameters, to leave a degree of freedom)"
        )
    given = series.has_sd
    sigma = np.asarray(series.log10_sd, dtype=float) if given else np.ones(n)
    spread = float(y.max() - y.min())
    noise = float(np.median(sigma)) if given else MIN_LOG10_SD
    if spread < max(3.0 * noise, 0.3):
        raise ScienceError(
            f"{series.path}: all {n} points lie within {spread:.2f} log10 units of each other (a flat series, "
            "such as the diffusion plateau): lambda cannot be determined; add partners with less driving force, "
            "whose rates fall below the plateau"
        )
    lkd_fixed = math.log10(k_diff) if diffusion == "fixed" else None
    T = float(temperature_K)
    prob = _Problem(x, y, sigma, T, diffusion, lkd_fixed, marcus_ln_k_act)
    best = _fit(prob, _starts(prob))
    theta = best.x
    dof = n - p
    chi2 = 2.0 * best.cost
    if given:
        s2 = 1.0
        sigma_used = sigma
        sd_used = None
    else:
        s = max(math.sqrt(chi2 / dof), MIN_LOG10_SD)
        s2 = s * s
        sigma_used = np.full(n, s)
        sd_used = s
    J = best.jac
    cov = np.linalg.pinv(J.T @ J) * s2
    se = np.sqrt(np.clip(np.diag(cov), 0.0, None))

    if interval == "profile":
        lam95 = _profile_interval(prob, theta, s2, chi2 / s2)
    else:
        lam95 = _bootstrap_interval(prob, theta, sigma_used, int(bootstrap), seed, progress)

    null = _Problem(x, y, sigma, T, diffusion, lkd_fixed, plateau_ln_k_act)
    nbest = _fit(null, _starts(null) + [theta])
    delta_aic = (2.0 * nbest.cost - chi2) / s2  # equal parameter counts: the 2p terms cancel

    lam_J = theta[0] * KJ
    lkd = float(theta[2]) if diffusion == "fitted" else lkd_fixed
    fit_y = prob.predict(theta)
    # The plateau is the curve's top, at -Delta G deg = lambda where k_act = A.
    plateau = float(series_ln_k_obs(theta[1] * LN10, None if lkd is None else lkd * LN10) / LN10)
    ln_act = marcus_ln_k_act(x, lam_J, theta[1] * LN10, T)
    regions = classify_regime(x, lam_J, T)
    dc = (diffusion_controlled(ln_act, lkd * LN10) if lkd is not None else np.zeros(n, bool))
    past = -x > lam_J
    below = y < plateau - 2.0 * sigma_used
    off_plateau = int(np.sum(y < plateau - np.maximum(2.0 * sigma_used, 0.2)))
    if off_plateau < 2:
        raise ScienceError(
            f"{series.path}: only {off_plateau} of {n} points lie clearly below the fitted plateau "
            f"(10^{plateau:.2f} M^-1 s^-1): the points sit on the plateau and lambda cannot be determined; add "
            "partners with less driving force"
        )
    n_inv = int(np.sum(past & below))
    supported = bool(delta_aic >= AIC_THRESHOLD and n_inv >= MIN_INVERTED_POINTS)
    evidence = inverted_region_evidence(
        supported=supported, delta_aic=float(delta_aic), threshold=AIC_THRESHOLD, n_past=int(np.sum(past)),
        n_past_below=n_inv, min_points=MIN_INVERTED_POINTS, lambda_eV=lam_J / EV,
        depths=(plateau - y)[past & below], diffusion=diffusion, n_dc=int(np.sum(dc)),
    )
    points = tuple(
        SeriesPoint(
            line=series.lines[i] if i < len(series.lines) else None,
            label=series.labels[i] if i < len(series.labels) else "",
            dG0_kJ_per_mol=float(x[i] / KJ),
            log10_k_obs=float(y[i]),
            log10_sd=float(sigma_used[i]),
            log10_k_fit=float(fit_y[i]),
            residual=float(y[i] - fit_y[i]),
            region=REGIME_NAMES[int(regions[i])],
            diffusion_controlled=bool(dc[i]),
            past_maximum=bool(past[i]),
            below_plateau=bool(below[i]),
        )
        for i in range(n)
    )
    warnings = []
    if given and chi2 / max(dof, 1) > 4.0:
        warnings.append(
            f"reduced chi-square {chi2 / dof:.1f}: the scatter is larger than the stated SDs; the errors are "
            "likely underestimated"
        )
    lo_b, hi_b = prob.bounds()
    names_b = ("lambda", "log10 A", "log10 k_D")
    for k in range(len(theta)):
        if min(theta[k] - lo_b[k], hi_b[k] - theta[k]) < 1e-6 * max(1.0, abs(theta[k])):
            what = "no diffusion plateau is seen; consider --no-diffusion or --k-diff" if k == 2 else "not determined"
            warnings.append(f"{names_b[k]} ended at the edge of its search range ({theta[k]:.4g}): {what}")
    if lam95[1] is None or lam95[0] is None:
        warnings.append("the lambda interval is open on one side within 1-2000 kJ/mol: the data bound it weakly")
    return SeriesFit(
        n=n, temperature_K=T, diffusion=diffusion,
        lambda_kJ_per_mol=float(theta[0]), lambda_se=float(se[0]), lambda_eV=float(lam_J / EV),
        lambda_95=lam95, interval_method=interval,
        log10_A=float(theta[1]), log10_A_se=float(se[1]),
        log10_k_diff=lkd, log10_k_diff_se=float(se[2]) if diffusion == "fitted" else None,
        minus_dG0_at_max_kJ_per_mol=float(theta[0]), minus_dG0_at_max_eV=float(lam_J / EV),
        log10_k_plateau=plateau, chi2=float(chi2), dof=dof,
        scatter="given" if given else "estimated", log10_sd_used=sd_used,
        delta_aic=float(delta_aic),
        no_inverted_fit={
            "lambda_kJ_per_mol": float(nbest.x[0]),
            "log10_A": float(nbest.x[1]),
            "log10_k_diff": float(nbest.x[2]) if diffusion == "fitted" else lkd_fixed,
            "chi2": float(2.0 * nbest.cost),
        },
        inverted_region_supported=supported, evidence=evidence, points=points, warnings=tuple(warnings),
    )
