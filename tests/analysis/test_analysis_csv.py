"""The CSV reader of measured rates, partner measurements and series: every problem named by file:line:column."""

import numpy as np
import pytest

from crossrate.core.constants import EV, KJ
from crossrate.errors import InputFileError
from crossrate.services.measured_csv import read_measured_csv, read_partner_csv, read_series_csv


def _write(tmp_path, text, name="data.csv", encoding="utf-8"):
    p = tmp_path / name
    p.write_bytes(text.encode(encoding))
    return p


def test_comments_blank_lines_and_bom_are_skipped(tmp_path):
    p = _write(tmp_path, "\ufeff# invented\n\noxidant,reductant,k_measured,medium\n# a note\nhl-a,hl-b,1.5e4,water\n")
    rows = read_measured_csv(p)
    assert len(rows) == 1
    r = rows[0]
    assert (r.line, r.oxidant, r.reductant, r.k_measured, r.medium) == (5, "hl-a", "hl-b", 1.5e4, "water")
    assert r.temperature is None and r.k_measured_log10_sd is None


@pytest.mark.parametrize(
    "body, expected",
    [
        ("oxidant,reductant,k_measured\nhl-a,hl-b,fast\n", ":2:3: field k_measured: got 'fast', expected a number"),
        ("oxidant,reductant,k_measured\nhl-a,hl-b,-3\n", ":2:3: field k_measured: got '-3', expected a rate constant greater than 0"),
        ("oxidant,reductant,k_measured\nhl-a,hl-b,nan\n", ":2:3: field k_measured: got 'nan', expected a finite number"),
        ("oxidant,reductant,k_measured\nhl-a,,1e3\n", ":2:2: field reductant: empty, expected a value"),
        ("oxidant,reductant,k_measured,temperature\nhl-a,hl-b,1e3,500\n", ":2:4: field temperature: got '500', expected a temperature from 200 to 400 K"),
        ("oxidant,reductant,k_measured,ionic_strength\nhl-a,hl-b,1e3,-1\n", ":2:4: field ionic_strength: got '-1', expected an ionic strength from 0 to 5 mol/L"),
        ("oxidant,reductant,k_measured,k_measured_log10_sd\nhl-a,hl-b,1e3,0\n", ":2:4: field k_measured_log10_sd: got '0'"),
        ("oxidant,reductant,k_measured\nhl-a,hl-b\n", ":2: 2 fields, expected 3"),
        ("oxidant,reductant\nhl-a,hl-b\n", ":1: missing column 'k_measured'"),
        ("oxidant,reductant,k_measured,k_mesured_sd\nhl-a,hl-b,1,1\n", ":1:4: unknown column 'k_mesured_sd'"),
        ("oxidant,oxidant,reductant,k_measured\nhl-a,hl-a,hl-b,1\n", ":1:2: column 'oxidant' appears twice"),
        ("oxidant,reductant,k_measured\n", ":1: a header but no data rows"),
        ("# only a comment\n", ": no header line"),
        ('oxidant,reductant,k_measured\n"hl-a,hl-b,1\n', ":2:"),
    ],
)
def test_each_bad_input_names_file_line_and_column(tmp_path, body, expected):
    p = _write(tmp_path, body)
    with pytest.raises(InputFileError) as exc:
        read_measured_csv(p)
    assert f"{p}{expected}" in str(exc.value)


def test_all_problems_are_listed_at_once(tmp_path):
    p = _write(tmp_path, "oxidant,reductant,k_measured\nhl-a,hl-b,x\nhl-a,hl-b,2\nhl-a,hl-b,-1\n")
    with pytest.raises(InputFileError) as exc:
        read_measured_csv(p)
    msg = str(exc.value)
    assert f"{p}:2:3" in msg and f"{p}:4:3" in msg


def test_missing_file_and_binary_file(tmp_path):
    with pytest.raises(InputFileError, match="cannot be read"):
        read_measured_csv(tmp_path / "absent.csv")
    p = tmp_path / "binary.csv"
    p.write_bytes(b"\xff\xfe\x00\x81oxidant")
    with pytest.raises(InputFileError, match="not a UTF-8 text file"):
        read_measured_csv(p)


def test_series_in_kj_and_ev(tmp_path):
    a = read_series_csv(_write(tmp_path, "dG0_kJ_per_mol,k_obs,log10_sd\n-10,1e5,0.1\n-20.5,1e6,0.2\n", "a.csv"))
    np.testing.assert_allclose(a.dG0_J_per_mol, [-10.0 * KJ, -20.5 * KJ], rtol=1e-15)
    assert a.has_sd and a.lines == (2, 3)
    b = read_series_csv(_write(tmp_path, "dG0_eV,k_obs\n-0.5,1e5\n-1.0,1e6\n", "b.csv"))
    # 1 eV per molecule = e N_A J/mol (scipy.constants via crossrate.core.constants).
    np.testing.assert_allclose(b.dG0_J_per_mol, [-0.5 * EV, -1.0 * EV], rtol=1e-15)
    assert not b.has_sd and np.isnan(b.log10_sd).all()


def test_series_needs_exactly_one_energy_column(tmp_path):
    both = _write(tmp_path, "dG0_eV,dG0_kJ_per_mol,k_obs\n-0.5,-48,1e5\n", "both.csv")
    with pytest.raises(InputFileError, match=r"both\.csv:1: both of dG0_kJ_per_mol and dG0_eV"):
        read_series_csv(both)
    neither = _write(tmp_path, "k_obs\n1e5\n", "neither.csv")
    with pytest.raises(InputFileError, match="neither of dG0_kJ_per_mol and dG0_eV"):
        read_series_csv(neither)
    empty = _write(tmp_path, "dG0_eV,k_obs\n-0.5,1e5\n,1e6\n", "empty.csv")
    with pytest.raises(InputFileError, match=r"empty\.csv:3: field dG0_eV: empty"):
        read_series_csv(empty)


def test_partner_file_roles(tmp_path):
    p = _write(tmp_path, "partner,k_measured,role\nhl-a,1e4,Oxidant\nhl-b,2e4,\n")
    rows = read_partner_csv(p)
    assert [r.role for r in rows] == ["oxidant", None]
    bad = _write(tmp_path, "partner,k_measured,role\nhl-a,1e4,donor\n", "bad.csv")
    with pytest.raises(InputFileError, match=r"bad\.csv:2:3: field role: got 'donor', expected oxidant, reductant or auto"):
        read_partner_csv(bad)


def test_series_energy_in_the_wrong_unit_is_caught(tmp_path):
    p = _write(tmp_path, "dG0_eV,k_obs\n-0.5,1e5\n-96.5,1e6\n", "ev.csv")
    with pytest.raises(InputFileError, match=r"ev\.csv:3:1: field dG0_eV: got '-96.5', expected a driving force within \+-5 eV"):
        read_series_csv(p)
