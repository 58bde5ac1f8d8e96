"""k0 from the self-exchange rate (Marcus 1965 relation, k0/Z_el = (k_ex/Z_sol)^1/2; from memory)."""

import json
import math

import pytest
from scipy import constants

from crossrate.core.work_terms import work_term
from crossrate.errors import ScienceError, UnknownCoupleError
from crossrate.services.conditions import Conditions
from crossrate.services.electrode_rate import DEFAULT_Z_EL_CM_S, RELATION_LOG10_SD, Z95, predict_k0


def test_neutral_partner_couple_with_molar_mass(electrode_set):
    r = predict_k0(electrode_set, "hl-el-neutral")
    # Marcus 1965 (from memory): k0 = Z_el (k_ex/Z_sol)^1/2 when the self-exchange work term is zero (z 1 and 0);
    # Z_el = (k_B T / 2 pi m)^1/2 = (R T / 2 pi M)^1/2 with M = 0.186 kg/mol, in m/s, times 100 for cm/s
    # (gas-kinetic wall collision frequency, common practice). R from scipy.constants.
    z_el = math.sqrt(constants.R * 298.15 / (2 * math.pi * 0.186)) * 100.0
    expected = z_el * math.sqrt(5.0e6 / 1e11)
    assert r.Z_el_cm_s == pytest.approx(z_el, rel=1e-12)
    assert r.k0_cm_s == pytest.approx(expected, rel=1e-9)
    assert r.w_self_kJ_per_mol == 0.0
    # The interval: SD = hypot(k_self SD / 2, relation SD); 95 % = +-1.96 SD (normal quantile, common practice).
    sd = math.hypot(0.2 / 2, RELATION_LOG10_SD)
    assert r.log10_k0_sd == pytest.approx(sd, rel=1e-12)
    assert r.log10_k0_95[0] == pytest.approx(math.log10(expected) - Z95 * sd, abs=1e-9)
    assert r.log10_k0_95[1] == pytest.approx(math.log10(expected) + Z95 * sd, abs=1e-9)
    assert r.lambda_el_kJ_per_mol == pytest.approx(r.lambda_self_kJ_per_mol / 2, rel=1e-12)


def test_charged_couple_removes_the_self_exchange_work_term(electrode_set):
    r = predict_k0(electrode_set, "hl-el-charged")
    # The same relation with the self-exchange work term removed: ln k0 = ln Z_el + 1/2 (ln(k_ex/Z_sol) + w/RT),
    # w at r = 2 x 4.5 A in water, I = 0.5 M (Debye-Hueckel-Brønsted form, the project's work_term); w_el = 0.
    eps = 78.36  # water at 25 degC, as in crossrate/core/data/solvents.csv
    w = float(work_term(3, 2, 9e-10, eps, 298.15, 0.5))
    RT = constants.R * 298.15
    expected = DEFAULT_Z_EL_CM_S * math.sqrt(1e3 / 1e11) * math.exp(w / (2 * RT))
    assert r.w_self_kJ_per_mol == pytest.approx(w / 1e3, rel=1e-3)
    assert r.k0_cm_s == pytest.approx(expected, rel=2e-3)
    assert any("double-layer" in n for n in r.notes)
    assert "default" in r.Z_el_source


def test_given_Z_el_and_Z_sol_scale_k0(electrode_set):
    base = predict_k0(electrode_set, "hl-el-neutral")
    # k0 is proportional to Z_el and to Z_sol^-1/2 (the relation as written above).
    other = predict_k0(electrode_set, "hl-el-neutral", Conditions(Z=1e10), Z_el_cm_s=1e3)
    assert other.k0_cm_s == pytest.approx(base.k0_cm_s * (1e3 / base.Z_el_cm_s) * math.sqrt(10.0), rel=1e-9)


def test_estimated_k_self_says_so_and_widens_the_interval(electrode_set):
    r = predict_k0(electrode_set, "hl-el-lambda")
    assert any("lambda_total" in n for n in r.notes)
    assert r.log10_k0_sd > RELATION_LOG10_SD


def test_no_rate_data_and_unknown_couple_are_refused(electrode_set):
    with pytest.raises(ScienceError, match="hl-el-bare"):
        predict_k0(electrode_set, "hl-el-bare")
    with pytest.raises(UnknownCoupleError):
        predict_k0(electrode_set, "hl-el-nope")
    with pytest.raises(ScienceError, match="Z_el"):
        predict_k0(electrode_set, "hl-el-neutral", Z_el_cm_s=-1.0)


def test_cli_table_json_and_api_agree(electrode_set, run_electrode):
    rc, out, err = run_electrode("k0", "hl-el-neutral", "--format", "json")
    assert rc == 0 and err == ""
    d = json.loads(out)
    r = predict_k0(electrode_set, "hl-el-neutral")
    assert d == json.loads(json.dumps(r.to_dict()))
    rc, out, _ = run_electrode("k0", "hl-el-neutral")
    assert rc == 0
    assert f"{r.k0_cm_s:.3g}" in out and "Marcus 1965" in out
    assert "not a safety assessment" in out


def test_cli_errors_are_one_line_exit_2(run_electrode):
    rc, out, err = run_electrode("k0", "hl-el-bare")
    assert rc == 2 and out == "" and len(err.strip().splitlines()) == 1 and "hl-el-bare" in err
    rc, _, err = run_electrode("k0", "hl-el-neutrl")
    assert rc == 2 and "hl-el-neutral" in err
    rc, _, err = run_electrode("k0", "hl-el-neutral", "--Z-el", "0")
    assert rc == 2 and "--Z-el" in err
