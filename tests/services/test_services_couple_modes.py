"""A couple's own high-frequency mode (`hbar_omega`, cm^-1): validated, carried through export and import,
shown in the detail panel, and used by the semiclassical model (the pair's mode: the inner-lambda-weighted
mean of its couples'), unless --hbar-omega overrides it; the warnings say which mode was used."""

import json
import math

import numpy as np
import pytest

from crossrate.api import load_library
from crossrate.cli.main import main
from crossrate.core.level_sum import LEVEL_SUM_TOLERANCE
from crossrate.core.screened_debye_table import TABLE_TOLERANCE
from crossrate.library.couple_export import couple_record, records_csv
from crossrate.library.couple_import import import_couples_csv
from crossrate.library.toml_reader import read_library_file
from crossrate.services.conditions import Conditions
from crossrate.services.prediction import predict
from crossrate.services.rate_map import rate_map

HEAD = """\
# Invented couples (Halden Lake scenario) for the couple-mode tests; not literature values.
[library]
title = "couple mode test couples (invented)"
format = 1
medium = "water"
temperature = 298.15
E_scale = "SHE"
"""


def _couple(cid, E, extra=""):
    return (f"\n[couple.{cid}]\nname = \"invented {cid}\"\ncharge_ox = 0\ncharge_red = -1\nE = {E}\nradius = 4.0\n"
            f"ionic_strength = 0.1\nk_self = 1e7\nsource = \"invented for tests\"\n{extra}")


LIBRARY = (HEAD + _couple("hl-md-ox", 1.5, "lambda_in = 30.0\nhbar_omega = 1000.0\n")
           + _couple("hl-md-red", -1.3, "lambda_in = 10.0\nhbar_omega = 2200.0\n")
           + _couple("hl-md-plain", -1.0) + _couple("hl-md-mid", 0.3, "hbar_omega = 600.0\n"))
SEMI = Conditions(rate_model="semiclassical")
CM1 = 6.62607015e-34 * 299792458.0 * 100.0 * 6.02214076e23  # J/mol per cm^-1: h c (100 cm/m) N_A, exact SI


@pytest.fixture(scope="module")
def lib(tmp_path_factory):
    path = tmp_path_factory.mktemp("md") / "md.toml"
    path.write_text(LIBRARY, encoding="utf-8")
    return path


@pytest.fixture(scope="module")
def cs(lib):
    return load_library(str(lib), bundled=False, group=False, personal=False)


def test_pair_mode_is_the_inner_lambda_weighted_mean(cs):
    p = predict(cs, "hl-md-ox", "hl-md-red", SEMI, samples=0)
    # Both give lambda_in (30 and 10 kJ/mol, under 95 % of their lambda): (30 x 1000 + 10 x 2200) / 40 = 1300.
    assert p.semiclassical["hbar_omega_cm1"] == pytest.approx(1300.0, rel=1e-12)
    assert p.semiclassical["hbar_omega_from"] == {"hl-md-ox": "couple", "hl-md-red": "couple"}
    assert any("hbar omega 1300 cm^-1, the inner-lambda-weighted mean of hl-md-ox 1000 cm^-1 (its hbar_omega) "
               "and hl-md-red 2200 cm^-1 (its hbar_omega)" in w for w in p.warnings)
    # The factor is the one of that mode (ln_quantum_factor at hbar omega = 1300 cm^-1).
    from crossrate.core.semiclassical import ln_quantum_factor

    lam, lv = p.lambda_kJ_per_mol * 1e3, 20e3
    q = float(ln_quantum_factor(p.dG0_prime_kJ_per_mol * 1e3, lam - lv, lv, 1300.0 * CM1, 298.15))
    assert p.semiclassical["log10_quantum_factor"] == pytest.approx(q / math.log(10.0), abs=1e-9)


def test_a_couple_without_a_mode_takes_the_default(cs):
    p = predict(cs, "hl-md-mid", "hl-md-plain", SEMI, samples=0)
    # hl-md-mid 600 cm^-1 (its own), hl-md-plain the default 1500; both inner parts the default 25 % of lambda.
    lam11, lam22 = p.lambda11_kJ_per_mol, p.lambda22_kJ_per_mol
    want = (0.25 * lam11 * 600.0 + 0.25 * lam22 * 1500.0) / (0.25 * lam11 + 0.25 * lam22)
    assert p.semiclassical["hbar_omega_cm1"] == pytest.approx(want, rel=1e-12)
    assert p.semiclassical["hbar_omega_from"] == {"hl-md-mid": "couple", "hl-md-plain": "default"}
    assert any("hl-md-plain 1500 cm^-1 (the default)" in w for w in p.warnings)


def test_option_overrides_the_couples_modes(cs):
    p = predict(cs, "hl-md-ox", "hl-md-red", SEMI.with_(hbar_omega_cm1=1800.0), samples=0)
    assert p.semiclassical["hbar_omega_cm1"] == pytest.approx(1800.0, rel=1e-12)
    assert p.semiclassical["hbar_omega_from"] == {"hl-md-ox": "option", "hl-md-red": "option"}
    assert any("(--hbar-omega, overriding hl-md-ox's own 1000 cm^-1 and hl-md-red's own 2200 cm^-1)" in w
               for w in p.warnings)


def test_map_cells_equal_predict_with_couple_modes(cs):
    m = rate_map(cs, conditions=SEMI)
    assert m.semiclassical["couples_with_own_hbar_omega"] == 3
    # ln Q within LEVEL_SUM_TOLERANCE, ln k_D within TABLE_TOLERANCE (screened table), in log10
    atol = (LEVEL_SUM_TOLERANCE + TABLE_TOLERANCE) / math.log(10.0)
    for i, ox in enumerate(m.ids):
        for j, red in enumerate(m.ids):
            assert m.log10_k_obs[i, j] == pytest.approx(predict(cs, ox, red, SEMI, samples=0).log10_k_obs,
                                                        abs=atol), (ox, red)
    over = rate_map(cs, conditions=SEMI.with_(hbar_omega_cm1=1800.0))
    assert over.semiclassical["couples_with_own_hbar_omega"] == 0
    i, j = m.ids.index("hl-md-ox"), m.ids.index("hl-md-red")
    assert over.log10_k_obs[i, j] == pytest.approx(
        predict(cs, "hl-md-ox", "hl-md-red", SEMI.with_(hbar_omega_cm1=1800.0), samples=0).log10_k_obs, abs=atol)
    assert abs(over.log10_k_obs[i, j] - m.log10_k_obs[i, j]) > 0.1  # the override matters


@pytest.mark.parametrize("value, expected", [
    ("50", "got 50 cm^-1; expected a finite number from 100 to 5000 cm^-1"),
    ("-1500", "got -1500 cm^-1; expected a finite number from 100 to 5000 cm^-1"),
    ("nan", "got nan, not a finite number; expected a finite number from 100 to 5000 cm^-1"),
    ('"1500"', 'got text "1500"; expected a finite number from 100 to 5000 cm^-1'),
])
def test_bad_mode_is_one_clear_line(tmp_path, capsys, value, expected):
    path = tmp_path / "bad.toml"
    path.write_text(HEAD + _couple("hl-md-bad", 0.1, f"hbar_omega = {value}\n"), encoding="utf-8")
    assert main(["library", "validate", str(path)]) == 2
    err = capsys.readouterr().err
    line = 1 + (HEAD + _couple("hl-md-bad", 0.1)).count("\n")  # the hbar_omega line follows the couple's fields
    assert f"{path}:{line}: couple hl-md-bad: field hbar_omega: {expected}" in err
    assert "Traceback" not in err


def test_export_import_round_trip_and_json(lib, tmp_path, capsys):
    couples = read_library_file(lib).couples
    table = tmp_path / "c.csv"
    table.write_text(records_csv([couple_record(c) for c in couples]), encoding="utf-8", newline="")
    assert "hbar_omega" in table.read_text(encoding="utf-8").splitlines()[0].split(",")
    back = tmp_path / "back.toml"
    import_couples_csv(table, back)
    again = {c.id: c for c in read_library_file(back).couples}
    assert again["hl-md-ox"].hbar_omega == 1000.0 and again["hl-md-plain"].hbar_omega is None
    assert [c.hbar_omega for c in couples] == [again[c.id].hbar_omega for c in couples]
    assert main(["library", "export", "--file", str(lib), "--format", "json"]) == 0
    recs = {r["id"]: r for r in json.loads(capsys.readouterr().out)}
    assert recs["hl-md-red"]["hbar_omega"] == 2200.0 and recs["hl-md-plain"]["hbar_omega"] is None


def test_detail_panel_shows_the_mode(cs):
    from rich.console import Console

    from crossrate.tui.widgets.couple_detail import detail_text

    console = Console(width=80, record=True)
    console.print(detail_text(cs, cs["hl-md-ox"]))
    text = console.export_text()
    assert "hbar_omega" in text and "1000.0 cm^-1" in text
    assert np.isfinite(cs["hl-md-ox"].hbar_omega)
