"""screen(): ranking, orientation of the pairs, filters, counts of pairs left out, and errors."""

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from crossrate.errors import ConditionsError, ScienceError, UnknownCoupleError
from crossrate.services.conditions import Conditions
from crossrate.services.prediction import predict
from crossrate.services.screening import Z95, screen

# hl-iron-a (water, SHE, I = 0.1 M) can react with hl-ru-b, hl-co-c, hl-spin-d and hl-quinone-e; the others
# are in acetonitrile (hl-mecn-*), on an unrelated scale, at another ionic strength (hl-iron-g) or lack
# rate data (hl-nodata-f).
PARTNERS_OF_IRON_A = {"hl-ru-b", "hl-co-c", "hl-spin-d", "hl-quinone-e"}


def test_ranked_fastest_first_and_equal_to_predict(couple_set):
    r = screen(couple_set, "hl-iron-a", "oxidant")
    assert set(r.partner) == PARTNERS_OF_IRON_A
    logs = list(r.table.log10_k_obs)
    assert logs == sorted(logs, reverse=True)
    for partner, log_k, ox, red in zip(r.partner, logs, r.table.oxidant, r.table.reductant, strict=True):
        assert (ox, red) == ("hl-iron-a", partner)  # target as oxidant: Ox(target) + Red(partner)
        # Same model as the single-pair prediction (rounding only).
        assert log_k == pytest.approx(predict(couple_set, ox, red, samples=0).log10_k_obs, abs=1e-12)


def test_reductant_role_orients_pairs(couple_set):
    r = screen(couple_set, "hl-co-c", "reductant")
    assert all(red == "hl-co-c" for red in r.table.reductant)
    assert list(r.table.oxidant) == list(r.partner)
    best = predict(couple_set, r.partner[0], "hl-co-c", samples=0)
    assert r.table.log10_k_obs[0] == pytest.approx(best.log10_k_obs, abs=1e-12)


def test_linear_interval_is_plus_minus_1_96_sd(couple_set):
    r = screen(couple_set, "hl-iron-a", "oxidant")
    for (lo, hi), k, sd in zip(r.log10_k_obs_95_linear, r.table.log10_k_obs, r.table.log10_k_obs_sd_linear, strict=True):
        # Two-sided 95 % normal quantile 1.959964 (standard normal table).
        assert lo == pytest.approx(k - 1.959964 * sd, abs=1e-6)
        assert hi == pytest.approx(k + 1.959964 * sd, abs=1e-6)
        assert sd > 0
    assert Z95 == pytest.approx(1.959963984540054, rel=1e-15)


def test_not_computable_pairs_are_counted_with_reasons(couple_set):
    r = screen(couple_set, "hl-iron-a", "oxidant")
    assert r.candidates == len(couple_set) - 1
    assert r.not_computable == r.candidates - len(PARTNERS_OF_IRON_A)
    reasons = dict(r.not_computable_reasons)
    assert sum(reasons.values()) == r.not_computable
    assert reasons["potentials on scales that cannot be related"] == 2  # hl-mecn-i, hl-mecn-j
    assert reasons["couples measured in different media"] == 1  # hl-mecn-h (SCE, acetonitrile)
    assert reasons["no self-exchange rate or reorganization energy"] == 1  # hl-nodata-f
    assert r.filtered_out == 0


def test_ionic_strength_given_brings_in_other_ionic_strength(couple_set):
    base = screen(couple_set, "hl-iron-a", "oxidant")
    r = screen(couple_set, "hl-iron-a", "oxidant", Conditions(ionic_strength_M=0.1))
    assert set(r.partner) == PARTNERS_OF_IRON_A | {"hl-iron-g"}
    assert r.not_computable == base.not_computable - 1


def test_min_k_filter(couple_set):
    full = screen(couple_set, "hl-iron-a", "oxidant")
    threshold = 10.0 ** full.table.log10_k_obs[1]  # keeps exactly the two fastest (values are distinct)
    r = screen(couple_set, "hl-iron-a", "oxidant", min_k=threshold * (1 - 1e-9))
    assert r.partner == full.partner[:2]
    assert r.filtered_out == len(full) - 2


def test_max_dG0_filter(couple_set):
    full = screen(couple_set, "hl-iron-a", "oxidant")
    limit = -50.0  # kJ/mol
    r = screen(couple_set, "hl-iron-a", "oxidant", max_dG0=limit)
    expected = [p for p, g in zip(full.partner, full.table.dG0_kJ_per_mol, strict=True) if g <= limit]
    assert list(r.partner) == expected
    assert 0 < len(expected) < len(full)
    assert all(g <= limit for g in r.table.dG0_kJ_per_mol)


def test_tag_filter_is_case_insensitive(couple_set):
    r = screen(couple_set, "hl-iron-a", "oxidant", tag="CAGE")
    assert set(r.partner) == {"hl-co-c", "hl-spin-d"}
    assert r.candidates == 2


def test_medium_filter(couple_set):
    r = screen(couple_set, "hl-mecn-j", "oxidant", medium="acetonitrile")
    assert r.candidates == 2  # hl-mecn-h and hl-mecn-i
    assert r.partner == ("hl-mecn-i",)  # hl-mecn-h is on SCE, hl-mecn-j on the unrelated test Fc scale
    assert dict(r.not_computable_reasons) == {"potentials on scales that cannot be related": 1}


def test_top(couple_set):
    full = screen(couple_set, "hl-iron-a", "oxidant")
    r = screen(couple_set, "hl-iron-a", "oxidant", top=2)
    assert r.partner == full.partner[:2]
    assert r.filtered_out == len(full) - 2


def test_records_are_json_safe(couple_set):
    rec = screen(couple_set, "hl-iron-a", "oxidant").records()[0]
    assert rec["partner"] == rec["reductant"]
    assert set(rec) >= {"partner", "log10_k_obs", "log10_k_obs_95_linear", "dG0_kJ_per_mol", "regime"}
    assert all(not (isinstance(v, float) and not math.isfinite(v)) for v in rec.values())


def test_errors(couple_set):
    with pytest.raises(UnknownCoupleError, match="hl-iron-a"):
        screen(couple_set, "hl-iron-aa", "oxidant")
    with pytest.raises(ConditionsError, match="role"):
        screen(couple_set, "hl-iron-a", "both")
    with pytest.raises(ScienceError, match="hl-nodata-f has no k_self"):
        screen(couple_set, "hl-nodata-f", "oxidant")
    with pytest.raises(ConditionsError, match="top"):
        screen(couple_set, "hl-iron-a", "oxidant", top=0)
    with pytest.raises(ConditionsError, match="min_k"):
        screen(couple_set, "hl-iron-a", "oxidant", min_k=-1.0)


def test_equal_rates_keep_library_order(direct_set):
    # Two identical partners (same numbers, different ids) tie exactly: the order must be the library order.
    from dataclasses import replace

    from crossrate.library.couple_set import CoupleSet

    base = direct_set["hl-ru-b"]
    couples = [direct_set["hl-iron-a"], replace(base, id="zz-copy"), replace(base, id="aa-copy")]
    cs = CoupleSet(couples, scales=direct_set.scales)
    r = screen(cs, "hl-iron-a", "oxidant")
    assert r.partner == ("zz-copy", "aa-copy")
    assert np.isclose(r.table.log10_k_obs[0], r.table.log10_k_obs[1], rtol=0, atol=0)


@settings(max_examples=60, deadline=None)
@given(
    target=st.sampled_from(["hl-iron-a", "hl-ru-b", "hl-co-c", "hl-quinone-e", "hl-spin-d"]),
    role=st.sampled_from(["oxidant", "reductant"]),
    log_min_k=st.one_of(st.none(), st.floats(-6, 12)),
    max_dG0=st.one_of(st.none(), st.floats(-150, 150)),
    top=st.one_of(st.none(), st.integers(1, 6)),
)
def test_filters_are_the_unfiltered_ranking_cut_down(couple_set, target, role, log_min_k, max_dG0, top):
    full = screen(couple_set, target, role)
    r = screen(couple_set, target, role, min_k=None if log_min_k is None else 10.0**log_min_k,
               max_dG0=max_dG0, top=top)
    kept = [
        p for p, k, g in zip(full.partner, full.table.log10_k_obs, full.table.dG0_kJ_per_mol, strict=True)
        if (log_min_k is None or k >= log_min_k) and (max_dG0 is None or g <= max_dG0)
    ]
    assert list(r.partner) == kept[:top]
    assert r.filtered_out + len(r) + r.not_computable == r.candidates
