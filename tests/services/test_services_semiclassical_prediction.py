"""Semiclassical predictions: the quantum factor is 1 where no driving force acts (consistent with the
measured self-exchange rates), large deep in the inverted region, built from the couples' inner lambdas."""

import json
import math

import pytest

from crossrate.api import load_library
from crossrate.cli.main import main
from crossrate.core.semiclassical import ln_quantum_factor
from crossrate.errors import ConditionsError
from crossrate.services.conditions import Conditions
from crossrate.services.prediction import predict

LIBRARY = """\
# Invented couples (Halden Lake scenario) for the semiclassical prediction tests; not literature values.
[library]
title = "semiclassical test couples (invented)"
format = 1
medium = "water"
temperature = 298.15
E_scale = "SHE"

[couple.hl-sc-a]
name = "invented neutral couple A"
charge_ox = 0
charge_red = -1
E = 0.20
radius = 4.0
ionic_strength = 0.1
k_self = 1e6
source = "invented for tests"

[couple.hl-sc-b]
name = "invented neutral couple B, same potential as A"
charge_ox = 0
charge_red = -1
E = 0.20
radius = 4.0
ionic_strength = 0.1
k_self = 1e8
lambda_in = 15.0
source = "invented for tests"

[couple.hl-sc-strong]
name = "invented strong oxidant"
charge_ox = 0
charge_red = -1
E = 1.60
radius = 4.0
ionic_strength = 0.1
k_self = 1e8
source = "invented for tests"

[couple.hl-sc-weak]
name = "invented strong reductant"
charge_ox = 0
charge_red = -1
E = -1.40
radius = 4.0
ionic_strength = 0.1
k_self = 1e8
source = "invented for tests"
"""

SEMI = Conditions(rate_model="semiclassical")


@pytest.fixture(scope="module")
def lib(tmp_path_factory):
    path = tmp_path_factory.mktemp("sc") / "sc.toml"
    path.write_text(LIBRARY, encoding="utf-8")
    return path


@pytest.fixture(scope="module")
def cs(lib):
    return load_library(str(lib), bundled=False, group=False, personal=False)


def test_no_driving_force_keeps_the_classical_rate(cs):
    # Equal potentials and neutral oxidized forms: dG0' = 0 (no work terms with a neutral partner), so
    # Q = 1 by construction and the cross rate is the classical cross relation's, itself anchored on the
    # measured self-exchange rates.
    c = predict(cs, "hl-sc-a", "hl-sc-b", samples=0)
    s = predict(cs, "hl-sc-a", "hl-sc-b", SEMI, samples=0)
    assert c.dG0_prime_kJ_per_mol == pytest.approx(0.0, abs=1e-9)
    assert s.semiclassical["log10_quantum_factor"] == pytest.approx(0.0, abs=1e-12)
    assert s.log10_k_obs == pytest.approx(c.log10_k_obs, abs=1e-12)
    assert c.rate_model == "classical" and c.semiclassical is None


def test_inner_lambda_split_from_the_couples(cs):
    s = predict(cs, "hl-sc-a", "hl-sc-b", SEMI, samples=0)
    # hl-sc-b gives lambda_in = 15 kJ/mol; hl-sc-a gives none: 25 % of its lambda11 (the default).
    want = 0.5 * (0.25 * s.lambda11_kJ_per_mol + 15.0)
    assert s.semiclassical["lambda_in12_kJ_per_mol"] == pytest.approx(want, rel=1e-12)
    assert s.semiclassical["lambda_in12_kJ_per_mol"] + s.semiclassical["lambda_out12_kJ_per_mol"] == \
        pytest.approx(s.lambda_kJ_per_mol, rel=1e-12)
    assert s.semiclassical["inner_from"] == {"hl-sc-a": "default", "hl-sc-b": "lambda_in"}
    assert any("hl-sc-a gives no lambda_in" in w for w in s.warnings)
    assert any("1500 cm^-1 (the default" in w for w in s.warnings)


def test_deep_inverted_region_is_much_faster_than_classical(cs):
    # dG0 = -3.0 eV against lambda12 ~ 0.4 eV: classically far down the inverted branch; the quantized mode
    # opens product channels and the rate falls far more gently (common practice).
    c = predict(cs, "hl-sc-strong", "hl-sc-weak", Conditions(diffusion=False), samples=0)
    s = predict(cs, "hl-sc-strong", "hl-sc-weak", Conditions(diffusion=False, rate_model="semiclassical",
                                                             hbar_omega_cm1=1500.0), samples=0)
    assert c.regime == "inverted"
    lam = s.lambda_kJ_per_mol * 1e3
    lv = 0.25 * lam  # both couples default to a quarter of their lambda
    cm1 = 6.62607015e-34 * 299792458.0 * 100.0 * 6.02214076e23  # J/mol per cm^-1 (exact SI values)
    lnq = float(ln_quantum_factor(s.dG0_prime_kJ_per_mol * 1e3, lam - lv, lv, 1500.0 * cm1, 298.15))
    assert s.log10_k_act - c.log10_k_act == pytest.approx(lnq / math.log(10.0), abs=1e-9)
    assert s.log10_k_act - c.log10_k_act > 5.0
    assert not any("the default; --hbar-omega" in w for w in s.warnings)


def test_interval_of_a_semiclassical_prediction(cs):
    s = predict(cs, "hl-sc-strong", "hl-sc-weak", Conditions(diffusion=False, rate_model="semiclassical"),
                samples=4000, seed=3)
    lo, hi = s.log10_k_obs_95
    assert lo < s.log10_k_obs < hi


def test_bad_model_options():
    with pytest.raises(ConditionsError, match="rate model 'quantum'"):
        Conditions(rate_model="quantum")
    with pytest.raises(ConditionsError, match="hbar omega 50"):
        Conditions(rate_model="semiclassical", hbar_omega_cm1=50.0)


def test_cli_json(lib, capsys):
    code = main(["predict", "hl-sc-strong", "hl-sc-weak", "--no-bundled", "--library", str(lib),
                 "--model", "semiclassical", "--hbar-omega", "1200", "--format", "json", "--samples", "0"])
    out = json.loads(capsys.readouterr().out)
    assert code == 0
    assert out["rate_model"] == "semiclassical"
    assert out["semiclassical"]["hbar_omega_cm1"] == 1200.0
    assert {"lambda_in12_kJ_per_mol", "lambda_out12_kJ_per_mol", "log10_quantum_factor"} <= set(out["semiclassical"])


def test_measured_check_refuses_the_semiclassical_model(cs):
    from crossrate.services.measured_check import check_measured

    with pytest.raises(ConditionsError, match="the measured-rate check uses the classical model only"):
        check_measured(cs, [], conditions=SEMI)
