"""Fitting driving-force series: lambda back from synthetic data, the inverted-region test, bad series."""

import math

import numpy as np
import pytest

from crossrate.core.constants import GAS_CONSTANT, KJ
from crossrate.core.driving_force_series import (
    marcus_ln_k_act,
    minus_dG0_at_maximum,
    plateau_ln_k_act,
    series_ln_k_obs,
)
from crossrate.errors import ScienceError
from crossrate.services.measured_csv import SeriesData
from crossrate.services.series_fit import AIC_THRESHOLD, fit_series

LN10 = math.log(10.0)
T = 298.15
LAMBDA = 100.0  # kJ/mol, the "true" value of the synthetic series
LOG_A, LOG_KD = 11.0, 9.7


def synthetic(dG_kJ, lam=LAMBDA, log_A=LOG_A, log_kd=LOG_KD, noise=0.0, sd=0.1, seed=7, give_sd=True):
    """A series generated from the model itself (Marcus k_act, diffusion combination), optional noise."""
    x = np.asarray(dG_kJ, dtype=float) * KJ
    ln_act = marcus_ln_k_act(x, lam * KJ, log_A * LN10, T)
    y = series_ln_k_obs(ln_act, None if log_kd is None else log_kd * LN10) / LN10
    y = y + noise * np.random.default_rng(seed).standard_normal(len(y))
    n = len(y)
    return SeriesData("synthetic.csv", x, 10.0**y, np.full(n, sd if give_sd else np.nan), tuple(range(2, n + 2)),
                      ("",) * n)


NORMAL_ONLY = np.linspace(20.0, -90.0, 10)  # all -dG0 < lambda = 100
WITH_INVERTED = np.concatenate([np.linspace(20.0, -90.0, 8), [-170.0, -200.0, -230.0, -260.0]])


def test_core_model_facts():
    lam, lnA = 80.0 * KJ, 10.0 * LN10
    RT = GAS_CONSTANT * T
    # Common practice (Marcus): barrier lambda/4 at dG0 = 0; no barrier at -dG0 = lambda; the barrier at
    # -dG0 = 2 lambda equals that at dG0 = 0.
    assert marcus_ln_k_act(0.0, lam, lnA, T) == pytest.approx(lnA - lam / (4 * RT), rel=1e-14)
    assert marcus_ln_k_act(-lam, lam, lnA, T) == pytest.approx(lnA, rel=1e-14)
    assert marcus_ln_k_act(-2 * lam, lam, lnA, T) == pytest.approx(marcus_ln_k_act(0.0, lam, lnA, T), rel=1e-14)
    x = np.linspace(0.0, -3 * lam, 31)
    flat = plateau_ln_k_act(x, lam, lnA, T)
    marcus = marcus_ln_k_act(x, lam, lnA, T)
    np.testing.assert_array_equal(flat[-x < lam], marcus[-x < lam])
    np.testing.assert_array_equal(flat[-x >= lam], lnA)
    assert minus_dG0_at_maximum(lam) == lam
    # 1/k_obs = 1/k_act + 1/k_D: equal rates halve.
    assert series_ln_k_obs(5.0, 5.0) == pytest.approx(5.0 - math.log(2.0), rel=1e-14)


@pytest.mark.parametrize("noise", [0.0, 0.1])
@pytest.mark.parametrize("dG, past", [(NORMAL_ONLY, False), (WITH_INVERTED, True)])
def test_lambda_comes_back_within_its_interval(noise, dG, past):
    fit = fit_series(synthetic(dG, noise=noise))
    lo, hi = fit.lambda_95
    assert lo is not None and hi is not None
    assert lo <= LAMBDA <= hi
    assert lo < fit.lambda_kJ_per_mol < hi
    if noise == 0.0:
        # Noise-free data from the model itself: the least-squares optimum is the generating lambda.
        assert fit.lambda_kJ_per_mol == pytest.approx(LAMBDA, rel=1e-5)
    assert fit.inverted_region_supported is past
    assert fit.minus_dG0_at_max_kJ_per_mol == pytest.approx(fit.lambda_kJ_per_mol, rel=1e-15)
    assert fit.lambda_se > 0


def test_inverted_evidence_in_plain_words():
    yes = fit_series(synthetic(WITH_INVERTED))
    assert yes.evidence.startswith("Yes")
    assert yes.delta_aic >= AIC_THRESHOLD
    assert "below the plateau" in yes.evidence
    no = fit_series(synthetic(NORMAL_ONLY))
    assert no.evidence.startswith("No: no point lies past the maximum")


def test_points_past_the_maximum_on_the_plateau_do_not_count():
    # k_D = 10^7 far below A = 10^12: past -dG0 = lambda, k_act stays above k_D up to about -dG0 = 160 kJ/mol,
    # so points at -130 and -150 kJ/mol sit on the diffusion plateau and show no inverted region.
    dG = np.concatenate([np.linspace(30.0, -60.0, 8), [-130.0, -150.0]])
    fit = fit_series(synthetic(dG, log_A=12.0, log_kd=7.0))
    past = [p for p in fit.points if p.past_maximum]
    assert past and not any(p.below_plateau for p in past)
    assert not fit.inverted_region_supported
    assert "plateau" in fit.evidence


def test_regions_and_diffusion_flags_of_points():
    fit = fit_series(synthetic(WITH_INVERTED))
    regions = [p.region for p in fit.points]
    assert regions[0] == "endergonic"  # dG0 = +20 kJ/mol
    assert regions[-1] == "inverted"  # -dG0 = 260 kJ/mol > lambda
    assert "normal" in regions
    # k_act > 10 k_D only near the top (A = 10^11, k_D = 10^9.7): those points are diffusion-controlled.
    assert any(p.diffusion_controlled for p in fit.points)
    assert not fit.points[-1].diffusion_controlled


def test_fixed_and_no_diffusion():
    fixed = fit_series(synthetic(WITH_INVERTED), diffusion="fixed", k_diff=10.0**LOG_KD)
    assert fixed.log10_k_diff == pytest.approx(LOG_KD, rel=1e-15) and fixed.log10_k_diff_se is None
    assert fixed.lambda_kJ_per_mol == pytest.approx(LAMBDA, rel=1e-5)
    off = fit_series(synthetic(WITH_INVERTED, log_kd=None), diffusion="off")
    assert off.log10_k_diff is None
    assert off.lambda_kJ_per_mol == pytest.approx(LAMBDA, rel=1e-5)
    assert off.log10_A == pytest.approx(LOG_A, abs=1e-5)
    with pytest.raises(ScienceError, match="--k-diff"):
        fit_series(synthetic(WITH_INVERTED), diffusion="fixed")


def test_estimated_scatter_has_a_floor():
    fit = fit_series(synthetic(NORMAL_ONLY, give_sd=False))
    assert fit.scatter == "estimated" and fit.log10_sd_used == pytest.approx(0.05)


def test_bootstrap_is_seeded_and_reports_progress():
    calls = []
    data = synthetic(WITH_INVERTED, noise=0.1)
    a = fit_series(data, interval="bootstrap", bootstrap=30, seed=11, progress=lambda d, t: calls.append((d, t)))
    b = fit_series(data, interval="bootstrap", bootstrap=30, seed=11)
    assert calls == [(k, 30) for k in range(1, 31)]
    assert a.lambda_95 == b.lambda_95
    assert a.lambda_95[0] < a.lambda_kJ_per_mol < a.lambda_95[1]
    assert a.interval_method == "bootstrap"


def test_json_keys():
    d = fit_series(synthetic(WITH_INVERTED)).to_dict()
    assert {"lambda_kJ_per_mol", "lambda_se", "log10_A", "log10_k_diff", "inverted_region_supported",
            "evidence", "points"} <= set(d)
    assert {"dG0_kJ_per_mol", "log10_k_obs", "region"} <= set(d["points"][0])


def test_too_few_points():
    with pytest.raises(ScienceError, match="3 points is too few to fit lambda, A and k_D: at least 4"):
        fit_series(synthetic([0.0, -30.0, -60.0]))
    with pytest.raises(ScienceError, match="at least 3"):
        fit_series(synthetic([0.0, -30.0], log_kd=None), diffusion="off")


def test_all_points_on_the_plateau():
    flat = synthetic(np.linspace(-90.0, -120.0, 6), log_A=13.0, log_kd=9.5)
    with pytest.raises(ScienceError, match="lambda cannot be determined"):
        fit_series(flat)
