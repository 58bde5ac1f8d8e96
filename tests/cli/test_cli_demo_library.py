"""The three commands on the bundled demo library (libraries/demo.toml, loaded with --demo), as the README
shows them; every invented couple is said to be invented."""

import csv
import io
import json
import re

import pytest

import crossrate


@pytest.fixture
def demo(isolated_env):
    return crossrate.load_library(demo=True)  # bundled only: the fixture keeps group and personal layers out


def test_predict_demo_pair(run_cli, demo):
    rc, out, err = run_cli("predict", "hl-med2", "hl-ru-amine", "--demo", library=False)
    assert rc == 0 and err == ""
    assert "oxidant (couple 1): hl-med2 (! invented)" in out and "Estimate only" in out
    assert "hl-med2: invented values" in out  # and again among the warnings
    rc, out, _ = run_cli("predict", "hl-med2", "hl-ru-amine", "--demo", "--format", "json", library=False)
    from crossrate.cli.predict_cmd import DEFAULT_SEED

    api = crossrate.predict(demo, "hl-med2", "hl-ru-amine", samples=20000, seed=DEFAULT_SEED)
    assert json.loads(out) == api.to_dict()
    assert api.oxidant_provenance == api.reductant_provenance == "invented"


def test_screen_demo_target(run_cli, demo):
    rc, out, _ = run_cli("screen", "hl-med1", "--role", "oxidant", "--format", "csv", "--demo", library=False)
    assert rc == 0
    rows = list(csv.DictReader(io.StringIO(out)))
    assert rows and all(r["oxidant"] == "hl-med1" for r in rows)
    logs = [float(r["log10_k_obs"]) for r in rows]
    assert logs == sorted(logs, reverse=True)
    medium = demo["hl-med1"].medium
    assert all(demo[r["partner"]].medium == medium for r in rows)  # media are never mixed silently
    assert {r["partner_provenance"] for r in rows} == {"invented", "unverified"}  # demo and starter partners
    assert all(r["partner_provenance"] == demo[r["partner"]].provenance for r in rows)


def test_map_demo_acetonitrile(run_cli, demo):
    rc, out, _ = run_cli("map", "--medium", "acetonitrile", "--format", "json", "--demo", library=False)
    assert rc == 0
    d = json.loads(out)
    assert d["ids"] and all(demo[i].medium == "acetonitrile" for i in d["ids"])
    m = crossrate.rate_map(demo, conditions=crossrate.Conditions(medium="acetonitrile"))
    assert d["log10_k_obs"] == m.to_dict()["log10_k_obs"]
    assert d["provenance"] == [demo[i].provenance for i in d["ids"]]


def test_demo_only_when_asked_and_said_so(run_cli):
    rc, _, err = run_cli("predict", "hl-med2", "fe-aq", library=False)
    assert rc == 2
    assert err.strip() == ("crossrate: unknown couple 'hl-med2'; hl-med2 is a couple of the invented demo library: "
                           "add --demo")


def test_screen_table_marks_invented_and_unverified_partners(run_cli):
    rc, out, err = run_cli("screen", "fe-cn6", "--role", "oxidant", "--top", "8", "--demo", library=False)
    assert rc == 0, err
    assert out.startswith("Screening fe-cn6 (? unverified) as oxidant:")
    rows = [m.group(1) for m in re.finditer(r"^\d+\s+(\S+)\s+\d\.\d\de[+-]\d\d", out, re.M)]
    assert len(rows) == 8
    # every partner carries its mark: '!' for the invented hl- couples, '?' for the recalled starter ones
    assert all(p.endswith("!") if p.startswith("hl-") else p.endswith("?") for p in rows)
    flat = " ".join(out.split())
    assert "! invented: made-up values (demo, teaching)" in flat and "? unverified: values recalled or estimated" in flat


def test_predict_table_names_each_couples_provenance(run_cli):
    rc, out, err = run_cli("predict", "hl-med2", "fe-aq", "--ionic-strength", "0.1", "--demo", library=False)
    assert rc == 0, err
    flat = " ".join(out.split())
    assert "oxidant (couple 1): hl-med2 (! invented) reductant (couple 2): fe-aq (? unverified)" in flat
    assert "fe-aq: values not verified against the primary source" in flat


def test_solve_partner_list_marks_invented_partners(run_cli, monkeypatch):
    from pathlib import Path

    monkeypatch.chdir(Path(__file__).resolve().parents[2])
    rc, out, err = run_cli("solve", "k-self", "hl-med1", "--from-csv", "libraries/examples/partners_demo.csv",
                           "--demo", library=False)
    assert rc == 0, err
    assert "line 5: hl-ru-amine! (oxidant)" in out and "line 9: hl-phenothiazine! (reductant)" in out
    assert "! invented: made-up values (demo, teaching)" in " ".join(out.split())
