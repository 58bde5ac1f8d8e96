"""`crossrate lambda`: table and JSON output, and clear errors with exit code 2."""

import json

import pytest

from crossrate.cli import common_options
from crossrate.cli.main import main


@pytest.fixture
def with_set(monkeypatch, lambda_set):
    monkeypatch.setattr(common_options, "load_set", lambda args: lambda_set)
    return lambda_set


def test_structure_json(capsys):
    rc = main(["lambda", "--radius", "3.5", "--medium", "water", "--bonds", "6:0.14:250:160", "--charges", "3:2",
               "--ionic-strength", "0.1", "--format", "json"])
    assert rc == 0
    out = json.loads(capsys.readouterr().out)
    # 138.186 + 109.250 kJ/mol (hand values in test_lambda_self_exchange).
    assert out["lambda_estimate_kJ_per_mol"] == pytest.approx(247.436, abs=2e-3)
    assert out["lambda_in_kJ_per_mol"] == pytest.approx(138.186, abs=1e-3)
    assert out["charge_ox"] == 3 and out["medium"] == "water"


def test_structure_table(capsys):
    assert main(["lambda", "--radius", "3.5", "--medium", "acetonitrile"]) == 0
    out = capsys.readouterr().out
    assert "lambda_out only" in out and "Pekar" in out and "not a safety assessment" in out
    assert "Used by predictions" not in out


def test_library_couple_table_and_json(with_set, capsys):
    assert main(["lambda", "meas_w"]) == 0
    out = capsys.readouterr().out
    for part in ("meas_w", "k_self measured", "the measurement implies", "k_self implied", "Used by predictions"):
        assert part in out
    assert main(["lambda", "est_lin", "--medium", "acetonitrile", "--format", "json"]) == 0
    d = json.loads(capsys.readouterr().out)
    assert d["medium"] == "acetonitrile" and d["lambda_in_kJ_per_mol"] == 40.0


@pytest.mark.parametrize(
    "argv, fragment",
    [
        (["lambda"], "give a couple ID"),
        (["lambda", "--radius", "3.5"], "needs --medium"),
        (["lambda", "--radius", "3.5", "--medium", "benzene"], "unknown medium"),
        (["lambda", "--radius", "3.5", "--medium", "water", "--bonds", "6:0.1:200:200", "--lambda-in", "20"],
         "not both"),
    ],
)
def test_errors_exit_2_with_one_message(argv, fragment, capsys):
    assert main(argv) == 2
    err = capsys.readouterr().err
    assert err.startswith("crossrate: ") and fragment in err and "Traceback" not in err


def test_id_and_structure_together_is_refused(with_set, capsys):
    assert main(["lambda", "meas_w", "--radius", "3.0"]) == 2
    assert "not both" in capsys.readouterr().err


def test_unknown_couple_suggests(with_set, capsys):
    assert main(["lambda", "meas_ww"]) == 2
    assert "meas_w" in capsys.readouterr().err


@pytest.mark.parametrize("spec", ["6:0.14:250", "x:0.1:1:1", "6:0.1:0:100", "0:0.1:100:100"])
def test_bad_bond_spec_is_an_argparse_error(spec, capsys):
    with pytest.raises(SystemExit) as exc:
        main(["lambda", "--radius", "3.5", "--medium", "water", "--bonds", spec])
    assert exc.value.code == 2
    err = capsys.readouterr().err
    assert "--bonds" in err and "Traceback" not in err


def test_bad_charges_are_refused(capsys):
    with pytest.raises(SystemExit) as exc:
        main(["lambda", "--radius", "3.5", "--medium", "water", "--charges", "3:1"])
    assert exc.value.code == 2 and "z_ox - z_red = 1" in capsys.readouterr().err


def test_bundled_starter_couple_through_the_real_loader(monkeypatch, tmp_path, capsys):
    # No group or personal layer from the machine running the tests.
    monkeypatch.delenv("CROSSRATE_GROUP_LIBRARY", raising=False)
    monkeypatch.delenv("CROSSRATE_PERSONAL_LIBRARY", raising=False)
    monkeypatch.setenv("XDG_CONFIG_HOME", str(tmp_path))
    from pathlib import Path

    starter = Path(__file__).resolve().parents[2] / "libraries" / "starter.toml"
    if not starter.exists():
        pytest.skip("libraries/starter.toml not written yet")
    assert main(["lambda", "fe-aq", "--no-bundled", "--library", str(starter), "--format", "json"]) == 0
    d = json.loads(capsys.readouterr().out)
    # fe-aq bonds (6, 0.14 A, 255 and 161 N/m): 12 * 255*161/416 N/m * (0.14e-10 m)^2 * N_A
    # = 12 * 98.690 * 1.96e-22 * 6.02214e23 = 139.79 kJ/mol.
    assert d["lambda_in_kJ_per_mol"] == pytest.approx(139.79, abs=0.01)
    assert d["log10_k_self_measured"] == pytest.approx(0.6232, abs=1e-4)  # log10 4.2


def test_rich_form_shows_the_same_rows(lambda_set):
    import io

    from crossrate.cli.render_lambda import _rich_lambda, lambda_sections, plain_lambda
    from crossrate.services.lambda_estimate import lambda_breakdown

    b = lambda_breakdown(lambda_set, "meas_w")
    buf = io.StringIO()
    _rich_lambda(b, buf)
    rich_text = buf.getvalue()
    plain = plain_lambda(b, {"lambda": "lambda", "pm": "+/-", "dG0": "", "dG0p": "", "dGact": "", "to": "-"})
    for _title, rows in lambda_sections(b, {"lambda": "lambda", "pm": "+/-"}):
        for _label, value, _unit, _note in rows:
            assert value in plain and value in rich_text
