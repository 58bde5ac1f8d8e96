"""Text from a library file reaches the terminal escaped (a name with an escape sequence must not retitle
the window or move the cursor), in the plain and in the Rich forms; pipes keep the text as it is."""

import os
import select
import subprocess
import sys
from pathlib import Path

import pytest

from crossrate.errors import printable

ROOT = Path(__file__).resolve().parents[2]
# \u001b]0;...\u0007 sets the terminal title; \u001b[2J clears the screen; \u202e reverses the display order
HOSTILE_NAME = r"evil \u001b]0;owned\u0007 \u001b[2J x\u202ey"
LIB = f"""\
[library]
format = 1
medium = "water"
temperature = 298.15
E_scale = "SHE"

[couple.t-evil]
name = "{HOSTILE_NAME}"
charge_ox = 3
charge_red = 2
E = 0.5
k_self = 1.0e3
radius = 3.5
ionic_strength = 0.1
source = "invented \\u001b[31mred\\u001b[0m"
notes = "line one\\rline two"
"""


def _in_pty(args, env) -> bytes:
    """Run crossrate with stdout and stderr on a pseudo-terminal; everything it wrote."""
    master, slave = os.openpty()
    proc = subprocess.Popen([sys.executable, "-c", "import sys; from crossrate.cli.main import main; "
                             "sys.exit(main())", *args], stdout=slave, stderr=slave, stdin=subprocess.DEVNULL,
                            env=env)
    os.close(slave)
    out = b""
    while True:
        ready, _, _ = select.select([master], [], [], 30)
        if not ready:
            break
        try:
            chunk = os.read(master, 65536)
        except OSError:  # the child closed the terminal
            break
        if not chunk:
            break
        out += chunk
    proc.wait(timeout=30)
    os.close(master)
    return out


@pytest.fixture
def hostile_lib(tmp_path):
    p = tmp_path / "hostile.toml"
    p.write_text(LIB, encoding="utf-8")
    return p


def _env(tmp_path, colour: bool):
    env = {k: v for k, v in os.environ.items() if k not in ("NO_COLOR", "CROSSRATE_GROUP_LIBRARY",
                                                            "CROSSRATE_PERSONAL_LIBRARY")}
    env.update(PYTHONPATH=str(ROOT), HOME=str(tmp_path), XDG_CONFIG_HOME=str(tmp_path / "cfg"), COLUMNS="100",
               TERM="xterm-256color" if colour else "dumb")
    return env


@pytest.mark.parametrize("colour,command", [(False, ["library", "show", "t-evil"]), (True, ["library", "list"])],
                         ids=["plain-show", "rich-list"])
def test_library_text_is_escaped_on_a_terminal(tmp_path, hostile_lib, colour, command):
    out = _in_pty([*command, "--no-bundled", "--library", str(hostile_lib)], _env(tmp_path, colour))
    text = out.decode("utf-8", "replace")
    assert "evil" in text, text
    assert b"\x1b]" not in out and b"\x07" not in out and b"\x1b[2J" not in out and "\u202e" not in text
    # (Rich drops the bell itself before the text is escaped)
    assert "\\x1b]0;owned" in text and "\\u202e" in text
    if command[1] == "show":
        assert "\\x1b[31mred" in text and b"\x1b[31m" not in out
    if colour:
        assert b"\x1b[" in out  # Rich's own styling still reaches the terminal


def test_messages_are_escaped_on_a_terminal(tmp_path):
    bad = tmp_path / "bad.toml"
    bad.write_text('[library]\nformat = 1\n[couple.x]\nname = 5\n"\\u001b]0;t\\u0007" = 1\n', encoding="utf-8")
    out = _in_pty(["library", "validate", str(bad)], _env(tmp_path, False))
    assert b"\x1b]" not in out and b"\x07" not in out
    assert "field \\x1b]0;t\\x07: unknown field" in out.decode()


def test_a_pipe_gets_the_text_as_it_is(run_cli_plain):
    # JSON output escapes control characters itself; a pipe is never rewritten by crossrate
    rc, out, _ = run_cli_plain
    assert rc == 0 and "\\u001b]0;owned\\u0007" in out


@pytest.fixture
def run_cli_plain(isolated_env, hostile_lib, capsys):
    from crossrate.cli.main import main

    rc = main(["library", "show", "t-evil", "--format", "json", "--no-bundled", "--library", str(hostile_lib)])
    out, err = capsys.readouterr()
    return rc, out, err


def test_printable():
    assert printable("a\x1b[1mb\x9bc\x7f") == "a\\x1b[1mb\\x9bc\\x7f"
    assert printable("one\ntwo\tthree") == "one\ntwo\tthree"
    assert printable("one\ntwo", keep_newlines=False) == "one\\x0atwo"
    assert printable("ΔG°' λ Å") == "ΔG°' λ Å"  # ordinary non-ASCII text is kept
