"""predict_many's grouped fast path (pair_groups) gives the same numbers as the per-pair path and as predict()."""

import numpy as np
import pytest

from crossrate.services import pair_groups
from crossrate.services.batch_prediction import predict_many
from crossrate.services.conditions import Conditions
from crossrate.services.prediction import predict

CONDITIONS = [
    Conditions(),
    Conditions(ionic_strength_M=0.2, temperature_K=305.0),
    Conditions(allow_mixed_media=True),
    Conditions(medium="water", allow_mixed_media=True),
    Conditions(diffusion=False),
]


def _all_pairs(cs):
    n = len(cs)
    return np.repeat(np.arange(n), n), np.tile(np.arange(n), n)


@pytest.mark.parametrize("cond", CONDITIONS, ids=lambda c: repr(c)[11:60])
def test_grouped_equals_per_pair_path(couple_set, cond, monkeypatch):
    ox, red = _all_pairs(couple_set)
    fast = predict_many(couple_set, ox, red, cond)
    monkeypatch.setattr(pair_groups, "MAX_GROUPS", 0)  # forces the per-pair carrying path where it applies
    slow = predict_many(couple_set, ox, red, cond)
    assert fast.problem == slow.problem
    for name in ("log10_k_obs", "log10_k_act", "dG0_kJ_per_mol", "lambda_kJ_per_mol"):
        np.testing.assert_array_equal(np.asarray(getattr(fast, name)), np.asarray(getattr(slow, name)))
    # The SD is a central difference of the same model on two code paths: equal to ~1e-9 relative, but for
    # k_D, which the grouped path reads from a table (TABLE_TOLERANCE in ln k_D; the slopes of ln k_obs move
    # with k_obs / k_D by as much): 1e-4 relative.
    np.testing.assert_allclose(fast.log10_k_obs_sd_linear, slow.log10_k_obs_sd_linear, rtol=1e-4, atol=1e-12)


def test_linear_sd_equals_predict(couple_set):
    pairs = [("hl-iron-a", "hl-ru-b"), ("hl-quinone-e", "hl-co-c"), ("hl-co-c", "hl-spin-d"), ("hl-mecn-j", "hl-mecn-i")]
    table = predict_many(couple_set, [p[0] for p in pairs], [p[1] for p in pairs])
    for k, (ox, red) in enumerate(pairs):
        p = predict(couple_set, ox, red, samples=0)
        assert table.log10_k_obs[k] == pytest.approx(p.log10_k_obs, abs=1e-12)
        # uncertainty.linear_sd (four central differences) vs the two-slope grouped form: same first-order SD.
        assert table.log10_k_obs_sd_linear[k] == pytest.approx(p.log10_k_obs_sd_linear, rel=1e-6)


def test_ids_as_list_tuple_array_or_positions(couple_set):
    ids = ["hl-iron-a", "hl-co-c"]
    a = predict_many(couple_set, ids, ["hl-ru-b", "hl-ru-b"])
    b = predict_many(couple_set, tuple(ids), np.array(["hl-ru-b", "hl-ru-b"]))
    c = predict_many(couple_set, couple_set.index_of(ids), [1, 1])
    assert a.log10_k_obs == b.log10_k_obs == c.log10_k_obs
    assert len(predict_many(couple_set, [], [])) == 0
