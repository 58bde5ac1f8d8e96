"""`crossrate screen` and `crossrate map`: golden table and CSV forms, JSON, filters, --out."""

import csv
import io
import json
from pathlib import Path

import pytest

import crossrate

TEST_LIBRARY = Path(__file__).resolve().parents[1] / "services" / "data" / "halden_screen_test.toml"


def test_screen_table_golden(run_cli, golden):
    rc, out, err = run_cli("screen", "hl-iron-a", "--role", "oxidant")
    assert rc == 0 and err == ""
    golden("screen_iron_a_oxidant.txt", out)


def test_screen_csv_golden_and_count_on_stderr(run_cli, golden):
    rc, out, err = run_cli("screen", "hl-co-c", "--role", "reductant", "--format", "csv")
    assert rc == 0
    golden("screen_co_c_reductant.csv.txt", out)
    assert err.startswith("crossrate screen: ") and "left out as not computable" in err


def test_screen_csv_matches_the_service(run_cli):
    rc, out, _ = run_cli("screen", "hl-iron-a", "--role", "oxidant", "--format", "csv")
    rows = list(csv.DictReader(io.StringIO(out)))
    result = crossrate.screen(
        crossrate.load_library(TEST_LIBRARY, bundled=False, group=False, personal=False), "hl-iron-a", "oxidant"
    )
    assert [r["partner"] for r in rows] == list(result.partner)
    for r, k in zip(rows, result.table.log10_k_obs, strict=True):
        assert float(r["log10_k_obs"]) == pytest.approx(k, abs=5e-6)  # printed with 5 decimals


def test_screen_filters_from_the_command_line(run_cli):
    _, out, _ = run_cli("screen", "hl-iron-a", "--role", "oxidant", "--format", "json")
    full = json.loads(out)
    names = [r["partner"] for r in full["results"]]
    _, out, _ = run_cli("screen", "hl-iron-a", "--role", "oxidant", "--format", "json", "--top", "2")
    assert [r["partner"] for r in json.loads(out)["results"]] == names[:2]
    _, out, _ = run_cli("screen", "hl-iron-a", "--role", "oxidant", "--format", "json", "--tag", "cage")
    assert {r["partner"] for r in json.loads(out)["results"]} == {"hl-co-c", "hl-spin-d"}
    _, out, _ = run_cli("screen", "hl-iron-a", "--role", "oxidant", "--format", "json", "--min-k", "1e6")
    kept = json.loads(out)["results"]
    assert kept and all(r["log10_k_obs"] >= 6.0 for r in kept)
    assert len(kept) < len(names)
    _, out, _ = run_cli("screen", "hl-iron-a", "--role", "oxidant", "--format", "json", "--max-dG0", "-50")
    assert all(r["dG0_kJ_per_mol"] <= -50 for r in json.loads(out)["results"])
    assert full["not_computable"] == sum(full["not_computable_reasons"].values())


def test_screen_nothing_passes(run_cli):
    rc, out, _ = run_cli("screen", "hl-iron-a", "--role", "oxidant", "--min-k", "1e30")
    assert rc == 0
    assert "(no partner passes the filters)" in out


def test_map_csv_golden(run_cli, golden):
    rc, out, err = run_cli("map", "--medium", "water")
    assert rc == 0 and err == ""  # stderr is not a terminal: no progress bar
    golden("map_water.csv.txt", out)


def test_map_json_has_null_for_missing_pairs(run_cli):
    rc, out, _ = run_cli("map", "--format", "json", "--tag", "cage")
    assert rc == 0
    d = json.loads(out)
    assert d["ids"] == ["hl-co-c", "hl-spin-d"]
    assert len(d["log10_k_obs"]) == 2 and all(v is not None for row in d["log10_k_obs"] for v in row)
    rc, out, _ = run_cli("map", "--format", "json")
    assert "NaN" not in out and None in json.loads(out)["log10_k_obs"][0]


def test_map_out_and_force(run_cli, tmp_path):
    target = tmp_path / "map.csv"
    rc, out, err = run_cli("map", "--out", str(target))
    assert rc == 0 and out == ""
    assert "written to" in err
    first = target.read_text(encoding="utf-8")
    assert first.startswith("oxidant\\reductant,hl-iron-a,")
    rc, _, _ = run_cli("map", "--out", str(target), "--force", "--format", "json")
    assert rc == 0
    assert json.loads(target.read_text(encoding="utf-8"))["ids"][0] == "hl-iron-a"
