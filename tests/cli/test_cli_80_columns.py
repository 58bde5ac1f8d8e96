"""The plain (piped / NO_COLOR) forms and every --help fit an 80-column terminal without cutting anything,
and the help of each command that prints predictions carries the caution."""

from pathlib import Path

import pytest

from crossrate.cli.main import build_parser

#: The invented test library the CLI fixtures load (see tests/cli/conftest.py).
TEST_LIBRARY = Path(__file__).resolve().parents[1] / "services" / "data" / "halden_screen_test.toml"

EXAMPLES = "libraries/examples"
CAUTION_WORDS = ("Predictions are estimates, not a safety assessment; follow your lab's safety rules and local "
                 "regulations when handling strong oxidants and reductants.")


def _widest(text: str) -> int:
    return max(len(line) for line in text.splitlines())


@pytest.fixture
def width80(isolated_env, monkeypatch):
    monkeypatch.setenv("COLUMNS", "80")


@pytest.mark.parametrize("argv", [
    ["predict", "hl-iron-a", "hl-ru-b", "--samples", "500"],
    ["predict", "hl-quinone-e", "hl-co-c", "--temperature", "310", "--samples", "500"],
    ["screen", "hl-iron-a", "--role", "oxidant"],
    ["lambda", "hl-quinone-e"],
])
def test_prediction_forms_fit_80_columns(run_cli, width80, argv):
    rc, out, err = run_cli(*argv)
    assert rc == 0, err
    assert _widest(out) <= 80, out


@pytest.mark.parametrize("argv", [
    ["check", f"{EXAMPLES}/measured_demo.csv", "--samples", "500"],
    ["fit", f"{EXAMPLES}/series_demo.csv"],
    ["solve", "k-self", "hl-med1", "--partner", "hl-ru-amine", "--k-measured", "5e6"],
    ["solve", "potential", "hl-med1", "--partner", "hl-ru-amine", "--k-measured", "5e6"],
    ["solve", "k-self", "hl-med1", "--from-csv", f"{EXAMPLES}/partners_demo.csv"],
])
def test_analysis_forms_fit_80_columns_and_keep_ids_whole(run_cli, width80, argv, monkeypatch):
    from pathlib import Path

    monkeypatch.chdir(Path(__file__).resolve().parents[2])
    demo = [] if argv[0] == "fit" else ["--demo"]  # fit reads no library
    rc, out, err = run_cli(*argv, *demo, library=False)
    assert rc == 0, err
    assert _widest(out) <= 80, out
    assert "…" not in out  # no id or value cut short
    if argv[0] == "check":
        assert "hl-phenothiazine" in out and "hl-ru-amine" in out


def test_library_list_at_80_columns_shows_full_names_and_every_column(run_cli, width80):
    rc, out, err = run_cli("library", "list")
    assert rc == 0, err
    assert _widest(out) <= 80, out
    header = out.splitlines()[0].split()
    assert header == ["id", "E", "scale", "k_self", "medium", "I", "layer"]  # the name goes on its own line
    lines = out.splitlines()
    k = next(i for i, line in enumerate(lines) if line.startswith("hl-co-c "))
    assert lines[k + 1].strip() == "Halden cobalt cage C (invented)"  # the test library's name, uncut
    assert lines[k].split()[-2:] == ["0.1", "cli"]  # ionic strength and layer both shown


def test_library_list_wide_enough_gives_one_line_per_couple(run_cli, isolated_env, monkeypatch):
    monkeypatch.setenv("COLUMNS", "200")
    rc, out, _ = run_cli("library", "list")
    assert rc == 0
    assert out.splitlines()[0].split()[:2] == ["id", "name"]
    row = next(line for line in out.splitlines() if line.startswith("hl-co-c "))
    assert "Halden cobalt cage C (invented)" in row


def _subparsers(parser):
    for action in parser._actions:
        if action.__class__.__name__ == "_SubParsersAction":
            for name, sub in action.choices.items():
                yield name, sub
                for subname, subsub in _subparsers(sub):
                    yield f"{name} {subname}", subsub


def _helps(monkeypatch):
    monkeypatch.setenv("COLUMNS", "80")
    parser = build_parser()
    yield "", parser.format_help()
    for name, sub in _subparsers(parser):
        yield name, sub.format_help()


def test_every_help_fits_80_columns(monkeypatch):
    for name, text in _helps(monkeypatch):
        assert _widest(text) <= 80, name


@pytest.mark.parametrize("command", ["", "predict", "screen", "map", "check", "solve", "solve k-self",
                                     "solve potential", "lambda"])
def test_help_of_commands_printing_predictions_has_the_caution(monkeypatch, command):
    helps = dict(_helps(monkeypatch))
    assert CAUTION_WORDS in " ".join(helps[command].split()), command


# Numeric options and the unit (or kind of number) their help must name.
UNITS = {
    "predict": {"--temperature": "K", "--ionic-strength": "mol/L", "--Z": "M^-1 s^-1", "--samples": "draws"},
    "screen": {"--min-k": "M^-1 s^-1", "--max-dG0": "kJ/mol", "--top": "partners"},
    "lambda": {"--radius": "angstrom", "--lambda-in": "kJ/mol", "--bonds": "N/m", "--Z": "M^-1 s^-1"},
    "fit": {"--temperature": "K", "--k-diff": "M^-1 s^-1", "--bootstrap": "refits"},
    "solve k-self": {"--k-measured": "M^-1 s^-1", "--k-measured-log10-sd": "log10"},
    "check": {"--fail-over": "factor", "--samples": "draws"},
}


def _option_help(text: str, option: str) -> str:
    """The help of one option (its line in the options list and the continuation lines), joined."""
    lines = text.splitlines()
    start = next(i for i, line in enumerate(lines) if line.lstrip().startswith(option + " "))
    out = [lines[start]]
    for line in lines[start + 1:]:
        if not line.startswith(" " * 10) or line.lstrip().startswith("-"):
            break
        out.append(line)
    return " ".join(" ".join(out).split())


@pytest.mark.parametrize("command", sorted(UNITS))
def test_numeric_options_name_their_unit(monkeypatch, command):
    text = dict(_helps(monkeypatch))[command]
    for option, unit in UNITS[command].items():
        assert unit in _option_help(text, option), (command, option, _option_help(text, option))


def test_library_file_exists_for_the_fixtures():
    assert TEST_LIBRARY.exists()
