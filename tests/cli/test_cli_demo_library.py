"""The three commands on the bundled demo library (libraries/demo.toml), as the README shows them."""

import csv
import io
import json

import pytest

import crossrate


@pytest.fixture
def demo(isolated_env):
    return crossrate.load_library()  # bundled only: the fixture keeps group and personal layers out


def test_predict_demo_pair(run_cli, demo):
    rc, out, err = run_cli("predict", "hl-med2", "hl-ru-amine", library=False)
    assert rc == 0 and err == ""
    assert "oxidant (couple 1): hl-med2" in out and "Estimate only" in out
    rc, out, _ = run_cli("predict", "hl-med2", "hl-ru-amine", "--format", "json", library=False)
    from crossrate.cli.predict_cmd import DEFAULT_SEED

    api = crossrate.predict(demo, "hl-med2", "hl-ru-amine", samples=20000, seed=DEFAULT_SEED)
    assert json.loads(out) == api.to_dict()


def test_screen_demo_target(run_cli, demo):
    rc, out, _ = run_cli("screen", "hl-med1", "--role", "oxidant", "--format", "csv", library=False)
    assert rc == 0
    rows = list(csv.DictReader(io.StringIO(out)))
    assert rows and all(r["oxidant"] == "hl-med1" for r in rows)
    logs = [float(r["log10_k_obs"]) for r in rows]
    assert logs == sorted(logs, reverse=True)
    medium = demo["hl-med1"].medium
    assert all(demo[r["partner"]].medium == medium for r in rows)  # media are never mixed silently


def test_map_demo_acetonitrile(run_cli, demo):
    rc, out, _ = run_cli("map", "--medium", "acetonitrile", "--format", "json", library=False)
    assert rc == 0
    d = json.loads(out)
    assert d["ids"] and all(demo[i].medium == "acetonitrile" for i in d["ids"])
    m = crossrate.rate_map(demo, conditions=crossrate.Conditions(medium="acetonitrile"))
    assert d["log10_k_obs"] == m.to_dict()["log10_k_obs"]
