"""Checking measured rates against predictions: the verdict ladder, the likely causes, the file check."""

import math

import pytest

from crossrate.errors import InputFileError, ScienceError
from crossrate.services.conditions import Conditions
from crossrate.services.measured_check import (
    DEFAULT_MEASURED_LOG10_SD,
    Z95,
    check_measured,
    check_pair,
)
from crossrate.services.measured_csv import read_measured_csv
from crossrate.services.prediction import predict


def _pred(cs, ox, red, **kw):
    return predict(cs, ox, red, kw.pop("conditions", None), samples=4000, seed=3)


def test_ladder_rungs_follow_the_ratio(analysis_set):
    # hl-phen + hl-amm has a narrow prediction interval (both k_self well stated, rate near activationless),
    # so with a measured SD of 0.02 the combined half-width is well below log10(5) = 0.70.
    p = _pred(analysis_set, "hl-phen", "hl-amm")
    couples = (analysis_set["hl-phen"], analysis_set["hl-amm"])
    lo, hi = p.log10_k_obs_95
    half = max(p.log10_k_obs - lo, hi - p.log10_k_obs)
    assert math.hypot(half, Z95 * 0.02) < math.log10(5.0)
    same = check_pair(p, 10.0**p.log10_k_obs, 0.02, couples=couples)
    assert same.verdict == "within_interval" and same.position == "inside"
    assert same.log10_ratio == pytest.approx(0.0, abs=1e-12)
    assert same.likely_causes == ()
    five = check_pair(p, 10.0 ** (p.log10_k_obs - math.log10(5.0)), 0.02, couples=couples)
    # log10(measured/predicted) = -log10 5 = -0.699: outside the interval, inside the factor of 10.
    assert five.log10_ratio == pytest.approx(-math.log10(5.0), abs=1e-9)
    assert five.verdict == "within_10x" and five.position == "below"
    thirty = check_pair(p, 10.0 ** (p.log10_k_obs - math.log10(30.0)), 0.02, couples=couples)
    assert thirty.verdict == "beyond_10x"
    assert thirty.factor == pytest.approx(1 / 30.0, rel=1e-9)
    assert "30 times slower" in thirty.verdict_text


def test_combined_interval_adds_spreads_in_quadrature(analysis_set):
    p = _pred(analysis_set, "hl-phen", "hl-aqua")
    c = check_pair(p, 1e5, 0.25)
    lo, hi = p.log10_k_obs_95
    # Independent errors: half-widths add in quadrature, hypot(pred - lo, 1.96 * 0.25).
    assert c.combined_95[0] == pytest.approx(p.log10_k_obs - math.hypot(p.log10_k_obs - lo, Z95 * 0.25), abs=1e-12)
    assert c.combined_95[1] == pytest.approx(p.log10_k_obs + math.hypot(hi - p.log10_k_obs, Z95 * 0.25), abs=1e-12)
    d = check_pair(p, 1e5)
    assert d.measured_sd_defaulted and d.k_measured_log10_sd == DEFAULT_MEASURED_LOG10_SD
    assert "assumed" in d.verdict_text


def test_spin_change_tag_leads_the_causes(analysis_set):
    p = _pred(analysis_set, "hl-amm", "hl-spin")
    c = check_pair(p, 10.0 ** (p.log10_k_obs + 3.0), couples=(analysis_set["hl-amm"], analysis_set["hl-spin"]))
    assert c.verdict == "beyond_10x"
    assert c.likely_cause_keys[0] == "spin_change"
    assert "hl-spin" in c.likely_causes[0]


def test_non_adiabatic_couple_ranks_high_when_slower(analysis_set):
    p = _pred(analysis_set, "hl-phen", "hl-slow")
    couples = (analysis_set["hl-phen"], analysis_set["hl-slow"])
    slower = check_pair(p, 10.0 ** (p.log10_k_obs - 2.5), couples=couples)
    assert slower.likely_cause_keys[0] in ("non_adiabatic", "diffusion_control")
    assert "non_adiabatic" in slower.likely_cause_keys[:2]
    assert "hl-slow" in slower.likely_causes[slower.likely_cause_keys.index("non_adiabatic")]
    faster = check_pair(p, 10.0 ** (p.log10_k_diff - 0.6), 0.02, couples=couples)
    assert not faster.above_diffusion_limit
    assert faster.likely_cause_keys.index("inner_sphere") < faster.likely_cause_keys.index("non_adiabatic")


def test_rate_above_diffusion_limit_is_named_first(analysis_set):
    p = _pred(analysis_set, "hl-bpy", "hl-amm")
    c = check_pair(p, 10.0 ** (p.log10_k_diff + 1.0))
    assert c.above_diffusion_limit
    assert c.likely_cause_keys[0] == "above_diffusion_limit"


def test_high_charges_and_ionic_strength_suggest_ion_pairing(analysis_set):
    p = _pred(analysis_set, "hl-bpy", "hl-cyano", conditions=Conditions(ionic_strength_M=1.0))
    c = check_pair(p, 10.0 ** (p.log10_k_obs - 2.0), couples=(analysis_set["hl-bpy"], analysis_set["hl-cyano"]))
    assert "ion_pairing" in c.likely_cause_keys
    text = c.likely_causes[c.likely_cause_keys.index("ion_pairing")]
    # Precursor Ox1 (3+) with Red2 (4-): charge product -12; I = 1 M.
    assert "-12" in text and "1 M" in text
    moved = c.likely_causes[c.likely_cause_keys.index("mismatched_conditions")]
    assert "I 0.1 M" in moved  # both couples were measured at 0.1 M


def test_bad_measured_values_raise(analysis_set):
    p = _pred(analysis_set, "hl-phen", "hl-aqua")
    for bad in (0.0, -1.0, float("nan"), float("inf")):
        with pytest.raises(ScienceError, match="greater than 0"):
            check_pair(p, bad)
    with pytest.raises(ScienceError, match="positive"):
        check_pair(p, 1e5, -0.1)


def _write(tmp_path, text, name="measured.csv"):
    path = tmp_path / name
    path.write_text(text, encoding="utf-8")
    return path


def test_file_check_summary(analysis_set, tmp_path):
    p1 = _pred(analysis_set, "hl-phen", "hl-amm")
    p2 = _pred(analysis_set, "hl-bpy", "hl-amm")
    # Row 1 measured = predicted (log ratio 0); row 2 100x slower (-2); row 3 3x faster (+0.477).
    text = (
        "# invented measurements\n"
        "oxidant,reductant,k_measured,k_measured_log10_sd\n"
        f"hl-phen,hl-amm,{10.0 ** p1.log10_k_obs!r},0.05\n"
        f"hl-bpy,hl-amm,{10.0 ** (p2.log10_k_obs - 2.0)!r},0.05\n"
        f"hl-phen,hl-amm,{10.0 ** (p1.log10_k_obs + math.log10(3.0))!r},0.05\n"
    )
    rows = read_measured_csv(_write(tmp_path, text))
    assert [r.line for r in rows] == [3, 4, 5]
    rep = check_measured(analysis_set, rows, samples=4000, seed=3)
    s = rep.summary
    assert s.n == 3
    # |ratios| = 0, 2, 0.477: median 0.477; two of three within 10x.
    assert s.median_abs_log10_ratio == pytest.approx(math.log10(3.0), abs=1e-9)
    assert s.fraction_within_10x == pytest.approx(2 / 3)
    assert s.worst[0][0] == 4 and s.worst[0][3] == pytest.approx(-2.0, abs=1e-9)
    assert [r.line for r in rep.rows_over(10.0)] == [4]
    d = rep.to_dict()
    assert set(d) >= {"rows", "summary"}
    assert {"log10_k_pred", "log10_ratio", "verdict"} <= set(d["rows"][0])
    assert {"n", "median_abs_log10_ratio", "fraction_within_10x"} <= set(d["summary"])


def test_row_conditions_override_the_command(analysis_set, tmp_path):
    text = "oxidant,reductant,k_measured,ionic_strength,temperature\nhl-phen,hl-aqua,1e5,0.5,288.15\n"
    rows = read_measured_csv(_write(tmp_path, text))
    rep = check_measured(analysis_set, rows, Conditions(ionic_strength_M=0.1), samples=0)
    used = rep.rows[0].prediction.conditions
    assert used.ionic_strength_M == 0.5 and used.temperature_K == 288.15


def test_unknown_ids_are_listed_with_line_and_suggestion(analysis_set, tmp_path):
    text = "oxidant,reductant,k_measured\nhl-phen,hl-aqua,1e5\nhl-phne,hl-aqua,1e5\nhl-phen,nothing-like-it,1e5\n"
    rows = read_measured_csv(_write(tmp_path, text))
    with pytest.raises(InputFileError) as exc:
        check_measured(analysis_set, rows, samples=0)
    msg = str(exc.value)
    assert f"{tmp_path / 'measured.csv'}:3: field oxidant: unknown couple 'hl-phne'; did you mean hl-phen" in msg
    assert ":4: field reductant: unknown couple 'nothing-like-it'" in msg


def test_mixed_media_row_is_refused_with_its_line(analysis_set, tmp_path):
    rows = read_measured_csv(_write(tmp_path, "oxidant,reductant,k_measured\nhl-acn,hl-aqua,1e5\n"))
    with pytest.raises(InputFileError, match=r"measured\.csv:2: hl-acn \+ hl-aqua: couples measured in different media"):
        check_measured(analysis_set, rows, samples=0)


def test_check_pair_without_couple_records_uses_the_prediction(analysis_set):
    # The workbench may call check_pair with the prediction only: the spin-change warning still ranks first,
    # and numpy scalars are accepted as measured values.
    import numpy as np

    p = _pred(analysis_set, "hl-amm", "hl-spin")
    c = check_pair(p, np.float64(10.0 ** (p.log10_k_obs + 3.0)), np.float32(0.1))
    assert c.likely_cause_keys[0] == "spin_change"
    assert c.to_dict()["verdict"] == "beyond_10x" and "prediction" not in c.to_dict()
