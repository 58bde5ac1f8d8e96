"""Every bad input exits 2 with one clear line on stderr and no traceback; nothing the user had is touched."""

import pytest

# (argv, text the one stderr line must contain)
CROSSRATE_ERRORS = [
    (["predict", "hl-iron-aa", "hl-ru-b"], "unknown couple 'hl-iron-aa'; did you mean hl-iron-a"),
    (["predict", "hl-iron-a", "hl-mecn-h"], "couples measured in different media"),
    (["predict", "hl-mecn-h", "hl-mecn-i"], "scales that cannot be related"),
    (["predict", "hl-iron-a", "hl-nodata-f"], "hl-nodata-f has no k_self"),
    (["predict", "hl-iron-a", "hl-iron-g"], "different ionic strengths"),
    (["predict", "hl-iron-a", "hl-ru-b", "--temperature", "1000"], "temperature 1000.0 K: expected"),
    (["predict", "hl-iron-a", "hl-ru-b", "--ionic-strength", "9"], "ionic strength 9.0 M: expected"),
    (["predict", "hl-iron-a", "hl-ru-b", "--medium", "benzene"], "unknown medium 'benzene'"),
    (["screen", "hl-iron-b", "--role", "oxidant"], "unknown couple 'hl-iron-b'"),
    (["screen", "hl-nodata-f", "--role", "reductant"], "hl-nodata-f has no k_self"),
    (["map", "--medium", "benzene"], "unknown medium 'benzene'"),
]

# Errors found while reading the options: exit 2, one line naming the option and what was expected.
ARGPARSE_ERRORS = [
    (["predict", "hl-iron-a", "hl-ru-b", "--temperature", "nan"], "--temperature: 'nan': expected a finite number"),
    (["predict", "hl-iron-a", "hl-ru-b", "--temperature", "hot"], "'hot' is not a number"),
    (["predict", "hl-iron-a", "hl-ru-b", "--Z", "-1"], "--Z: '-1': expected a number greater than 0"),
    (["predict", "hl-iron-a", "hl-ru-b", "--Z", "inf"], "--Z: 'inf': expected a finite number"),
    (["predict", "hl-iron-a", "hl-ru-b", "--samples", "-5"], "--samples: '-5': expected 0 or more"),
    (["predict", "hl-iron-a", "hl-ru-b", "--format", "xml"], "invalid choice: 'xml'"),
    (["predict", "hl-iron-a"], "the following arguments are required: REDUCTANT"),
    (["screen", "hl-iron-a"], "the following arguments are required: --role"),
    (["screen", "hl-iron-a", "--role", "oxidant", "--top", "0"], "--top: '0': expected 1 or more"),
    (["screen", "hl-iron-a", "--role", "oxidant", "--min-k", "-3"], "--min-k: '-3': expected a number greater than 0"),
    (["map", "--format", "table"], "invalid choice: 'table'"),
]


@pytest.mark.parametrize("argv, message", CROSSRATE_ERRORS, ids=[" ".join(a) for a, _ in CROSSRATE_ERRORS])
def test_crossrate_errors_exit_2_with_one_line(run_cli, argv, message):
    rc, out, err = run_cli(*argv)
    assert rc == 2
    assert out == ""
    assert "Traceback" not in err
    lines = err.strip().splitlines()
    assert len(lines) == 1, err
    assert lines[0].startswith("crossrate: ")
    assert message in lines[0]


@pytest.mark.parametrize("argv, message", ARGPARSE_ERRORS, ids=[" ".join(a) for a, _ in ARGPARSE_ERRORS])
def test_argparse_errors_exit_2(run_cli, argv, message):
    rc, out, err = run_cli(*argv)
    assert rc == 2
    assert out == ""
    assert "Traceback" not in err
    lines = err.strip().splitlines()
    assert len(lines) == 1, err  # one line, not argparse's usage block
    assert message in lines[0] and "--help" in lines[0]


def test_missing_library_file(run_cli, tmp_path):
    rc, out, err = run_cli("predict", "hl-iron-a", "hl-ru-b", "--library", str(tmp_path / "nope.toml"))
    assert rc == 2 and out == ""
    assert "nope.toml" in err and "Traceback" not in err


def test_map_out_refuses_to_overwrite(run_cli, tmp_path):
    target = tmp_path / "mine.csv"
    target.write_text("precious data\n", encoding="utf-8")
    rc, out, err = run_cli("map", "--out", str(target))
    assert rc == 2
    assert "file exists" in err and "--force" in err
    assert target.read_text(encoding="utf-8") == "precious data\n"
    assert [p.name for p in tmp_path.iterdir() if p.name.startswith(".crossrate-")] == []


def test_debug_shows_the_traceback(run_cli):
    from crossrate.errors import UnknownCoupleError

    with pytest.raises(UnknownCoupleError):
        run_cli("--debug", "predict", "hl-iron-aa", "hl-ru-b")
