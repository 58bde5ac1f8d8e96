"""A measured k0 or measured peak separations against the predicted k0."""

import json
import math
from pathlib import Path

import pytest
from scipy import constants

from crossrate.errors import InputFileError, ScienceError
from crossrate.services.electrode_check import check_electrode, k0_from_peaks, read_peak_csv
from crossrate.services.electrode_rate import predict_k0
from crossrate.services.voltammogram import CvSetup, simulate_voltammogram

F_RT = constants.physical_constants["Faraday constant"][0] / (constants.R * 298.15)


def test_separation_read_through_nicholsons_curve():
    setup = CvSetup(log10_k0=0.0, D_ox_cm2_s=1e-5)
    rows = k0_from_peaks([(3, 1.0, 84.0, None, ""), (4, 1.0, 212.0, None, "")], setup)
    # Nicholson 1965 (from memory): 84 mV <-> psi = 1 and 212 mV <-> psi = 0.1; k0 = psi (pi D f v)^1/2.
    # The simulated curve lies within 2 mV of those values, i.e. psi within about 10 %.
    for row, psi in zip(rows, (1.0, 0.1), strict=True):
        assert row.psi == pytest.approx(psi, rel=0.12)
        assert 10**row.log10_k0 == pytest.approx(row.psi * math.sqrt(math.pi * 1e-5 * F_RT), rel=1e-9)
        assert row.dEp_sd_mV == 2.0 and row.log10_k0_sd > 0


def test_round_trip_through_the_simulation():
    true = CvSetup(log10_k0=-1.7, D_ox_cm2_s=1.2e-5, D_red_cm2_s=1.2e-5)
    rows = [(k, v, simulate_voltammogram(true, v).dEp_mV, 1.0, "") for k, v in enumerate((0.5, 5.0, 50.0))]
    back = k0_from_peaks(rows, true)
    # The inversion reads the same simulation it was made from: k0 back within the curve's interpolation.
    for row in back:
        assert row.log10_k0 == pytest.approx(-1.7, abs=0.03)


def test_verdicts_for_a_given_k0(electrode_set):
    p = predict_k0(electrode_set, "hl-el-neutral")
    same = check_electrode(p, k0_measured_cm_s=p.k0_cm_s)
    assert same.verdict == "within_interval" and same.likely_causes == ()
    # 10^-1.5 of the prediction: outside the combined interval 1.96 (0.3^2 + 0.51^2)^1/2 = 1.16 decades.
    slow = check_electrode(p, k0_measured_cm_s=p.k0_cm_s * 10**-1.5, k0_log10_sd=0.3)
    assert slow.verdict == "beyond_10x" and slow.log10_ratio == pytest.approx(-1.5, abs=1e-9)
    assert "film_on_electrode" in slow.likely_cause_keys[:2]
    fast = check_electrode(p, k0_measured_cm_s=p.k0_cm_s * 10**1.5)
    assert fast.likely_cause_keys[0] == "non_outer_sphere"
    with pytest.raises(ScienceError):
        check_electrode(p, k0_measured_cm_s=-1.0)
    with pytest.raises(ScienceError):
        check_electrode(p)


def test_reversible_rows_give_a_lower_bound_and_narrow_ones_point_to_adsorption(electrode_set):
    p = predict_k0(electrode_set, "hl-el-neutral")
    setup = CvSetup(log10_k0=p.log10_k0, D_ox_cm2_s=1e-5, D_red_cm2_s=1e-5)
    r = check_electrode(p, peak_rows=[(2, 0.1, 59.0, None, ""), (3, 1.0, 59.5, None, "")], setup=setup)
    assert r.log10_k0_measured is None and r.verdict == "consistent_lower_bound"
    # Lower bound from psi >= 20 at the fastest scan: k0 >= 20 (pi D f v)^1/2.
    assert r.log10_k0_lower_bound == pytest.approx(math.log10(20 * math.sqrt(math.pi * 1e-5 * F_RT * 1.0)), abs=1e-9)
    narrow = check_electrode(p, peak_rows=[(2, 0.1, 45.0, None, "")], setup=setup)
    assert narrow.likely_cause_keys[0] == "adsorption"


def test_falling_k0_with_scan_rate_points_to_resistance(electrode_set):
    p = predict_k0(electrode_set, "hl-el-neutral")
    setup = CvSetup(log10_k0=p.log10_k0, D_ox_cm2_s=1.7e-5, D_red_cm2_s=1.7e-5)
    rows = [(1, 0.05, 62.0, 2.0, ""), (2, 0.5, 68.0, 2.0, ""), (3, 5.0, 125.0, 3.0, ""), (4, 10.0, 170.0, 3.0, "")]
    r = check_electrode(p, peak_rows=rows, setup=setup)
    assert r.slope_log10_k0_vs_log10_v < -0.15
    assert r.likely_cause_keys[0] == "uncompensated_resistance"


def test_peak_csv_errors_name_file_line_and_column(tmp_path):
    f = tmp_path / "peaks.csv"
    f.write_text("# comment\nscan_rate,dEp_mV\n0.1,64\n-1,70\n1,abc\n", encoding="utf-8")
    with pytest.raises(InputFileError) as err:
        read_peak_csv(f)
    text = str(err.value)
    assert f"{f}:4:1: field scan_rate" in text and f"{f}:5:2: field dEp_mV" in text
    f.write_text("scan_rate,dEp\n0.1,64\n", encoding="utf-8")
    with pytest.raises(InputFileError, match="dEp_mV"):
        read_peak_csv(f)


def test_cli_check_with_the_example_file(run_electrode, tmp_path):
    example = str(Path(__file__).resolve().parents[2] / "libraries" / "examples" / "electrode_peaks_demo.csv")
    rc, out, err = run_electrode("check", "hl-fc-ref", "--demo", "--peaks", example, library=False)
    assert rc == 0, err
    assert "uncompensated resistance" in out and "not a safety assessment" in out
    rc, out, _ = run_electrode("check", "hl-el-neutral", "--k0-measured", "1", "--format", "json")
    d = json.loads(out)
    assert d["verdict"] in ("within_interval", "within_10x", "beyond_10x") and d["prediction"]["couple"] == "hl-el-neutral"
    bad = tmp_path / "bad.csv"
    bad.write_text("scan_rate,dEp_mV\n0.1,x\n", encoding="utf-8")
    rc, out, err = run_electrode("check", "hl-el-neutral", "--peaks", str(bad))
    assert rc == 2 and out == "" and f"{bad}:2:2" in err
    rc, _, err = run_electrode("check", "hl-el-neutral")
    assert rc == 2 and "--k0-measured" in err
