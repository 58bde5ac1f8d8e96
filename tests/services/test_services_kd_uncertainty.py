"""The 95 % interval carries the uncertainty of k_D, and says when it is narrow only because the model is flat.

Expected values are derived in the comments from 1/k_obs = 1/k_act + 1/k_D, whose exact slope is
d ln k_obs / d ln k_D = k_obs / k_D, and from the slopes of the Marcus barrier form,
d ln k_act / d ln K12 = (1 + Delta G deg'/lambda) / 2 and d ln k_act / d ln k_ii = (1 - (Delta G deg'/lambda)^2) / 2
(R. A. Marcus & N. Sutin, Biochim. Biophys. Acta 811, 265 (1985); citation from memory).
"""

import math

import numpy as np
import pytest

from crossrate.core.constants import FARADAY, GAS_CONSTANT
from crossrate.library.couple import Couple
from crossrate.library.couple_set import CoupleSet
from crossrate.services import prediction as prediction_module
from crossrate.services.batch_prediction import predict_many
from crossrate.services.conditions import Conditions
from crossrate.services.flat_model import FLAT_RATIO, flat_model_note, flatness
from crossrate.services.prediction import predict
from crossrate.services.uncertainty import DEFAULT_K_DIFF_LOG10_SD

T0 = 298.15


def _c(cid, E, k, z=0, **kw):
    # Neutral oxidized forms (z_ox = 0): w12 = z_ox1 z_red2 = 0, so no work term enters the barrier.
    base = dict(id=cid, name=cid, charge_ox=z, charge_red=z - 1, E=E, E_scale="SHE", radius=4.5, medium="water",
                ionic_strength=0.1, temperature=T0, source="invented for a test", k_self=k, verified=True,
                E_sd=0.01, k_self_log10_sd=0.2)
    base.update(kw)
    return Couple(**base)


def _flat_notes(p):
    return [w for w in p.warnings if w.startswith("flat model")]


@pytest.fixture
def near_cap():
    # k11 = k22 = 1e9: lambda = 4 RT ln(Z/k) = 45.7 kJ/mol; E1 - E2 = 0.32 V gives -Delta G deg = 30.9 kJ/mol,
    # k_act = Z exp(-(lambda/4)(1 - 30.9/45.7)^2 / RT) = 6e10, about 9 k_D (k_D ~ 7e9 for two 4.5 A spheres
    # in water), so k_obs ~ 0.9 k_D.
    return CoupleSet([_c("a", 0.32, 1e9), _c("b", 0.0, 1e9)])


def test_near_the_cap_the_interval_widens_by_the_k_D_sd(near_cap, monkeypatch):
    p = predict(near_cap, "a", "b", samples=20000, seed=3)
    share = 10.0 ** (p.log10_k_obs - p.log10_k_diff)
    assert 0.85 < share < 0.95
    assert p.log10_k_diff_sd == DEFAULT_K_DIFF_LOG10_SD == 0.3
    # First order: the k_D term alone is (k_obs/k_D) x 0.3 in log10; E and k_self add almost nothing here.
    assert p.log10_k_obs_sd_linear == pytest.approx(share * 0.3, rel=0.05)
    width = p.log10_k_obs_95[1] - p.log10_k_obs_95[0]
    # Without the k_D term (SD set to 0) the same pair's interval is a few hundredths of a decade wide.
    monkeypatch.setattr(prediction_module, "DEFAULT_K_DIFF_LOG10_SD", 0.0)
    narrow = predict(near_cap, "a", "b", samples=20000, seed=3)
    narrow_width = narrow.log10_k_obs_95[1] - narrow.log10_k_obs_95[0]
    assert narrow_width < 0.1
    # With it: about 2 x 1.96 x 0.27 = 1.06 decades (the MC interval is a little narrower on the high side,
    # where k_obs saturates at k_act as k_D grows).
    assert width == pytest.approx(2 * 1.96 * share * 0.3, rel=0.15)
    assert width > 10 * narrow_width


def test_monte_carlo_and_linear_agree_near_the_cap(near_cap):
    # Stated tolerance: 10 % between the Monte Carlo SD and the first-order SD near the cap; the model is
    # curved in ln k_D there (k_obs/k_D falls from 0.97 to 0.72 across +-0.3 in log10 k_D).
    p = predict(near_cap, "a", "b", samples=20000, seed=11)
    assert p.log10_k_obs_sd_mc == pytest.approx(p.log10_k_obs_sd_linear, rel=0.10)


def test_batch_and_screen_carry_the_same_k_D_term(near_cap):
    p = predict(near_cap, "a", "b", samples=0)
    t = predict_many(near_cap, ["a"], ["b"])
    assert t.log10_k_obs_sd_linear[0] == pytest.approx(p.log10_k_obs_sd_linear, rel=1e-6)


def test_without_the_cap_k_D_adds_nothing(near_cap):
    cond = Conditions(diffusion=False)
    p = predict(near_cap, "a", "b", cond, samples=5000, seed=3)
    assert p.log10_k_diff_sd == 0.0
    assert p.to_dict()["log10_k_diff_sd"] == 0.0
    t = predict_many(near_cap, ["a"], ["b"], cond)
    assert t.log10_k_obs_sd_linear[0] == pytest.approx(p.log10_k_obs_sd_linear, rel=1e-6)


# ---- the flat-model note -------------------------------------------------------------------------------

def test_flatness_is_one_at_the_reference_slopes():
    # Reference: d ln k / dE1 = F/2RT, dE2 = -F/2RT, d ln k / d ln k_ii = 1/2 (cross relation at dG' = 0).
    f_rt = FARADAY / (GAS_CONSTANT * T0)
    grad = [0.5 * f_rt, -0.5 * f_rt, 0.5, 0.5, 0.0]
    assert flatness(grad, [0.01, 0.02, 0.4, 0.7, 0.69], T0) == pytest.approx(1.0, rel=1e-12)
    assert flatness(np.array(grad) * 0.2, [0.01, 0.02, 0.4, 0.7, 0.69], T0) == pytest.approx(0.2, rel=1e-12)
    assert math.isnan(flatness(grad, [0, 0, 0, 0, 0.69], T0))


def test_note_appears_exactly_below_the_threshold():
    just_below, just_above = FLAT_RATIO * (1 - 1e-9), FLAT_RATIO * (1 + 1e-9)
    assert flat_model_note(just_above, 0.9, -1.0, 0.3) is None
    assert flat_model_note(float("nan"), 0.9, -1.0, 0.3) is None
    note = flat_model_note(just_below, 0.9, -0.2, 0.3)
    assert "diffusion plateau" in note and "activationless" not in note and "k_D uncertainty" in note
    note = flat_model_note(just_below, None, -0.9, 0.0)
    assert "activationless top" in note and "plateau" not in note and "not because" in note
    assert "\n" not in note


def test_plateau_pair_gets_one_note(near_cap):
    p = predict(near_cap, "a", "b", samples=0)
    notes = _flat_notes(p)
    assert len(notes) == 1 and "diffusion plateau" in notes[0]


def test_plateau_in_the_normal_region_names_only_the_plateau():
    # k11 = k22 = 5e10: lambda = 4 RT ln 2 = 6.9 kJ/mol, Delta G deg = 0 (x = 0, far from the top), k_act =
    # Z e^{-lambda/4RT} = 5e10 ~ 7 k_D: k_obs/k_D ~ 0.88, so the slopes in E and k_self fall to ~0.12 of the
    # reference.
    cs = CoupleSet([_c("a", 0.0, 5e10), _c("b", 0.0, 5e10)])
    notes = _flat_notes(predict(cs, "a", "b", samples=0))
    assert len(notes) == 1 and "diffusion plateau" in notes[0] and "activationless" not in notes[0]


def test_activationless_without_the_cap_says_narrow_because_flat():
    # E1 - E2 = 0.474 V: -Delta G deg = 45.7 kJ/mol = lambda, the activationless top; cap off.
    cs = CoupleSet([_c("a", 0.474, 1e9), _c("b", 0.0, 1e9)])
    p = predict(cs, "a", "b", Conditions(diffusion=False), samples=0)
    assert p.regime == "activationless"
    notes = _flat_notes(p)
    assert len(notes) == 1 and "activationless top" in notes[0] and "not because" in notes[0]


@pytest.mark.parametrize("E1,k", [(0.0, 1e3), (0.05, 1e2), (-0.2, 1e3)])
def test_no_note_in_the_normal_or_endergonic_region_far_from_the_cap(E1, k):
    # k11 = k22 = 1e2-1e3 (lambda ~ 160-180 kJ/mol), |Delta G deg| <= 20 kJ/mol: slopes near the reference,
    # k_act << k_D.
    cs = CoupleSet([_c("a", E1, k), _c("b", 0.0, k)])
    p = predict(cs, "a", "b", samples=0)
    assert _flat_notes(p) == []
    assert p.log10_k_obs < p.log10_k_diff - 3
