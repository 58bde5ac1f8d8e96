"""Screening against a CSV table of computed candidates: the same numbers as the library path for the same
couples, and the library's rules with file:line:column messages for bad cells."""

import numpy as np
import pytest

from crossrate.core.potential_scales import ScaleRegistry
from crossrate.errors import LibraryError
from crossrate.library.candidate_table import read_candidate_table
from crossrate.library.couple_set import CoupleSet
from crossrate.library.toml_reader import parse_library_text
from crossrate.services.batch_prediction import predict_many
from crossrate.services.candidate_screening import screen_candidates
from crossrate.services.conditions import Conditions

HEAD = ('[library]\ntitle = "candidates as couples"\nformat = 1\nmedium = "water"\ntemperature = 298.15\n'
        'E_scale = "SHE"\n\n')
TARGET = ('[couple.t-target]\nname = "target 3+/2+"\ncharge_ox = 3\ncharge_red = 2\nE = 0.45\nk_self = 3.0e3\n'
          'radius = 3.6\nionic_strength = 0.1\nsource = "invented for the tests"\n\n')
# Invented candidates: (id, charge_ox, charge_red, E V, radius angstrom, lambda_total kJ/mol, k_self M^-1 s^-1)
ROWS = [("c-1", 1, 0, -0.20, 4.5, 95.0, 2.0e5), ("c-2", 2, 1, 0.10, 3.8, 140.0, 40.0),
        ("c-3", 0, -1, 0.40, 5.2, 60.0, 8.0e7), ("c-4", 3, 2, -0.55, 6.0, 180.0, 0.5)]


def _library(rate):
    text = HEAD + TARGET
    for cid, zo, zr, E, r, lam, k in ROWS:
        value = f"lambda_total = {lam}" if rate == "lambda_total" else f"k_self = {k}"
        text += (f'[couple.{cid}]\nname = "{cid}"\ncharge_ox = {zo}\ncharge_red = {zr}\nE = {E}\n{value}\n'
                 f'radius = {r}\nionic_strength = 0.1\nsource = "invented for the tests"\n\n')
    lf = parse_library_text(text, "lib.toml")
    return CoupleSet(lf.couples, ScaleRegistry(lf.scales))


def _table(tmp_path, rate, extra=""):
    p = tmp_path / "cand.csv"
    lines = ["# computed candidates (invented)", f"id,charge_ox,charge_red,E,radius,{rate},name"]
    for cid, zo, zr, E, r, lam, k in ROWS:
        lines.append(f"{cid},{zo},{zr},{E},{r},{lam if rate == 'lambda_total' else k},\"cand, {cid}\"")
    p.write_text("\n".join(lines) + "\n" + extra, encoding="utf-8")
    return p


@pytest.mark.parametrize("rate", ["lambda_total", "k_self"])
@pytest.mark.parametrize("role", ["oxidant", "reductant"])
def test_same_rates_as_the_library_path(tmp_path, rate, role):
    cs = _library(rate)
    table = read_candidate_table(_table(tmp_path, rate))
    cond = Conditions(ionic_strength_M=0.1)
    res = screen_candidates(cs, "t-target", role, table, "SHE", cond, top=10)
    ids = [r[0] for r in ROWS]
    ox, red = (["t-target"] * 4, ids) if role == "oxidant" else (ids, ["t-target"] * 4)
    ref = predict_many(cs, ox, red, cond, uncertainty=False)
    # The candidates stand at the screen's conditions (water, 298.15 K, 0.1 M), as the library couples were
    # measured: nothing is carried, so both paths evaluate the same cross relation on the same inputs.
    expected = dict(zip(ids, ref.log10_k_obs, strict=True))
    assert set(res.partner) == set(ids)
    for cid, k in zip(res.partner, res.log10_k_obs, strict=True):
        assert k == pytest.approx(expected[cid], rel=0, abs=1e-9)
    assert list(res.log10_k_obs) == sorted(res.log10_k_obs, reverse=True)


def test_top_keeps_the_fastest(tmp_path):
    cs = _library("lambda_total")
    table = read_candidate_table(_table(tmp_path, "lambda_total"))
    full = screen_candidates(cs, "t-target", "oxidant", table, "SHE", Conditions(ionic_strength_M=0.1), top=10)
    two = screen_candidates(cs, "t-target", "oxidant", table, "SHE", Conditions(ionic_strength_M=0.1), top=2)
    assert two.partner == full.partner[:2] and two.candidates == 4


def test_every_bad_cell_with_line_and_column(tmp_path):
    p = tmp_path / "bad.csv"
    p.write_text("# invented\nid,charge_ox,charge_red,E,radius,lambda_total\n"
                 "c-1,1,0,-0.2,4.5,95\n"
                 "\n"
                 "c-2,2,2,0.1,35,140\n"       # line 5: charges, radius
                 "C 3,0,-1,abc,5.2,-60\n"     # line 6: id, E, lambda_total
                 "c-1,1,0,0.1,4.0,\n",        # line 7: duplicate id, empty lambda_total
                 encoding="utf-8")
    with pytest.raises(LibraryError) as exc:
        read_candidate_table(p)
    text = str(exc.value)
    for expected in (f"{p}:5:2: couple c-2: field charge_ox: charge_ox - charge_red = 0",
                     f"{p}:5:5: couple c-2: field radius: got 35", f"{p}:6:1: couple C 3: bad id",
                     f"{p}:6:4: couple C 3: field E: got 'abc'", f"{p}:6:6: couple C 3: field lambda_total: got -60",
                     f"{p}:7:1: couple c-1: id also on line 3", f"{p}:7:6: couple c-1: field lambda_total: empty"):
        assert expected in text, expected


def test_header_rules(tmp_path):
    p = tmp_path / "h.csv"
    p.write_text("id,charge_ox,charge_red,E,radiuss,k_self,lambda_total\n", encoding="utf-8")
    with pytest.raises(LibraryError) as exc:
        read_candidate_table(p)
    text = str(exc.value)
    assert f"{p}:1:5: unknown column 'radiuss' (did you mean radius?)" in text
    assert "missing column 'radius'" in text and "exactly one of the columns k_self" in text


def test_fast_and_row_by_row_passes_agree(tmp_path):
    from crossrate.library import candidate_table as ct

    p = _table(tmp_path, "k_self")
    text = p.read_text(encoding="utf-8")
    line, header = ct._header(text, str(p))
    fast = ct._fast(text, str(p), line, header, "k_self")
    slow = ct._slow(text, str(p), line, header, "k_self")
    assert fast is not None
    assert [fast.id_text(i) for i in range(len(fast))] == [slow.id_text(i) for i in range(len(slow))]
    for name in ("z_ox", "z_red", "E_V", "radius_A", "rate"):
        np.testing.assert_array_equal(getattr(fast, name), getattr(slow, name))
    # a repeated id is caught by the fast pass's hash check and explained by the row-by-row pass
    dup = text + "c-2,2,1,0.1,3.8,40.0,again\n"
    assert ct._fast(dup, str(p), line, header, "k_self") is None


def test_non_ascii_file_is_read_row_by_row(tmp_path):
    # numpy's vectorized text reader has crashed the process on some characters beyond the Basic Multilingual
    # Plane (found by tests/faults/test_faults_fuzz.py), so any non-ASCII file takes the row-by-row pass: a name
    # with subscripts and a symbol outside the BMP is read, with the same values as the plain file.
    from crossrate.library import candidate_table as ct

    plain = _table(tmp_path, "k_self")
    fancy = tmp_path / "fancy.csv"
    fancy.write_text(plain.read_text(encoding="utf-8").replace('"cand, c-1"', '"Fe(H₂O)₆ \U0001D53D"'),
                     encoding="utf-8")
    text = fancy.read_text(encoding="utf-8")
    assert not text.isascii()
    line, header = ct._header(text, str(fancy))
    assert ct._fast(text, str(fancy), line, header, "k_self") is None
    a, b = read_candidate_table(plain), read_candidate_table(fancy)
    assert [a.id_text(i) for i in range(len(a))] == [b.id_text(i) for i in range(len(b))]
    for name in ("z_ox", "z_red", "E_V", "radius_A", "rate"):
        np.testing.assert_array_equal(getattr(a, name), getattr(b, name))
