"""Errors of the prediction services: each a CrossrateError subclass with a clear message."""

import pytest

from crossrate.core.driving_force import reaction_free_energy
from crossrate.errors import ConditionsError, ScienceError, UnknownCoupleError
from crossrate.services.batch_prediction import predict_many
from crossrate.services.conditions import Conditions
from crossrate.services.prediction import predict


def test_unknown_id_suggests_closest(couple_set):
    with pytest.raises(UnknownCoupleError) as info:
        predict(couple_set, "hl-iron-aa", "hl-ru-b")
    assert "hl-iron-a" in info.value.suggestions
    assert str(info.value).startswith("unknown couple 'hl-iron-aa'; did you mean hl-iron-a")


def test_mixed_media_refused_unless_allowed(couple_set):
    with pytest.raises(ConditionsError, match="different media"):
        predict(couple_set, "hl-iron-a", "hl-mecn-h")
    # A potential measured in acetonitrile does not transfer to water: refused until allowed explicitly.
    with pytest.raises(ConditionsError, match="hl-mecn-h: E was measured in acetonitrile"):
        predict(couple_set, "hl-iron-a", "hl-mecn-h", Conditions(medium="water", allow_mixed_media=True))
    cond = Conditions(medium="water", allow_mixed_media=True, allow_E_other_medium=True)
    p = predict(couple_set, "hl-iron-a", "hl-mecn-h", cond, samples=0)
    assert any("mixed media" in w for w in p.warnings)
    assert any(w.startswith("hl-mecn-h: E was not carried") for w in p.warnings)
    assert [pot.carried for pot in p.potentials] == [True, False]


def test_unrelated_scales_refused(couple_set):
    with pytest.raises(ConditionsError, match="scales that cannot be related"):
        predict(couple_set, "hl-mecn-h", "hl-mecn-i")


def test_missing_k_self(couple_set):
    with pytest.raises(ScienceError, match="hl-nodata-f has no k_self"):
        predict(couple_set, "hl-iron-a", "hl-nodata-f")


def test_different_ionic_strengths_need_one(couple_set):
    with pytest.raises(ConditionsError, match="--ionic-strength"):
        predict(couple_set, "hl-iron-a", "hl-iron-g")


def test_bad_conditions():
    with pytest.raises(ConditionsError, match="temperature"):
        Conditions(temperature_K=float("nan"))
    with pytest.raises(ConditionsError, match="Z"):
        Conditions(Z=-1.0)
    with pytest.raises(ConditionsError, match="ionic strength"):
        Conditions(ionic_strength_M=-0.1)


def test_core_refuses_n_other_than_one():
    # The cross relation describes one-electron steps; the CLI cannot ask for n = 2, the core refuses it.
    with pytest.raises(ValueError, match="only n = 1"):
        reaction_free_energy(0.5, 0.1, n=2)


def test_predict_many_unequal_lengths(couple_set):
    with pytest.raises(ConditionsError, match="equal numbers"):
        predict_many(couple_set, ["hl-iron-a", "hl-ru-b"], ["hl-co-c"])
