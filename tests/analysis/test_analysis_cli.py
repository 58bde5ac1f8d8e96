"""The check, solve and fit commands end to end: outputs, exit codes, figures and every bad input."""

import json
import math
import sys

import numpy as np
import pytest

from crossrate.cli.main import main
from crossrate.core.constants import KJ
from crossrate.core.driving_force_series import marcus_ln_k_act, series_ln_k_obs

LN10 = math.log(10.0)


@pytest.fixture()
def run(analysis_library, isolated_env, capsys):
    def _run(*argv):
        code = main([*argv, "--no-bundled", "--library", str(analysis_library)] if argv[0] != "fit" else list(argv))
        out, err = capsys.readouterr()
        return code, out, err

    return _run


def _measured(tmp_path, rows, name="measured.csv"):
    p = tmp_path / name
    p.write_text("# invented\noxidant,reductant,k_measured,k_measured_log10_sd\n"
                 + "".join(f"{o},{r},{k!r},0.05\n" for o, r, k in rows), encoding="utf-8")
    return p


def _series(tmp_path, dG_kJ, lam=100.0, log_A=11.0, log_kd=9.7, name="series.csv"):
    x = np.asarray(dG_kJ, dtype=float)
    y = series_ln_k_obs(marcus_ln_k_act(x * KJ, lam * KJ, log_A * LN10, 298.15), log_kd * LN10) / LN10
    p = tmp_path / name
    p.write_text("dG0_kJ_per_mol,k_obs,log10_sd\n" + "".join(f"{float(a)!r},{float(10.0**b)!r},0.1\n" for a, b in zip(x, y, strict=True)),
                 encoding="utf-8")
    return p


def test_check_formats_and_fail_over(run, tmp_path):
    path = _measured(tmp_path, [("hl-phen", "hl-amm", 2.0e9), ("hl-phen", "hl-aqua", 3.7e4)])
    code, out, err = run("check", str(path), "--samples", "2000", "--format", "json")
    assert code == 0, err
    d = json.loads(out)
    assert d["summary"]["n"] == 2
    assert [r["verdict"] for r in d["rows"]][1] == "beyond_10x"
    code, out, _ = run("check", str(path), "--samples", "2000", "--format", "csv")
    lines = out.strip().splitlines()
    assert lines[0].startswith("line,label,oxidant,reductant,k_measured") and len(lines) == 3
    code, out, _ = run("check", str(path), "--samples", "2000")
    assert code == 0 and "beyond 10x" in out and "summary: 2 rows" in out and "not a safety assessment" in out
    code, _, err = run("check", str(path), "--samples", "2000", "--fail-over", "10")
    assert code == 1 and "off by more than a factor of 10" in err and "line 4" in err
    code, _, _ = run("check", str(path), "--samples", "2000", "--fail-over", "1e4")
    assert code == 0


@pytest.mark.parametrize("suffix, magic", [(".svg", b"<?xml"), (".png", b"\x89PNG")])
def test_check_and_fit_figures(run, tmp_path, suffix, magic):
    path = _measured(tmp_path, [("hl-phen", "hl-amm", 2.0e9), ("hl-phen", "hl-aqua", 3.7e4)])
    fig = tmp_path / f"check{suffix}"
    code, _, err = run("check", str(path), "--samples", "500", "--plot", str(fig), "--format", "json")
    assert code == 0, err
    assert fig.read_bytes()[:5].startswith(magic)
    series = _series(tmp_path, list(np.linspace(20, -90, 8)) + [-170.0, -200.0, -230.0])
    fig2 = tmp_path / f"series{suffix}"
    code, _, err = run("fit", str(series), "--plot", str(fig2), "--format", "json")
    assert code == 0, err
    assert fig2.read_bytes()[:5].startswith(magic)


def test_bad_plot_name_is_refused_before_any_work(run, tmp_path):
    path = _measured(tmp_path, [("hl-phen", "hl-amm", 2.0e9)])
    code, _, err = run("check", str(path), "--plot", str(tmp_path / "figure.pdf"))
    assert code == 2 and "expected a file name ending in .svg or .png" in err
    code, _, err = run("check", str(path), "--plot", str(tmp_path / "no-such-folder" / "f.svg"))
    assert code == 2 and "does not exist" in err


def test_missing_matplotlib_message(monkeypatch):
    from crossrate.errors import CrossrateError
    from crossrate.figures.backend import pyplot

    monkeypatch.setitem(sys.modules, "matplotlib", None)  # import matplotlib now raises ImportError
    with pytest.raises(CrossrateError, match=r"pip install 'crossrate\[plot\]'"):
        pyplot()


def test_check_bad_inputs_exit_2(run, tmp_path):
    bad = tmp_path / "bad.csv"
    bad.write_text("oxidant,reductant,k_measured\nhl-phen,hl-aqua,lots\n", encoding="utf-8")
    code, out, err = run("check", str(bad))
    assert code == 2 and out == ""
    assert f"{bad}:2:3: field k_measured: got 'lots', expected a number" in err
    assert "Traceback" not in err
    unknown = _measured(tmp_path, [("hl-phne", "hl-aqua", 1e4)], "unknown.csv")
    code, _, err = run("check", str(unknown))
    assert code == 2 and "unknown.csv:3: field oxidant: unknown couple 'hl-phne'; did you mean hl-phen" in err
    code, _, err = run("check", str(tmp_path / "absent.csv"))
    assert code == 2 and "cannot be read" in err
    code, _, err = run("check", str(unknown), "--fail-over", "0.5")
    assert code == 2 and "greater than 1" in err


def test_solve_k_self_and_potential_json(run):
    code, out, err = run("solve", "k-self", "hl-aqua", "--partner", "hl-phen", "--k-measured", "1e6", "--format", "json")
    assert code == 0, err
    d = json.loads(out)
    assert {"log10_k_self", "k_self", "log10_k_self_95"} <= set(d)
    assert d["k_self"] == pytest.approx(10.0 ** d["log10_k_self"], rel=1e-12)
    code, out, err = run("solve", "potential", "hl-aqua", "--partner", "hl-phen", "--k-measured", "1e6",
                         "--format", "json")
    assert code == 0, err
    d = json.loads(out)
    assert isinstance(d["E_V"], list) and len(d["E_V"]) == 2 and d["E_scale"] == "SHE"
    code, out, _ = run("solve", "potential", "hl-aqua", "--partner", "hl-phen", "--k-measured", "1e6")
    assert "normal side" in out and "inverted side" in out


def test_solve_from_csv(run, tmp_path):
    p = tmp_path / "partners.csv"
    p.write_text("partner,k_measured\nhl-phen,1.1e7\nhl-bpy,3e8\n", encoding="utf-8")
    code, out, err = run("solve", "k-self", "hl-aqua", "--from-csv", str(p), "--format", "json")
    assert code == 0, err
    d = json.loads(out)
    assert d["n"] == 2 and {"log10_k_self", "k_self", "log10_k_self_95", "partners"} <= set(d)
    code, _, err = run("solve", "k-self", "hl-aqua", "--from-csv", str(p), "--partner", "hl-bpy")
    assert code == 2 and "not both" in err


def test_solve_bad_inputs_exit_2(run):
    code, _, err = run("solve", "k-self", "hl-aqa", "--partner", "hl-phen", "--k-measured", "1e4")
    assert code == 2 and "unknown couple 'hl-aqa'; did you mean hl-aqua" in err
    code, _, err = run("solve", "k-self", "hl-aqua", "--partner", "hl-phen", "--k-measured", "1e12")
    assert code == 2 and "at or above the diffusion limit" in err and "Traceback" not in err
    code, _, err = run("solve", "k-self", "hl-aqua", "--partner", "hl-phen")
    assert code == 2 and "--k-measured" in err
    with pytest.raises(SystemExit) as exc:  # argparse refuses a negative rate before the run
        run("solve", "k-self", "hl-aqua", "--partner", "hl-phen", "--k-measured", "-5")
    assert exc.value.code == 2


def test_fit_table_and_bad_series(run, tmp_path):
    series = _series(tmp_path, list(np.linspace(20, -90, 8)) + [-170.0, -200.0, -230.0])
    code, out, err = run("fit", str(series))
    assert code == 0, err
    assert "inverted region supported: Yes" in out and "lambda = 100.0" in out
    few = _series(tmp_path, [0.0, -30.0, -60.0], name="few.csv")
    code, _, err = run("fit", str(few))
    assert code == 2 and "too few to fit" in err
    flat = _series(tmp_path, np.linspace(-90.0, -120.0, 6), log_A=13.0, log_kd=9.5, name="flat.csv")
    code, _, err = run("fit", str(flat))
    assert code == 2 and "lambda cannot be determined" in err
    broken = tmp_path / "broken.csv"
    broken.write_text("dG0_eV,k_obs\n-0.5,1e5\n-0.7\n", encoding="utf-8")
    code, _, err = run("fit", str(broken))
    assert code == 2 and f"{broken}:3: 1 fields, expected 2" in err
    code, _, err = run("fit", str(series), "--interval", "bootstrap", "--bootstrap", "3")
    assert code == 2 and "expected 10 to 10000 refits" in err
