"""CSV outputs never hand a spreadsheet a formula: a text cell beginning with = + - @ (or tab, CR) gets a
leading apostrophe (common practice against CSV formula injection), while numbers such as -0.25 stay numbers."""

import csv
import io

from crossrate.library.spreadsheet_cells import spreadsheet_safe

LIB = """\
[library]
format = 1
medium = "water"
temperature = 298.15
E_scale = "SHE"

[couple.-evil]
name = "=HYPERLINK(\\"http://example.invalid\\",\\"x\\")"
charge_ox = 3
charge_red = 2
E = -0.25
k_self = 1.0e3
radius = 3.5
ionic_strength = 0.1
source = "@SUM(1+1)"
notes = "+1 the group's note"
tags = ["-tag", "\\tlead"]

[couple.plain]
name = "plain 3+/2+"
charge_ox = 3
charge_red = 2
E = 0.4
k_self = 10
radius = 3.5
ionic_strength = 0.1
source = "invented"
"""


def test_spreadsheet_safe_rule():
    for text in ("=1+2", "+cmd", "-x", "@SUM(A1)", "\tx", "\rx", "-", "+"):
        assert spreadsheet_safe(text) == "'" + text
    for text in ("-0.25", "+1e3", "-1.5e-07", "0.4", "plain", "", "a=b", " =1"):
        assert spreadsheet_safe(text) == text
    assert spreadsheet_safe(-0.25) == -0.25 and spreadsheet_safe(None) is None


def _rows(text):
    return list(csv.DictReader(io.StringIO(text)))


def test_library_export_csv_neutralises_text_cells(run_cli, tmp_path):
    lib = tmp_path / "lib.toml"
    lib.write_text(LIB, encoding="utf-8")
    rc, out, err = run_cli("library", "export", "--format", "csv", "--no-bundled", "--library", str(lib),
                           library=False)
    assert rc == 0, err
    rows = {r["name"]: r for r in _rows(out)}
    evil = rows["'=HYPERLINK(\"http://example.invalid\",\"x\")"]
    assert evil["id"] == "'-evil" and evil["source"] == "'@SUM(1+1)" and evil["notes"] == "'+1 the group's note"
    assert evil["E"] == "-0.25"  # a number stays a number
    assert rows["plain 3+/2+"]["id"] == "plain"


def test_map_and_check_csv_neutralise_ids_and_labels(run_cli, tmp_path):
    lib = tmp_path / "lib.toml"
    lib.write_text(LIB, encoding="utf-8")
    rc, out, err = run_cli("map", "--format", "csv", "--no-bundled", "--library", str(lib), library=False)
    assert rc == 0, err
    lines = out.splitlines()
    assert lines[0].startswith("oxidant\\reductant,'-evil,plain,")
    assert lines[1].startswith("'-evil,")
    measured = tmp_path / "measured.csv"
    measured.write_text("oxidant,reductant,k_measured,label\n-evil,plain,1e3,=cmd|' /C calc'!A0\n", encoding="utf-8")
    rc, out, err = run_cli("check", str(measured), "--format", "csv", "--no-bundled", "--library", str(lib),
                           library=False)
    assert rc == 0, err
    row = _rows(out)[0]
    assert row["label"] == "'=cmd|' /C calc'!A0" and row["oxidant"] == "'-evil"
    assert float(row["log10_ratio"]) == float(row["log10_ratio"])  # a plain signed number, kept
