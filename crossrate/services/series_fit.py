"""Fitting a driving-force series (one couple, many partners, or one molecule across a family) under three
models, choosing the one the data support, and testing for an inverted region.

Models (crossrate.services.series_models): classical Marcus (lambda, A), semiclassical Marcus–Levich–Jortner
(lambda = lambda_s + lambda_v, with a quantized mode of given hbar omega, and A) and a curve with no inverted
region (the classical curve held at its top past -Delta G deg = lambda). A bimolecular series (k_obs,
M^-1 s^-1) carries the diffusion limit, 1/k_obs = 1/k_act + 1/k_D; an intramolecular one (k_intra, s^-1) has
none, its electronic coupling sits in A. Weighted least squares on log10 k (scipy.optimize.least_squares with
analytic Jacobians, started from the lowest local minima of a coarse parameter grid), standard errors from
the Jacobian, profile-likelihood (default) or bootstrap 95 % intervals.

Scatter: with a log10_sd column the SDs are taken as known; without one, it is estimated from the residuals
of the best-fitting model (RSS/dof) but not below MIN_LOG10_SD.

Which model: the lowest AIC = chi2/s^2 + 2p (Akaike; Akaike weights reported). The reported lambda comes
from that model; where another model is within Delta AIC < 2 (the data cannot tell them apart), the reported
interval spans both models' intervals. When the interval stays open within 1-2000 kJ/mol, lambda is called
not determined and only the closed side is given as a one-sided bound.

Inverted-region test, made under the favoured model: it is supported when the favoured model has an inverted
region (classical or semiclassical), beats the no-inverted-region curve by Delta AIC >= 2 ln 20 (that curve
at most 1/20 as likely), and at least MIN_INVERTED_POINTS points lie past its maximum and more than 2 SD
below its plateau.
"""

import math
from collections.abc import Callable
from dataclasses import dataclass, field

import numpy as np

from ..core.constants import EV, KJ, STANDARD_TEMPERATURE
from ..core.regime import REGIME_NAMES, classify_regime, diffusion_controlled
from ..errors import ScienceError
from .measured_csv import SeriesData
from .results import _Record
from .series_evidence import (
    fit_warnings,
    inverted_region_evidence,
    lambda_statement,
    model_comparison,
)
from .series_intervals import best_fit, bootstrap_interval, covariance, profile_interval
from .series_models import LAMBDA_BOUNDS_KJ, LN10, MODEL_KEYS, MODEL_TITLES, Problem, SeriesModel
from .series_split import semiclassical_split, split_statement

#: Floor on the estimated scatter of log10 k when the file gives no SDs (+-12 %; common practice).
MIN_LOG10_SD = 0.05
#: Delta AIC at and above which the no-inverted-region model is called unsupported: 2 ln 20.
AIC_THRESHOLD = 2.0 * math.log(20.0)
#: Delta AIC below which two models are taken as equally supported (Burnham & Anderson's rule of thumb;
#: from memory): the reported interval then spans both.
AIC_TIE = 2.0
#: Points past the maximum, below the plateau, needed before an inverted region is called supported.
MIN_INVERTED_POINTS = 2
#: Energy of the quantized mode when none is given: 1500 cm^-1, a C=C/C=O skeletal stretch (common practice).
DEFAULT_HBAR_OMEGA_CM1 = 1500.0
#: J/mol per cm^-1: h c (100 cm/m) N_A (exact SI values).
J_PER_MOL_PER_CM1 = 6.62607015e-34 * 299792458.0 * 100.0 * 6.02214076e23


@dataclass(frozen=True)
class SeriesPoint(_Record):
    """One point with the favoured model's fit: energies kJ/mol, rates log10 (unit of the series)."""

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
class ModelFit(_Record):
    """One model fitted to the series. lambda (total) kJ/mol with its SE and 95 % interval (a side None
    when open); for the semiclassical model lambda_s and lambda_v (kJ/mol) with Jacobian SEs and 95 %
    intervals (crossrate.services.series_split); log10 A and
    log10 k_D in the series' unit; AIC, its difference from the best and the Akaike weight."""

    model: str
    title: str
    n_params: int
    lambda_kJ_per_mol: float
    lambda_se: float
    lambda_95: tuple[float | None, float | None] | None
    interval_method: str
    lambda_s_kJ_per_mol: float | None
    lambda_s_se: float | None
    lambda_v_kJ_per_mol: float | None
    lambda_v_se: float | None
    lambda_s_95: tuple[float | None, float | None] | None
    lambda_v_95: tuple[float | None, float | None] | None
    log10_A: float
    log10_A_se: float
    log10_k_diff: float | None
    log10_k_diff_se: float | None
    minus_dG0_at_max_kJ_per_mol: float
    chi2: float
    aic: float
    delta_aic: float
    weight: float
    theta: tuple[float, ...]


@dataclass(frozen=True)
class SeriesFit(_Record):
    """Result of a series fit. kind 'bimolecular' (k in M^-1 s^-1) or 'unimolecular' (s^-1); model: the
    favoured model; lambda_* from it (kJ/mol, eV), lambda_95 the reported interval (see the module
    docstring) and lambda_identified False when it is open; lambda_s, lambda_v and their 95 % intervals from
    the semiclassical fit when it is the favoured model, lambda_split_determined whether the series fixes them
    separately (crossrate.services.series_split) and lambda_split_statement saying so; delta_aic = AIC(no inverted region) - AIC(the
    model with an inverted region used in the test); models: every model fitted."""

    kind: str
    rate_unit: str
    n: int
    temperature_K: float
    diffusion: str
    hbar_omega_cm1: float
    model: str
    lambda_kJ_per_mol: float
    lambda_se: float
    lambda_eV: float
    lambda_95: tuple[float | None, float | None]
    lambda_identified: bool
    lambda_statement: str
    interval_method: str
    lambda_s_kJ_per_mol: float | None
    lambda_v_kJ_per_mol: float | None
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
    model_comparison: str
    inverted_region_supported: bool
    evidence: str
    models: tuple[ModelFit, ...]
    points: tuple[SeriesPoint, ...]
    warnings: tuple[str, ...] = field(default=())
    lambda_s_95: tuple[float | None, float | None] | None = None
    lambda_v_95: tuple[float | None, float | None] | None = None
    lambda_split_determined: bool = False
    lambda_split_statement: str = ""

    def model_fit(self, key: str) -> ModelFit | None:
        return next((m for m in self.models if m.model == key), None)

    @property
    def no_inverted_fit(self) -> ModelFit | None:
        return self.model_fit("no_inverted")

    def curve_log10_k(self, dG0_J_per_mol, model: str | None = None, no_inverted: bool = False):
        """log10 k of a fitted model's curve (default: the favoured one) at Delta G deg values (J/mol)."""
        key = "no_inverted" if no_inverted else (model or self.model)
        m = self.model_fit(key)
        hw = self.hbar_omega_cm1 * J_PER_MOL_PER_CM1
        prob = Problem(SeriesModel(key, self.temperature_K, hw), None, None, None,
                       "fitted" if self.diffusion == "fitted" else "fixed", m.log10_k_diff)
        return prob.predict(np.asarray(m.theta), np.asarray(dG0_J_per_mol, dtype=float))


def _check_options(series, diffusion, k_diff, interval, hbar_omega_cm1):
    kind = getattr(series, "kind", "bimolecular")
    if diffusion is None:
        diffusion = "off" if kind == "unimolecular" else "fitted"
    if diffusion not in ("fitted", "fixed", "off"):
        raise ScienceError(f"diffusion {diffusion!r}: expected fitted, fixed or off")
    if kind == "unimolecular" and diffusion != "off":
        raise ScienceError(f"{series.path}: an intramolecular series (column k_intra, s^-1) has no diffusion "
                           "limit; drop --k-diff")
    if diffusion == "fixed" and not (k_diff is not None and math.isfinite(k_diff) and k_diff > 0):
        raise ScienceError("a fixed diffusion limit needs k_D > 0 in M^-1 s^-1 (--k-diff K)")
    if interval not in ("profile", "bootstrap"):
        raise ScienceError(f"interval {interval!r}: expected profile or bootstrap")
    if not (math.isfinite(hbar_omega_cm1) and 100.0 <= hbar_omega_cm1 <= 5000.0):
        raise ScienceError(f"hbar omega {hbar_omega_cm1:g} cm^-1: expected 100 to 5000 cm^-1")
    return kind, diffusion


def _model_fit(key, prob, res, s2, aic, best_aic, weight, lam95, method, split):
    cov = covariance(res, s2)
    se = np.sqrt(np.clip(np.diag(cov), 0.0, None))
    core, lkd = prob.split(res.x)
    return ModelFit(
        model=key, title=MODEL_TITLES[key], n_params=prob.n_params,
        lambda_kJ_per_mol=float(res.x[0]), lambda_se=float(se[0]), lambda_95=lam95, interval_method=method,
        lambda_s_kJ_per_mol=split and split.lambda_s, lambda_s_se=split and split.lambda_s_se,
        lambda_v_kJ_per_mol=split and split.lambda_v, lambda_v_se=split and split.lambda_v_se,
        lambda_s_95=split and split.lambda_s_95, lambda_v_95=split and split.lambda_v_95,
        log10_A=float(core[-1]), log10_A_se=float(se[len(core) - 1]),
        log10_k_diff=None if lkd is None else float(lkd),
        log10_k_diff_se=float(se[-1]) if prob.diffusion == "fitted" else None,
        minus_dG0_at_max_kJ_per_mol=float(prob.model.minus_dG0_at_maximum_J(core) / KJ),
        chi2=float(2.0 * res.cost), aic=float(aic), delta_aic=float(aic - best_aic), weight=float(weight),
        theta=tuple(float(v) for v in res.x),
    )


def fit_series(
    series: SeriesData,
    temperature_K: float = STANDARD_TEMPERATURE,
    diffusion: str | None = None,
    k_diff: float | None = None,
    interval: str = "profile",
    bootstrap: int = 200,
    seed: int | None = 0,
    progress: Callable[[int, int], None] | None = None,
    hbar_omega_cm1: float = DEFAULT_HBAR_OMEGA_CM1,
) -> SeriesFit:
    """Fit log10 k of a driving-force series under the classical, semiclassical and no-inverted-region
    models, report lambda from the model the data support, and test for an inverted region.

    Args:
        series: the points (read_series_csv): Delta G deg in J/mol, k (M^-1 s^-1 bimolecular, s^-1
            intramolecular), optional log10 SDs.
        temperature_K: temperature of the series, K.
        diffusion: None (fitted for a bimolecular series, off for an intramolecular one), 'fitted', 'fixed'
            (k_D = k_diff, M^-1 s^-1) or 'off'.
        interval: 'profile' (profile likelihood) or 'bootstrap' (parametric, `bootstrap` refits, `seed`,
            progress(done, total) after each).
        hbar_omega_cm1: energy of the semiclassical model's quantized mode, cm^-1 (held fixed).

    Returns:
        SeriesFit. ScienceError for too few points, all points on the plateau, or a bad option.
    """
    kind, diffusion = _check_options(series, diffusion, k_diff, interval, float(hbar_omega_cm1))
    x = np.asarray(series.dG0_J_per_mol, dtype=float)
    y = np.log10(np.asarray(series.k_obs, dtype=float))
    n = len(y)
    extra = 1 if diffusion == "fitted" else 0
    p = 2 + extra
    names = "lambda, A and k_D" if extra else "lambda and A"
    if n < p + 1:
        raise ScienceError(
            f"{series.path}: {n} point{'s' if n != 1 else ''} is too few to fit {names}: at least {p + 1} are "
            "needed (one more than the parameters, to leave a degree of freedom)"
        )
    given = series.has_sd
    sigma = np.asarray(series.log10_sd, dtype=float) if given else np.ones(n)
    spread = float(y.max() - y.min())
    if spread < max(3.0 * (float(np.median(sigma)) if given else MIN_LOG10_SD), 0.3):
        raise ScienceError(
            f"{series.path}: all {n} points lie within {spread:.2f} log10 units of each other (a flat series, "
            "such as the diffusion plateau): lambda cannot be determined; add partners with less driving force, "
            "whose rates fall below the plateau"
        )
    T = float(temperature_K)
    hw = float(hbar_omega_cm1) * J_PER_MOL_PER_CM1
    lkd_fixed = math.log10(k_diff) if diffusion == "fixed" else None
    keys = [k for k in MODEL_KEYS if not (k == "semiclassical" and n < p + 2)]
    probs = {k: Problem(SeriesModel(k, T, hw), x, y, sigma, diffusion, lkd_fixed) for k in keys}
    res = {"classical": best_fit(probs["classical"], probs["classical"].grid_starts(3))}
    cl = list(res["classical"].x)
    res["no_inverted"] = best_fit(probs["no_inverted"], probs["no_inverted"].grid_starts(3) + [cl])
    if "semiclassical" in probs:
        # Also from the classical solution (phi = 0), so that the semiclassical fit is never the worse one.
        res["semiclassical"] = best_fit(probs["semiclassical"], probs["semiclassical"].grid_starts(3) +
                                        [cl[:1] + [0.0] + cl[1:]], tol=1e-8, max_nfev=150)
    chi2 = {k: 2.0 * r.cost for k, r in res.items()}
    if given:
        s2, sigma_used, sd_used = 1.0, sigma, None
    else:
        s = max(min(math.sqrt(chi2[k] / max(n - probs[k].n_params, 1)) for k in keys), MIN_LOG10_SD)
        s2, sigma_used, sd_used = s * s, np.full(n, s), s
    aic = {k: chi2[k] / s2 + 2.0 * probs[k].n_params for k in keys}
    best = min(keys, key=lambda k: aic[k])
    w = {k: math.exp(-(aic[k] - aic[best]) / 2.0) for k in keys}
    wsum = sum(w.values())
    fits = {}
    split = (semiclassical_split(probs["semiclassical"], res["semiclassical"], s2, best == "semiclassical",
                                 interval == "profile") if "semiclassical" in probs else None)
    for k in keys:
        if k != best:
            lam95, method = _wald_interval(res[k], s2), "wald"
        elif interval == "profile":
            se0 = float(np.sqrt(max(covariance(res[k], s2)[0, 0], 0.0)))
            lam95, method = profile_interval(probs[k], res[k].x, s2, chi2[k] / s2, se0), "profile"
        else:
            lam95 = bootstrap_interval(probs[k], res[k].x, sigma_used, int(bootstrap), seed,
                                       progress if k == best else None)
            method = "bootstrap"
        fits[k] = _model_fit(k, probs[k], res[k], s2, aic[k], aic[best], w[k] / wsum, lam95, method,
                             split if k == "semiclassical" else None)
    fav = fits[best]
    # The reported interval: the favoured model's (profile or bootstrap), widened to cover the Wald interval
    # of any model the data cannot tell apart from it. A semiclassical fit with no quantized part (phi ~ 0)
    # is the classical model again and does not count twice.
    close = [fits[k] for k in keys if fits[k].delta_aic < AIC_TIE
             and not (k == "semiclassical" and k != best and res[k].x[1] < 1e-3)]
    lows = [m.lambda_95[0] for m in close]
    highs = [m.lambda_95[1] for m in close]
    lam95 = (None if any(v is None for v in lows) else float(min(lows)),
             None if any(v is None for v in highs) else float(max(highs)))
    identified = lam95[0] is not None and lam95[1] is not None

    # The inverted-region test under the favoured model (or the better model with an inverted region).
    inv_key = best if best != "no_inverted" else min((k for k in keys if k != "no_inverted"), key=lambda k: aic[k])
    inv, inv_prob = fits[inv_key], probs[inv_key]
    inv_core, lkd = inv_prob.split(np.asarray(inv.theta))
    top_J = inv.minus_dG0_at_max_kJ_per_mol * KJ
    fav_prob = probs[best]
    fav_core, fav_lkd = fav_prob.split(np.asarray(fav.theta))
    fav_top_J = fav.minus_dG0_at_max_kJ_per_mol * KJ
    plateau = float(fav_prob.predict(np.asarray(fav.theta), np.array([-fav_top_J]))[0])
    inv_plateau = float(inv_prob.predict(np.asarray(inv.theta), np.array([-top_J]))[0])
    off_plateau = int(np.sum(y < plateau - np.maximum(2.0 * sigma_used, 0.2)))
    if off_plateau < 2:
        raise ScienceError(
            f"{series.path}: only {off_plateau} of {n} points lie clearly below the fitted plateau "
            f"(10^{plateau:.2f} {series_unit(kind)}): the points sit on the plateau and lambda cannot be "
            "determined; add partners with less driving force"
        )
    past = -x > top_J
    below = y < inv_plateau - 2.0 * sigma_used
    n_inv = int(np.sum(past & below))
    delta_aic = float(aic["no_inverted"] - aic[inv_key])
    supported = bool(best != "no_inverted" and delta_aic >= AIC_THRESHOLD and n_inv >= MIN_INVERTED_POINTS)
    ln_act = fav_prob.model.ln_k_act(fav_core, x)
    dc = diffusion_controlled(ln_act, fav_lkd * LN10) if fav_lkd is not None else np.zeros(n, bool)
    evidence = inverted_region_evidence(
        supported=supported, delta_aic=delta_aic, threshold=AIC_THRESHOLD, n_past=int(np.sum(past)),
        n_past_below=n_inv, min_points=MIN_INVERTED_POINTS, max_eV=top_J / EV, depths=(inv_plateau - y)[past & below],
        diffusion=diffusion, n_dc=int(np.sum(dc)), model_title=inv.title, favoured=best,
    )
    fit_y = fav_prob.predict(np.asarray(fav.theta))
    fav_past = -x > fav_top_J
    regions = classify_regime(x, fav_top_J, T)
    points = tuple(
        SeriesPoint(
            line=series.lines[i] if i < len(series.lines) else None,
            label=series.labels[i] if i < len(series.labels) else "",
            dG0_kJ_per_mol=float(x[i] / KJ), log10_k_obs=float(y[i]), log10_sd=float(sigma_used[i]),
            log10_k_fit=float(fit_y[i]), residual=float(y[i] - fit_y[i]), region=REGIME_NAMES[int(regions[i])],
            diffusion_controlled=bool(dc[i]), past_maximum=bool(fav_past[i]),
            below_plateau=bool(y[i] < plateau - 2.0 * sigma_used[i]),
        )
        for i in range(n)
    )
    warnings = fit_warnings(given, chi2[best], n - probs[best].n_params, fav_prob, res[best].x, identified, keys, n, p)
    return SeriesFit(
        kind=kind, rate_unit=series_unit(kind), n=n, temperature_K=T, diffusion=diffusion,
        hbar_omega_cm1=float(hbar_omega_cm1), model=best,
        lambda_kJ_per_mol=fav.lambda_kJ_per_mol, lambda_se=fav.lambda_se, lambda_eV=fav.lambda_kJ_per_mol * KJ / EV,
        lambda_95=lam95, lambda_identified=identified,
        lambda_statement=lambda_statement(fav, lam95, [m.title for m in close if m is not fav]),
        interval_method=fav.interval_method,
        lambda_s_kJ_per_mol=fav.lambda_s_kJ_per_mol, lambda_v_kJ_per_mol=fav.lambda_v_kJ_per_mol,
        log10_A=fav.log10_A, log10_A_se=fav.log10_A_se, log10_k_diff=fav.log10_k_diff,
        log10_k_diff_se=fav.log10_k_diff_se,
        minus_dG0_at_max_kJ_per_mol=fav.minus_dG0_at_max_kJ_per_mol,
        minus_dG0_at_max_eV=fav.minus_dG0_at_max_kJ_per_mol * KJ / EV,
        log10_k_plateau=plateau, chi2=float(chi2[best]), dof=n - probs[best].n_params,
        scatter="given" if given else "estimated", log10_sd_used=sd_used, delta_aic=delta_aic,
        model_comparison=model_comparison([fits[k] for k in keys], best),
        inverted_region_supported=supported, evidence=evidence, models=tuple(fits[k] for k in keys),
        points=points, warnings=tuple(warnings), **_split_fields(split, best),
    )


def _split_fields(split, best):
    """The SeriesFit fields on lambda_s and lambda_v (the semiclassical fit's split, when it was fitted)."""
    if split is None:
        return {"lambda_split_statement": "lambda_s and lambda_v are not separately determined: too few points "
                                          "for the semiclassical model"}
    favoured = best == "semiclassical"
    return {"lambda_s_95": split.lambda_s_95 if favoured else None,
            "lambda_v_95": split.lambda_v_95 if favoured else None,
            "lambda_split_determined": split.determined, "lambda_split_statement": split_statement(split, favoured)}


def _wald_interval(result, s2):
    """95 % interval for lambda from its Jacobian SE on a log scale (lambda > 0): lambda exp(+-1.96 SE/lambda);
    a side beyond the search range (1-2000 kJ/mol) is open (None)."""
    lam = float(result.x[0])
    rel = float(np.sqrt(max(covariance(result, s2)[0, 0], 0.0))) / lam
    if not rel < 5.0:  # SE several times lambda itself: nothing is bounded
        return None, None
    lo, hi = lam * math.exp(-1.96 * rel), lam * math.exp(1.96 * rel)
    return (lo if lo > LAMBDA_BOUNDS_KJ[0] else None, hi if hi < LAMBDA_BOUNDS_KJ[1] else None)


def series_unit(kind: str) -> str:
    """The rate unit of a series kind: M^-1 s^-1 (bimolecular) or s^-1 (unimolecular)."""
    return "s^-1" if kind == "unimolecular" else "M^-1 s^-1"
