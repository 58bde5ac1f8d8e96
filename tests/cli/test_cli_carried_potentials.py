"""Carried formal potentials on the command line: predict table and JSON, the refusal for another medium, the
notes of screen and map, and the named second root of `solve k-self`."""

import json

import pytest

LIBRARY = """\
[library]
format = 1
medium = "water"
temperature = 298.15
E_scale = "SHE"

[couple.tri]
name = "invented 3+/2+"
charge_ox = 3
charge_red = 2
E = 0.40
radius = 6.0
ionic_strength = 0.0
k_self = 1e3
source = "invented for a test"

[couple.ani]
name = "invented 3-/4-"
charge_ox = -3
charge_red = -4
E = 0.20
radius = 6.0
ionic_strength = 0.0
E_ionic_strength = 0.0
dE_dT = -0.5
k_self = 1e4
source = "invented for a test"

[couple.mecn]
name = "invented in acetonitrile"
charge_ox = 1
charge_red = 0
E = 0.30
radius = 4.0
medium = "acetonitrile"
ionic_strength = 0.0
k_self = 1e6
source = "invented for a test"

[couple.fast]
name = "invented fast couple"
charge_ox = 1
charge_red = 0
E = -0.70
radius = 4.0
ionic_strength = 0.1
k_self = 1e10
source = "invented for a test"

[couple.slow]
name = "invented partner"
charge_ox = 1
charge_red = 0
E = 0.0
radius = 4.0
ionic_strength = 0.1
k_self = 1e8
source = "invented for a test"
"""


@pytest.fixture
def lib(tmp_path):
    path = tmp_path / "carried.toml"
    path.write_text(LIBRARY, encoding="utf-8")
    return ["--no-bundled", "--library", str(path)]


def test_predict_table_and_json_show_E_as_given_and_used(run_cli, lib):
    rc, out, _ = run_cli("predict", "tri", "ani", "--ionic-strength", "0.1", "--temperature", "310",
                         "--samples", "0", *lib, library=False)
    assert rc == 0
    assert "Formal potentials" in out and "E1 as given" in out and "E2 at these conditions" in out
    assert "extended" in out and "Debye-Hueckel" in out and "no dE_dT given" in out
    rc, out, _ = run_cli("predict", "tri", "ani", "--ionic-strength", "0.1", "--temperature", "310",
                         "--samples", "0", "--format", "json", *lib, library=False)
    d = json.loads(out)
    tri, ani = d["potentials"]
    # ani: dE_dT -0.5 mV/K over 11.85 K = -5.925 mV; tri has none, so E is held there.
    assert ani["temperature_correction_V"] == pytest.approx(-0.5e-3 * 11.85, abs=1e-12)
    assert tri["temperature_correction_V"] == 0.0 and tri["ionic_correction_V"] < -0.02
    assert any(w.startswith("tri: E measured at 298.15 K, used at 310 K") for w in d["warnings"])


def test_activity_model_option_reaches_every_command(run_cli, lib):
    # The Davies basis is named in predict's JSON and changes the carried E; map and solve take the option too.
    base = ("predict", "tri", "ani", "--ionic-strength", "0.3", "--samples", "0", "--format", "json")
    dh = json.loads(run_cli(*base, *lib, library=False)[1])
    rc, out, _ = run_cli(*base, "--activity-model", "davies", *lib, library=False)
    dv = json.loads(out)
    assert rc == 0 and dv["potentials"][0]["basis"].startswith("I 0 -> 0.3 M: Davies (")
    assert dh["potentials"][0]["basis"].startswith("I 0 -> 0.3 M: extended Debye-Hueckel, a = 6 A")
    assert dv["log10_k_obs"] != dh["log10_k_obs"]
    maps = [run_cli("map", "--medium", "water", "--ionic-strength", "0.3", *extra, "--format", "json", *lib,
                    library=False) for extra in ((), ("--activity-model", "davies"))]
    assert [m[0] for m in maps] == [0, 0] and maps[0][1] != maps[1][1]
    rc, out, err = run_cli(*base, "--activity-model", "guntelberg", *lib, library=False)
    assert rc == 2 and "invalid choice: 'guntelberg'" in err and "Traceback" not in err


def test_other_medium_refused_in_one_line_then_allowed(run_cli, lib):
    args = ("predict", "tri", "mecn", "--medium", "water", "--allow-mixed-media", "--samples", "0")
    rc, out, err = run_cli(*args, *lib, library=False)
    assert rc == 2 and out == ""
    assert err.count("\n") == 1 and "mecn: E was measured in acetonitrile" in err and "Traceback" not in err
    rc, out, _ = run_cli(*args, "--allow-E-other-medium", *lib, library=False)
    flat = " ".join(out.split())  # the table wraps long notes
    assert rc == 0 and "mecn: E was not carried" in flat and "not carried: E measured in acetonitrile" in flat


def test_screen_and_map_say_when_E_was_not_carried(run_cli, lib):
    # Without --medium the pair's medium is the oxidant's (water for tri): mecn's E would come from acetonitrile.
    base = ("--allow-mixed-media", "--ionic-strength", "0.1", *lib)
    rc, out, _ = run_cli("screen", "tri", "--role", "oxidant", *base, library=False)
    flat = " ".join(out.split())  # the count line wraps at 80 columns
    assert rc == 0 and "another medium" in flat and "E was not carried" not in flat
    rc, out, _ = run_cli("screen", "tri", "--role", "oxidant", "--allow-E-other-medium", *base, library=False)
    assert rc == 0 and "E was not carried for mecn" in " ".join(out.split())
    rc, out, _ = run_cli("screen", "tri", "--role", "oxidant", "--allow-E-other-medium", "--format", "json", *base,
                         library=False)
    assert json.loads(out)["E_not_carried"] == ["mecn"]
    base = ("--medium", "water", *base)
    rc, out, err = run_cli("map", "--allow-E-other-medium", *base, library=False)
    assert rc == 0 and "E was not carried for mecn" in err
    rc, out, err = run_cli("map", "--allow-E-other-medium", "--format", "json", *base, library=False)
    assert json.loads(out)["E_not_carried"] == ["mecn"]


def test_solve_k_self_names_the_reverse_inverted_root(run_cli, lib):
    # fast (E -0.70 V) as the oxidant of slow (0 V): uphill by 0.7 eV, lambda12 ~ 46 kJ/mol < 67.5 kJ/mol
    # (lambda_ii = 4 RT ln(Z/k_ii); see tests/analysis/test_analysis_solve.py): the second root is where the
    # reverse reaction is inverted.
    rc, out, _ = run_cli("predict", "fast", "slow", "--no-diffusion", "--samples", "0", "--format", "json", *lib,
                         library=False)
    k = 10.0 ** json.loads(out)["log10_k_obs"]
    rc, out, _ = run_cli("solve", "k-self", "fast", "--partner", "slow", "--k-measured", f"{k:.6e}", "--role",
                         "oxidant", "--no-diffusion", *lib, library=False)
    assert rc == 0
    assert "second root: log10 k_self 10.000, in the reverse reaction's inverted region" in out
