"""rate_map(): every cell equals the single-pair prediction; NaN exactly where predict() refuses."""

import json
import math

import numpy as np
import pytest

from crossrate.core.screened_debye_table import TABLE_TOLERANCE
from crossrate.errors import ConditionsError, CrossrateError, UnknownCoupleError
from crossrate.services.conditions import Conditions
from crossrate.services.prediction import predict
from crossrate.services.rate_map import ids_with_tag, rate_map


def _predict_or_nan(cs, ox, red, cond):
    try:
        return predict(cs, ox, red, cond, samples=0).log10_k_obs
    except CrossrateError:
        return float("nan")


@pytest.mark.parametrize(
    "cond",
    [Conditions(), Conditions(ionic_strength_M=0.25, temperature_K=310.0), Conditions(diffusion=False)],
    ids=["own-conditions", "I-and-T-given", "no-diffusion-cap"],
)
def test_every_cell_equals_predict(couple_set, cond):
    m = rate_map(couple_set, conditions=cond)
    assert m.ids == tuple(couple_set.ids())
    for i, ox in enumerate(m.ids):
        for j, red in enumerate(m.ids):
            expected = _predict_or_nan(couple_set, ox, red, cond)
            got = m.log10_k_obs[i, j]
            if np.isnan(expected):
                assert np.isnan(got), (ox, red)
            else:
                # Fast path (barrier form) vs cross relation: equal to rounding, ~1e-13 in ln k, but for the
                # screened Debye factor, which the map reads from a table (within TABLE_TOLERANCE in ln k_D).
                assert got == pytest.approx(expected, abs=1e-10 + TABLE_TOLERANCE / math.log(10)), (ox, red)


def test_some_cells_are_not_computable(couple_set):
    m = rate_map(couple_set)
    ids = list(m.ids)
    assert np.isnan(m.value("hl-iron-a", "hl-mecn-h"))  # different media
    assert np.isnan(m.value("hl-mecn-i", "hl-mecn-h"))  # unrelated potential scales
    assert np.all(np.isnan(m.log10_k_obs[ids.index("hl-nodata-f"), :]))  # no self-exchange data
    assert 0 < m.computable < len(ids) ** 2


def test_medium_restricts_and_mixed_media_computes_in_one_medium(couple_set):
    water = rate_map(couple_set, conditions=Conditions(medium="water"))
    assert set(water.media) == {"water"} and water.medium == "water"
    mixed_cond = Conditions(medium="water", allow_mixed_media=True, allow_E_other_medium=True)
    mixed = rate_map(couple_set, conditions=mixed_cond)
    assert "hl-mecn-h" in mixed.ids
    expected = predict(couple_set, "hl-iron-a", "hl-mecn-h", mixed_cond, samples=0).log10_k_obs
    assert mixed.value("hl-iron-a", "hl-mecn-h") == pytest.approx(expected, abs=1e-10)


def test_ids_subset_in_given_order_and_tag(couple_set):
    ids = ["hl-co-c", "hl-iron-a"]
    m = rate_map(couple_set, ids=ids)
    assert m.ids == tuple(ids)
    assert m.log10_k_obs.shape == (2, 2)
    assert m.log10_k_obs[1, 0] == pytest.approx(
        predict(couple_set, "hl-iron-a", "hl-co-c", samples=0).log10_k_obs, abs=1e-10
    )
    assert ids_with_tag(couple_set, "Cage") == ["hl-co-c", "hl-spin-d"]


def test_progress_reports_up_to_total(couple_set):
    calls = []
    m = rate_map(couple_set, progress=lambda done, total: calls.append((done, total)))
    assert calls[0] == (0, len(m))
    assert calls[-1] == (len(m), len(m))
    dones = [d for d, _ in calls]
    assert dones == sorted(dones)


def test_result_is_immutable_and_json_safe(couple_set):
    m = rate_map(couple_set)
    with pytest.raises(ValueError):
        m.log10_k_obs[0, 0] = 1.0
    with pytest.raises(AttributeError):
        m.medium = "dmso"
    d = m.to_dict()
    text = json.dumps(d, allow_nan=False)  # no NaN: null where not computable
    back = json.loads(text)
    assert back["ids"] == list(m.ids)
    assert back["log10_k_obs"][0][0] == pytest.approx(m.log10_k_obs[0, 0], rel=1e-15)
    assert None in back["log10_k_obs"][0]


def test_errors(couple_set):
    with pytest.raises(UnknownCoupleError):
        rate_map(couple_set, ids=["hl-iron-a", "nope"])
    with pytest.raises(ConditionsError, match="unknown medium"):
        rate_map(couple_set, conditions=Conditions(medium="benzene"))
