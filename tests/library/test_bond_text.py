"""The typed form of bond sets is the same on the command line and in the workbench's couple form."""

import argparse

import pytest

from crossrate.cli.lambda_cmd import bond_spec
from crossrate.library.bond_text import bonds_text, parse_bond_item, parse_bonds_text
from crossrate.library.couple import BondSet
from crossrate.library.schema import parse_field_text


def test_one_and_several_sets():
    assert parse_bonds_text("6:0.13:230:160") == [{"count": 6, "delta_d": 0.13, "f_ox": 230.0, "f_red": 160.0}]
    two = parse_bonds_text("6:0.13:230:160; 2:-0.05:300.5:280")
    assert [b["count"] for b in two] == [6, 2] and two[1]["delta_d"] == -0.05 and two[1]["f_ox"] == 300.5
    assert parse_bonds_text("  ") == []


def test_written_form_reads_back():
    sets = [BondSet(6, 0.13, 230.0, 160.0), BondSet(2, -0.05, 300.5, 280.0)]
    text = bonds_text(sets)
    assert text == "6:0.13:230:160; 2:-0.05:300.5:280"
    assert [BondSet(**b) for b in parse_bonds_text(text)] == sets


def test_command_line_and_form_take_the_same_text():
    text = "6:0.13:230:160"
    assert bond_spec(text) == BondSet(**parse_field_text("bonds", text)[0])


def test_the_file_form_is_read_too():
    # a CSV export writes the file's inline tables; reading it back gives the same sets
    assert parse_field_text("bonds", "[{count = 6, delta_d = 0.13, f_ox = 230.0, f_red = 160.0}]") == \
        parse_field_text("bonds", "6:0.13:230:160")


@pytest.mark.parametrize("bad", ["6:0.14:250", "x:0.1:1:1", "6;0.1;2;3", "count=6"])
def test_bad_text_says_what_is_expected(bad):
    with pytest.raises(ValueError, match="expected COUNT:DELTA_D:F_OX:F_RED"):
        parse_bonds_text(bad)
    with pytest.raises(ValueError, match="expected COUNT:DELTA_D:F_OX:F_RED"):
        parse_field_text("bonds", bad)
    if ";" not in bad:
        with pytest.raises(argparse.ArgumentTypeError, match="COUNT:DELTA_D:F_OX:F_RED"):
            bond_spec(bad)
    with pytest.raises(ValueError):
        parse_bond_item(bad.split(";")[0])
