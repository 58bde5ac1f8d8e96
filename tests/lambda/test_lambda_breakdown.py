"""The lambda breakdown service (services/lambda_estimate): inner, outer, work, implied and measured k_self."""

import json
import math

import pytest
from scipy import constants as sc

from crossrate.errors import ConditionsError, ScienceError, UnknownCoupleError
from crossrate.library.couple import BondSet
from crossrate.services.conditions import Conditions
from crossrate.services.lambda_estimate import lambda_breakdown, lambda_for_structure

RT_KJ = sc.R * 298.15 / 1e3
LN_Z = math.log(1e11)


def test_breakdown_of_a_measured_couple_with_bond_data(lambda_set):
    b = lambda_breakdown(lambda_set, "meas_w")
    # Hand values (see test_lambda_self_exchange): lambda_in 138.186, lambda_out 109.250 kJ/mol.
    assert b.lambda_in_kJ_per_mol == pytest.approx(138.186, abs=1e-3)
    assert b.lambda_out_kJ_per_mol == pytest.approx(109.250, abs=1e-3)
    assert b.lambda_estimate_kJ_per_mol == pytest.approx(247.436, abs=2e-3)
    assert b.lambda_estimate_sd_kJ_per_mol == pytest.approx(0.15 * 247.436, abs=1e-3)
    # The estimate's k_self: ln k = ln Z - (w + lambda/4)/RT.
    lnk = LN_Z - (b.work_kJ_per_mol + b.lambda_estimate_kJ_per_mol / 4) / RT_KJ
    assert b.log10_k_self_estimate == pytest.approx(lnk / math.log(10), abs=1e-9)
    # The lambda the measurement implies gives the measured k_self back through the same relation.
    back = LN_Z - (b.work_kJ_per_mol + b.lambda_measured_kJ_per_mol / 4) / RT_KJ
    assert back == pytest.approx(math.log(4.0), abs=1e-9)
    assert b.lambda_in_inferred_kJ_per_mol == pytest.approx(b.lambda_measured_kJ_per_mol - 109.250, abs=1e-3)
    assert b.log10_k_self_measured == pytest.approx(math.log10(4.0), abs=1e-12)
    assert b.log10_k_self_used == pytest.approx(math.log10(4.0), abs=1e-9)
    assert "measured" in b.k_self_used_how


def test_breakdown_in_another_solvent_uses_its_pekar_factor(lambda_set):
    w = lambda_breakdown(lambda_set, "est_lin")
    m = lambda_breakdown(lambda_set, "est_lin", medium="acetonitrile")
    assert m.medium == "acetonitrile" and m.pekar_factor == pytest.approx(0.527765, abs=2e-6)
    assert w.lambda_out_kJ_per_mol / m.lambda_out_kJ_per_mol == pytest.approx(0.550433 / 0.527765, rel=1e-5)
    assert m.lambda_in_kJ_per_mol == w.lambda_in_kJ_per_mol == 40.0
    # Predictions would use the same lambda for this couple (lambda_in + two-sphere lambda_out).
    assert m.log10_k_self_used == pytest.approx(m.log10_k_self_estimate, abs=1e-9)


def test_couple_without_rate_data_shows_a_lambda_out_only_estimate(lambda_set):
    b = lambda_breakdown(lambda_set, "bare")
    assert b.lambda_in_kJ_per_mol is None
    assert b.lambda_estimate_kJ_per_mol == pytest.approx(b.lambda_out_kJ_per_mol, rel=1e-12)
    assert "lambda_out only" in b.estimate_label and "lower bound" in b.estimate_label
    assert b.log10_k_self_used is None and "k_self, lambda_total, lambda_in or bonds" in b.k_self_used_how
    json.dumps(b.to_dict(), allow_nan=False)


def test_kappa_sources_are_stated(lambda_set):
    assert "non-adiabatic" in lambda_breakdown(lambda_set, "est_nonad").kappa_el_source
    assert lambda_breakdown(lambda_set, "est_kappa").kappa_el == 0.01
    assert "adiabatic" in lambda_breakdown(lambda_set, "est_lin").kappa_el_source


def test_conditions_are_used(lambda_set):
    b = lambda_breakdown(lambda_set, "est_total", conditions=Conditions(temperature_K=320.0, ionic_strength_M=1.0))
    assert (b.temperature_K, b.ionic_strength_M) == (320.0, 1.0)
    assert b.lambda_total_given_kJ_per_mol == 150.0


def test_errors_name_the_problem(lambda_set):
    with pytest.raises(UnknownCoupleError):
        lambda_breakdown(lambda_set, "no_such")
    with pytest.raises(ConditionsError, match="unknown medium"):
        lambda_breakdown(lambda_set, "est_lin", medium="benzene")
    with pytest.raises(ScienceError, match="radius"):
        lambda_for_structure(-1.0, "water")
    with pytest.raises(ScienceError, match="kappa_el"):
        lambda_for_structure(3.5, "water", kappa_el=2.0)
    with pytest.raises(ScienceError, match="bond set"):
        lambda_for_structure(3.5, "water", bonds=(BondSet(6, 0.1, -5.0, 100.0),))


def test_structure_not_in_the_library():
    b = lambda_for_structure(
        3.5, "water", bonds=(BondSet(6, 0.14, 250.0, 160.0),), charges=(3, 2),
        conditions=Conditions(ionic_strength_M=0.1),
    )
    assert b.lambda_estimate_kJ_per_mol == pytest.approx(247.436, abs=2e-3)
    assert (b.charge_ox, b.charge_red) == (3, 2) and b.work_kJ_per_mol > 0
    bare = lambda_for_structure(3.5, "water")
    assert bare.charge_ox is None and bare.work_kJ_per_mol == 0.0
    assert any("charges not given" in n for n in bare.notes)
    assert bare.log10_k_self_used is None
