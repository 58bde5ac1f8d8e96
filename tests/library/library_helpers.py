"""Helpers shared by the library tests (a uniquely named module, so tests can import it)."""

import textwrap

#: A valid library file of three invented couples (values invented for the tests, not measurements).
BASE = textwrap.dedent(
    """\
    # Test library: invented values.
    [library]
    title = "test library"
    format = 1
    medium = "water"
    temperature = 298.15
    E_scale = "SHE"

    [library.scales.Fc-MeCN]
    name = "ferrocenium/ferrocene in acetonitrile"
    relative_to = "SHE"
    offset_V = 0.63
    source = "common practice, from memory"

    # --- aqueous ---
    [couple.t-one]
    name = "test one 3+/2+"
    charge_ox = 3
    charge_red = 2
    E = 0.50
    k_self = 1.0e3  # invented
    radius = 3.5
    ionic_strength = 0.1
    source = "invented for the tests"
    tags = ["aqua"]
    verified = true

    [couple.t-two]
    name = "test two 2+/1+"
    # a comment line inside the table
    charge_ox = 2
    charge_red = 1
    E = -0.20
    k_self = 5.0e6
    radius = 4.0
    ionic_strength = 0.1
    source = "invented for the tests"
    verified = false

    # --- acetonitrile ---
    [couple.t-three]
    name = "test three 1+/0"
    charge_ox = 1
    charge_red = 0
    E = 0.10
    E_scale = "Fc-MeCN"
    k_self = 2.0e7
    radius = 4.5
    medium = "acetonitrile"
    ionic_strength = 0.1
    source = "invented for the tests"
    verified = true
    """
)


def line_of(text: str, needle: str, start_after: str | None = None) -> int:
    """1-based line of the first line containing needle (after the line containing start_after)."""
    lines = text.split("\n")
    begin = 0
    if start_after is not None:
        begin = next(i for i, ln in enumerate(lines) if start_after in ln) + 1
    return next(i for i in range(begin, len(lines)) if needle in lines[i]) + 1
