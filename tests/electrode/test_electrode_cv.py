"""Simulated voltammograms in laboratory units: Randles-Sevcik currents, Nicholson psi, the reversible limit."""

import json
import math

import pytest
from scipy import constants

from crossrate.errors import ConditionsError
from crossrate.services.voltammogram import CvSetup, scan_rate_series, simulate_voltammogram

FARADAY = constants.physical_constants["Faraday constant"][0]


def test_reversible_peak_current_is_randles_sevcik_within_1_percent():
    s = CvSetup(log10_k0=2.0, D_ox_cm2_s=1e-5, area_cm2=0.1, conc_mM=2.0)
    t = simulate_voltammogram(s, 0.1)
    # Randles-Sevcik (Bard & Faulkner, common practice): i_p = 0.4463 F A C (F v D / RT)^1/2 in SI units:
    # A = 1e-5 m^2, C = 2 mol/m^3, D = 1e-9 m^2/s, v = 0.1 V/s -> amperes, times 1e6 for microampere.
    ip = 0.4463 * FARADAY * 1e-5 * 2.0 * math.sqrt(FARADAY * 0.1 * 1e-9 / (constants.R * 298.15)) * 1e6
    assert -t.ip_c_uA == pytest.approx(ip, rel=0.01)
    assert t.ip_randles_sevcik_uA == pytest.approx(-ip, rel=1e-9)
    assert t.dEp_mV == pytest.approx(58.3, abs=1.0)  # reversible, switch 200 mV past E0' (see the core test)


def test_psi_and_delta_ep_follow_nicholson():
    s = CvSetup(log10_k0=-2.0, D_ox_cm2_s=1e-5)
    v = 1.0
    # psi = k0 / (pi D f v)^1/2 (Nicholson 1965) with f = F/RT.
    psi = 1e-2 / math.sqrt(math.pi * 1e-5 * FARADAY / (constants.R * 298.15) * v)
    t = simulate_voltammogram(s, v)
    assert t.psi == pytest.approx(psi, rel=1e-12)
    # psi = 0.286 lies between Nicholson's 0.35 -> 121 mV and 0.25 -> 141 mV (working curve, from memory).
    assert 121.0 < t.dEp_mV < 141.0


def test_slow_couple_widens_the_window_and_mhc_near_bv_for_large_lambda():
    slow = simulate_voltammogram(CvSetup(log10_k0=-4.0), 1.0)
    assert slow.window_V > 0.2 and slow.Ep_c_V > -slow.window_V + 0.1
    bv = simulate_voltammogram(CvSetup(log10_k0=-2.0), 0.5)
    # Marcus-Hush-Chidsey tends to Butler-Volmer with alpha = 1/2 when lambda >> the overpotentials reached
    # (common practice): with lambda_el = 300 kJ/mol the separations agree within a few mV.
    mhc = simulate_voltammogram(CvSetup(log10_k0=-2.0, kinetics="mhc", lambda_el_kJ_per_mol=300.0), 0.5)
    assert mhc.dEp_mV == pytest.approx(bv.dEp_mV, abs=3.0)
    # A small lambda holds the MHC rates below Butler-Volmer at every overpotential (they level off), so
    # the waves are drawn out and the peak currents fall (common practice).
    small = simulate_voltammogram(CvSetup(log10_k0=-2.0, kinetics="mhc", lambda_el_kJ_per_mol=20.0), 0.5)
    assert abs(small.ip_c_uA) < 0.98 * abs(bv.ip_c_uA) and abs(small.ip_a_uA) < 0.98 * abs(bv.ip_a_uA)


def test_series_reversible_limit_is_matsuda_ayabe():
    s = CvSetup(log10_k0=-1.0, D_ox_cm2_s=1e-5)
    series = scan_rate_series(s, [0.1, 10.0])
    # Matsuda-Ayabe (from memory, via Bard & Faulkner): reversible while k0/(D f v)^1/2 >= 15.
    f = FARADAY / (constants.R * 298.15)
    assert series.reversible_scan_rate_V_s == pytest.approx(0.01 / (225 * 1e-5 * f), rel=1e-12)
    assert series.traces[0].dEp_mV < series.traces[1].dEp_mV


def test_inputs_are_checked():
    with pytest.raises(ConditionsError, match="lambda_el"):
        CvSetup(log10_k0=0.0, kinetics="mhc")
    with pytest.raises(ConditionsError, match="D_ox"):
        CvSetup(log10_k0=0.0, D_ox_cm2_s=-1.0)
    with pytest.raises(ConditionsError, match="resistance"):
        CvSetup(log10_k0=0.0, Ru_ohm=float("nan"))
    with pytest.raises(ConditionsError, match="scan rate"):
        simulate_voltammogram(CvSetup(log10_k0=0.0), 0.0)


def test_cli_cv_table_json_csv_and_plot(run_electrode, tmp_path):
    rc, out, err = run_electrode("cv", "hl-el-charged", "--scan-rates", "0.1,10")
    assert rc == 0 and "dEp / mV" in out and "Matsuda-Ayabe" in out and "not a safety assessment" in out
    rc, out, _ = run_electrode("cv", "--k0", "0.01", "--scan-rates", "1", "--format", "json", library=False)
    d = json.loads(out)
    assert 121.0 < d["scan_rates"][0]["dEp_mV"] < 141.0 and d["k0_prediction"] is None
    rc, out, _ = run_electrode("cv", "--k0", "0.01", "--scan-rates", "1,2", "--format", "csv", library=False)
    assert out.splitlines()[0].startswith("scan_rate_V_s,psi,dEp_mV") and len(out.splitlines()) == 3
    rc, _, err = run_electrode("cv", "--k0", "0.01", "--scan-rates", "1,x", library=False)
    assert rc == 2 and "scan rates" in err
    rc, _, err = run_electrode("cv", "--k0", "0.01", "--kinetics", "mhc", library=False)
    assert rc == 2 and "lambda_el" in err and len(err.strip().splitlines()) == 1
    pytest.importorskip("matplotlib")
    fig = tmp_path / "cv.png"
    rc, _, _ = run_electrode("cv", "--k0", "0.01", "--scan-rates", "0.1,1", "--plot", str(fig), library=False)
    assert rc == 0 and fig.stat().st_size > 1000
