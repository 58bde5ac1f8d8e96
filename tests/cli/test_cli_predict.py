"""`crossrate predict`: golden table, JSON keys and units, agreement with the Python API."""

import json
import math
import os
import subprocess
import sys
from pathlib import Path

import pytest

from crossrate.cli.predict_cmd import DEFAULT_SEED
from crossrate.cli.render_common import symbols

REPO = Path(__file__).resolve().parents[2]
TEST_LIBRARY = REPO / "tests" / "services" / "data" / "halden_screen_test.toml"
JSON_KEYS = {
    "oxidant", "reductant", "conditions", "dG0_kJ_per_mol", "dG0_prime_kJ_per_mol", "log10_K12",
    "lambda_kJ_per_mol", "dG_act_kJ_per_mol", "work_kJ_per_mol", "ln_f12", "ln_W12", "log10_k_act",
    "log10_k_diff", "log10_k_obs", "log10_k_obs_95", "regime", "diffusion_controlled", "warnings",
}
CONDITION_KEYS = {
    "temperature_K", "ionic_strength_M", "medium", "Z", "relative_permittivity", "viscosity_mPa_s",
    "refractive_index",
}


def test_table_golden(run_cli, golden):
    rc, out, err = run_cli("predict", "hl-iron-a", "hl-ru-b")
    assert rc == 0 and err == ""
    golden("predict_iron_a_ru_b.txt", out)


def test_table_golden_carried_conditions(run_cli, golden):
    rc, out, err = run_cli("predict", "hl-quinone-e", "hl-co-c", "--temperature", "310", "--ionic-strength", "0.2")
    assert rc == 0 and err == ""
    assert "k_self carried from its measurement conditions" in out
    golden("predict_quinone_e_co_c_310K.txt", out)


def test_table_shows_every_quantity_with_units(run_cli):
    rc, out, _ = run_cli("predict", "hl-iron-a", "hl-ru-b")
    for label in ("ΔG°", "ΔG°'", "K12", "λ11", "λ22", "λ12", "ΔG‡", "f12", "W12", "w11", "w22", "w12", "w21",
                  "k_act", "k_D", "k_obs", "95 % interval", "Regime", "Warnings"):
        assert label in out, label
    assert "kJ/mol" in out and " eV" in out and "M^-1 s^-1" in out
    assert "Monte Carlo" in out and "20000 draws" in out
    assert out.rstrip().endswith("when\nhandling strong oxidants and reductants.") or out.rstrip().endswith(
        "handling strong oxidants and reductants."
    )
    assert "Estimate only, not a safety assessment;" in out
    assert "default used for: E of hl-ru-b (default SD 10 mV)" in out.replace("\n    ", " ")


def test_ascii_symbols_when_the_stream_cannot_encode_them():
    class Latin:  # e.g. a terminal set to ASCII
        encoding = "ascii"

    sym = symbols(Latin())
    assert sym["dG0"] == "dG0" and sym["lambda"] == "lambda"


def test_json_keys_units_and_strictness(run_cli):
    rc, out, err = run_cli("predict", "hl-iron-a", "hl-ru-b", "--format", "json")
    assert rc == 0 and err == ""
    d = json.loads(out, parse_constant=lambda c: pytest.fail(f"non-strict JSON constant {c}"))
    assert JSON_KEYS <= set(d)
    assert CONDITION_KEYS <= set(d["conditions"])
    assert set(d["work_kJ_per_mol"]) == {"w11", "w22", "w12", "w21"}
    assert d["regime"] in ("endergonic", "normal", "activationless", "inverted")
    assert isinstance(d["diffusion_controlled"], bool)
    lo, hi = d["log10_k_obs_95"]
    assert lo < d["log10_k_obs"] < hi
    # Units: Delta G deg in kJ/mol = -F (E1 - E2) / 1000 with E1 = 0.74 V, E2 = 0.10 V (test library);
    # F = 96485.33212 C/mol (CODATA 2018, scipy.constants).
    assert d["dG0_kJ_per_mol"] == pytest.approx(-96485.33212 * 0.64 / 1000, rel=1e-9)
    # log10 K12 = -Delta G deg / (RT ln 10), R = 8.314462618 J/(mol K) (CODATA 2018).
    assert d["log10_K12"] == pytest.approx(96485.33212 * 0.64 / (8.314462618 * 298.15 * math.log(10)), rel=1e-9)
    assert d["conditions"]["temperature_K"] == 298.15 and d["conditions"]["ionic_strength_M"] == 0.1
    assert d["conditions"]["medium"] == "water" and d["conditions"]["Z"] == 1e11
    # Water viscosity near 0.89 mPa s at 25 degC (CRC Handbook, viscosity of water), so the unit is mPa s.
    assert d["conditions"]["viscosity_mPa_s"] == pytest.approx(0.89, rel=0.02)


def test_json_without_monte_carlo_has_null_interval(run_cli):
    rc, out, _ = run_cli("predict", "hl-iron-a", "hl-ru-b", "--format", "json", "--samples", "0")
    assert rc == 0
    assert json.loads(out)["log10_k_obs_95"] is None
    assert "null" in out and "NaN" not in out


def test_process_output_equals_in_process_output(run_cli, isolated_env):
    # The real entry point in a fresh process (not a TTY, NO_COLOR) prints exactly the in-process text.
    _, expected, _ = run_cli("predict", "hl-iron-a", "hl-ru-b")
    env = dict(os.environ)
    env["PYTHONPATH"] = os.pathsep.join(filter(None, [str(REPO), env.get("PYTHONPATH", "")]))
    proc = subprocess.run(
        [sys.executable, "-m", "crossrate.cli.main", "predict", "hl-iron-a", "hl-ru-b", "--no-bundled",
         "--library", str(TEST_LIBRARY)],
        capture_output=True, text=True, encoding="utf-8", timeout=60, check=False, env=env,
    )
    assert proc.returncode == 0, proc.stderr
    assert proc.stdout == expected


def test_default_seed_makes_the_interval_reproducible(run_cli):
    _, a, _ = run_cli("predict", "hl-iron-a", "hl-ru-b", "--format", "json")
    _, b, _ = run_cli("predict", "hl-iron-a", "hl-ru-b", "--format", "json", "--seed", str(DEFAULT_SEED))
    _, c, _ = run_cli("predict", "hl-iron-a", "hl-ru-b", "--format", "json", "--seed", "1")
    assert a == b
    assert json.loads(a)["log10_k_obs_95"] != json.loads(c)["log10_k_obs_95"]
