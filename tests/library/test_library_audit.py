"""`crossrate library audit`: invented, unverified and estimated couples, DOI/date, and which couples the
predictions of a measured-rates check file use (counts checked against the test library's own fields)."""

import json

from library_helpers import BASE

from crossrate.cli.main import main
from crossrate.library.couple_set import CoupleSet
from crossrate.library.toml_reader import parse_library_text
from crossrate.services.library_audit import (
    K_SELF_FROM_LAMBDA_TOTAL,
    K_SELF_FROM_STRUCTURE,
    K_SELF_MEASURED,
    K_SELF_NONE,
    audit_library,
)
from crossrate.services.measured_csv import read_measured_csv

EXTRA = """
[couple.t-made-up]
name = "made up 2+/1+"
charge_ox = 2
charge_red = 1
E = 0.3
lambda_total = 120.0
radius = 4.0
ionic_strength = 0.1
source = "invented for the tests"
invented = true

[couple.t-bonds]
name = "bond data 3+/2+"
charge_ox = 3
charge_red = 2
E = 0.4
bonds = [{count = 6, delta_d = 0.1, f_ox = 200.0, f_red = 150.0}]
radius = 3.5
ionic_strength = 0.1
source = "invented for the tests"
doi = "10.1021/ja00000a002"
date = 2023-01-31
verified = true

[couple.t-bare]
name = "no rate data 1+/0"
charge_ox = 1
charge_red = 0
E = 0.0
radius = 4.0
ionic_strength = 0.1
source = "invented for the tests"
verified = true
"""


def _set(tmp_path):
    path = tmp_path / "lib.toml"
    path.write_text(BASE + EXTRA, encoding="utf-8")
    return path, CoupleSet(parse_library_text(BASE + EXTRA, str(path)).couples)


def _check_file(tmp_path):
    p = tmp_path / "measured.csv"
    p.write_text("# invented rates for the tests\noxidant,reductant,k_measured\n"
                 "t-one,t-two,1e5\nt-made-up,t-two,2e4\nt-bonds,t-three,3e3\nt-one,t-nowhere,1e3\n", encoding="utf-8")
    return p


def test_kinds_and_counts(tmp_path):
    _, cs = _set(tmp_path)
    report = audit_library(cs)
    by = {a.couple_id: a for a in report.couples}
    # BASE: t-one verified, t-two unverified, t-three verified, all with k_self
    assert (by["t-one"].provenance, by["t-one"].k_self_basis, by["t-one"].flagged) == ("verified", K_SELF_MEASURED,
                                                                                       False)
    assert by["t-two"].provenance == "unverified" and by["t-two"].flagged
    assert (by["t-made-up"].provenance, by["t-made-up"].k_self_basis) == ("invented", K_SELF_FROM_LAMBDA_TOTAL)
    assert (by["t-bonds"].k_self_basis, by["t-bonds"].doi, by["t-bonds"].date) == (
        K_SELF_FROM_STRUCTURE, "10.1021/ja00000a002", "2023-01-31")
    assert by["t-bare"].k_self_basis == K_SELF_NONE and by["t-bare"].flagged
    assert report.counts == {"couples": 6, "invented": 1, "unverified": 1, "estimated": 3, "without_doi": 5}


def test_couples_used_by_a_check_file(tmp_path):
    _, cs = _set(tmp_path)
    path = _check_file(tmp_path)
    check = audit_library(cs, read_measured_csv(path), str(path)).check
    assert [a.couple_id for a in check.couples] == ["t-one", "t-two", "t-made-up", "t-bonds", "t-three"]
    assert {a.couple_id: a.check_lines for a in check.couples}["t-two"] == (3, 4)
    assert check.unknown == ((6, "t-nowhere"),)
    # rows 3 (t-two unverified), 4 (t-made-up invented + estimated, t-two), 5 (t-bonds estimated), 6 (t-one only)
    assert check.rows_on == {"invented": 1, "unverified": 2, "estimated": 2}
    assert check.rows == 4


def test_cli_table_and_json(tmp_path, capsys, monkeypatch):
    monkeypatch.setenv("COLUMNS", "100")
    monkeypatch.setenv("NO_COLOR", "1")
    lib, _ = _set(tmp_path)
    check = _check_file(tmp_path)
    args = ["library", "audit", "--no-bundled", "--library", str(lib), "--check", str(check)]
    assert main(args) == 0
    out = capsys.readouterr().out
    flat = " ".join(out.split())  # prose wraps at 80 columns
    assert "6 couples: 1 invented (!), 1 unverified (?), 3 with an estimated k_self, 5 without a DOI" in flat
    assert "! t-made-up" in out and "? t-two" in out
    assert "doi 10.1021/ja00000a002, 2023-01-31" in out
    assert f"{check}:6: couple 't-nowhere' is not in the loaded library" in flat
    assert "rows relying on an invented couple: 1 of 4; on an unverified one: 2; on an estimated k_self: 2" in flat
    assert "not a safety assessment" in flat
    listed = out.split("the 4 predictions")[0]
    assert "t-one " not in listed  # verified with k_self given: not flagged unless --all
    assert main(args + ["--format", "json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["counts"]["invented"] == 1 and data["check"]["unknown"] == [{"line": 6, "id": "t-nowhere"}]


def test_bad_check_file_is_one_clear_error(tmp_path, capsys):
    lib, _ = _set(tmp_path)
    bad = tmp_path / "bad.csv"
    bad.write_text("oxidant,reductant,k_measured\nt-one,t-two,fast\n", encoding="utf-8")
    assert main(["library", "audit", "--no-bundled", "--library", str(lib), "--check", str(bad)]) == 2
    err = capsys.readouterr().err
    assert f"{bad}:2:3" in err and "Traceback" not in err
