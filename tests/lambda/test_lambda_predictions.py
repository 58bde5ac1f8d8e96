"""Predictions that use estimated or solvent-carried self-exchange rates: the single and batch paths agree,
the estimate is named, and the interval widens."""

import math

import numpy as np
import pytest

from crossrate.errors import ScienceError
from crossrate.library.couple_set import CoupleSet
from crossrate.services.batch_prediction import predict_many
from crossrate.services.conditions import Conditions
from crossrate.services.prediction import predict

PAIRS_WATER = [
    ("meas_w", "est_bonds"),
    ("est_bonds", "meas_w_plain"),
    ("est_total", "est_lin"),
    ("est_nonad", "meas_w"),
    ("est_kappa", "est_total"),
]


@pytest.mark.parametrize(
    "conditions",
    [Conditions(), Conditions(ionic_strength_M=0.5, temperature_K=310.0)],
    ids=["own-conditions", "I-and-T-changed"],
)
def test_single_and_batch_paths_agree_for_estimated_couples(lambda_set, conditions):
    # Common practice for a vectorized re-implementation: the same model gives the same numbers.
    ox, red = zip(*PAIRS_WATER, strict=True)
    table = predict_many(lambda_set, list(ox), list(red), conditions)
    for k, (o, r) in enumerate(PAIRS_WATER):
        p = predict(lambda_set, o, r, conditions, samples=0)
        assert table.problem[k] == ""
        assert table.log10_k_obs[k] == pytest.approx(p.log10_k_obs, abs=1e-10)
        assert table.lambda_kJ_per_mol[k] == pytest.approx(p.lambda_kJ_per_mol, abs=1e-8)
        assert table.log10_k_obs_sd_linear[k] == pytest.approx(p.log10_k_obs_sd_linear, abs=1e-8)


def test_single_and_batch_paths_agree_across_solvents(lambda_set):
    # Mixed media with a chosen medium: measured couples are carried to acetonitrile, estimates use its Pekar.
    cond = Conditions(medium="acetonitrile", allow_mixed_media=True, allow_E_other_medium=True)
    pairs = [("meas_w_plain", "meas_mecn"), ("meas_mecn", "est_lin"), ("est_total", "meas_mecn")]
    ox, red = zip(*pairs, strict=True)
    table = predict_many(lambda_set, list(ox), list(red), cond)
    for k, (o, r) in enumerate(pairs):
        p = predict(lambda_set, o, r, cond, samples=0)
        assert table.log10_k_obs[k] == pytest.approx(p.log10_k_obs, abs=1e-10)
        assert table.log10_k_obs_sd_linear[k] == pytest.approx(p.log10_k_obs_sd_linear, abs=1e-8)


def test_batch_per_pair_media_match_single_predictions(lambda_set, make):
    # No medium chosen, couples in two solvents: the batch path works pair by pair in the oxidant's medium.
    cs = CoupleSet(
        list(lambda_set)
        + [make("mecn_est", lambda_in=30.0, charge_ox=1, charge_red=0, radius=4.2, medium="acetonitrile", E=0.0)]
    )
    cond = Conditions(allow_mixed_media=True)
    pairs = [("meas_mecn", "mecn_est"), ("mecn_est", "meas_mecn"), ("meas_w", "est_bonds")]
    ox, red = zip(*pairs, strict=True)
    table = predict_many(cs, list(ox), list(red), cond)
    for k, (o, r) in enumerate(pairs):
        p = predict(cs, o, r, cond, samples=0)
        assert table.log10_k_obs[k] == pytest.approx(p.log10_k_obs, abs=1e-10)


def test_prediction_names_the_estimate_and_its_uncertainty(lambda_set):
    p = predict(lambda_set, "meas_w", "est_bonds", samples=0)
    assert len(p.estimated) == 1
    text = p.estimated[0]
    for part in ("est_bonds", "lambda_in", "bond data", "two-sphere", "15 % SD", "log10 k_self"):
        assert part in text
    assert any(w.startswith("estimated: k_self of est_bonds") for w in p.warnings)


def test_solvent_carrying_is_named_in_the_prediction(lambda_set):
    cond = Conditions(medium="acetonitrile", allow_mixed_media=True, allow_E_other_medium=True)
    p = predict(lambda_set, "meas_w_plain", "meas_mecn", cond, samples=0)
    assert len(p.estimated) == 1 and "carried from water to acetonitrile" in p.estimated[0]
    assert "Pekar" in p.estimated[0]


def test_interval_widens_for_an_estimated_lambda(lambda_set, make):
    # The same k_self entered as a measurement (default SD 0.3 in log10) gives a narrower interval than the
    # estimate it came from (SD from 15 % of lambda: about 1.6 in log10 here).
    p_est = predict(lambda_set, "meas_w_plain", "est_bonds", samples=4000, seed=3)
    k_est = 10.0**p_est.log10_k22
    cs = CoupleSet([lambda_set["meas_w_plain"], make("est_bonds", k_self=k_est, E=0.3)])
    p_meas = predict(cs, "meas_w_plain", "est_bonds", samples=4000, seed=3)
    assert p_meas.log10_k_obs == pytest.approx(p_est.log10_k_obs, abs=1e-9)
    assert p_est.log10_k_obs_sd_linear > 2.0 * p_meas.log10_k_obs_sd_linear
    lo_e, hi_e = p_est.log10_k_obs_95
    lo_m, hi_m = p_meas.log10_k_obs_95
    assert hi_e - lo_e > 2.0 * (hi_m - lo_m)


def test_couple_without_rate_data_is_refused_by_predict(lambda_set):
    with pytest.raises(ScienceError) as err:
        predict(lambda_set, "bare", "meas_w", samples=0)
    msg = str(err.value)
    assert "bare" in msg and "k_self" in msg and "lambda_total" in msg and "bonds" in msg


def test_batch_marks_couple_without_rate_data(lambda_set):
    table = predict_many(lambda_set, ["bare"], ["meas_w"])
    assert table.problem[0] != "" and math.isnan(table.log10_k_obs[0])
    assert np.isfinite(predict_many(lambda_set, ["est_bonds"], ["meas_w"]).log10_k_obs[0])
