"""Only the named subcommand's module is imported to parse a command line (a faster cold start); the root
options before the command, help and unknown commands still work as with the full parser."""

import sys
from pathlib import Path

import pytest

from crossrate.cli.main import COMMAND_MODULES, _command_of, build_parser

TEST_LIBRARY = Path(__file__).resolve().parents[1] / "services" / "data" / "halden_screen_test.toml"


@pytest.mark.parametrize(("argv", "module"), [
    (["predict", "a", "b"], "predict_cmd"),
    (["--library", "predict", "screen", "x"], "screen_cmd"),  # a --library value is not the command
    (["--debug", "--library=x.toml", "library", "list"], "library_cmd"),
    (["--help"], None),
    ([], None),
    (["predicts", "a"], None),  # unknown: the full parser says which commands exist
])
def test_command_of(argv, module):
    assert _command_of(argv) == module


def test_one_command_parser_imports_only_its_module():
    for name in COMMAND_MODULES:
        sys.modules.pop(f"crossrate.cli.{name}", None)
    parser = build_parser("predict_cmd")
    args = parser.parse_args(["predict", "a", "b", "--seed", "3"])
    assert (args.oxidant, args.reductant, args.seed) == ("a", "b", 3)
    assert "crossrate.cli.screen_cmd" not in sys.modules


def test_root_library_option_before_the_command(run_cli):
    rc, out, err = run_cli("--library", str(TEST_LIBRARY), "library", "list", "--no-bundled", library=False)
    assert rc == 0, err
    assert "hl-" in out


def test_unknown_command_lists_the_known_ones(run_cli):
    rc, out, err = run_cli("predicts", "a", "b", library=False)
    assert rc == 2
    assert "predict" in err and "screen" in err and "library" in err


def _cold_predict_modules(tmp_path) -> set[str]:
    """Modules a fresh `crossrate predict` process has imported when it ends (its own cache folder)."""
    import json
    import os
    import subprocess

    root = Path(__file__).resolve().parents[2]
    code = (
        "import contextlib, io, json, sys\n"
        "from crossrate.cli.main import main\n"
        "with contextlib.redirect_stdout(io.StringIO()):\n"
        f"    rc = main(['predict', 'hl-iron-a', 'hl-ru-b', '--no-bundled', '--library', {str(TEST_LIBRARY)!r}])\n"
        "print(json.dumps([rc, sorted(sys.modules)]))\n"
    )
    env = dict(os.environ, PYTHONPATH=str(root), XDG_CONFIG_HOME=str(tmp_path), XDG_CACHE_HOME=str(tmp_path / "c"))
    env.pop("CROSSRATE_NO_CACHE", None)
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, env=env, cwd=tmp_path,
                         timeout=120, check=True)
    rc, modules = json.loads(out.stdout)
    assert rc == 0
    return set(modules)


#: What a cold `crossrate predict` must not pay for (issue 12, speed), each with what it cost: scipy (about
#: 100 ms; the constants are written in the core), numpy.ma (np.percentile's import, 7 ms), numpy.polynomial
#: (the Gauss-Legendre rule is written out, 2 ms), shutil with bz2 and lzma (argparse's terminal width, 2 ms),
#: the other subcommands' modules and the faces' libraries.
NEVER_ON_PREDICT = (
    "scipy", "numpy.ma", "numpy.polynomial", "shutil", "bz2", "lzma", "textual", "rich",
    "crossrate.tui", "crossrate.figures", "matplotlib",
    *(f"crossrate.cli.{name}" for name in COMMAND_MODULES if name != "predict_cmd"),
)
#: What a repeat run needs no more once the library cache holds the file: the TOML parser, the validator and
#: its difflib (close-match hints; a mistyped couple id imports it when it happens), the safe writer.
NOT_ON_A_CACHE_HIT = ("tomli", "tomllib", "difflib", "crossrate.library.toml_reader", "crossrate.library.validation",
                      "crossrate.library.schema", "crossrate.library.safe_writer")


def test_cold_predict_imports_only_what_it_uses(tmp_path):
    first = _cold_predict_modules(tmp_path)  # fills the cache
    again = _cold_predict_modules(tmp_path)  # the repeat run: a cache hit
    assert "crossrate.services.prediction" in again and "numpy.random" in again  # the check sees the run
    for name in NEVER_ON_PREDICT:
        assert name not in first and name not in again, name
    assert "tomli" in first or "tomllib" in first  # the first run did parse the file
    for name in NOT_ON_A_CACHE_HIT:
        assert name not in again, name
