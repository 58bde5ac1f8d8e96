"""`crossrate screen TARGET --candidates TABLE.csv`: the fastest computed candidates, and bad tables as one
clear message per cell (exit 2)."""

import json


def _files(tmp_path):
    lib = tmp_path / "lib.toml"
    lib.write_text('[library]\ntitle = "t"\nformat = 1\n\n[couple.t-target]\nname = "target 3+/2+"\ncharge_ox = 3\n'
                   'charge_red = 2\nE = 0.45\nE_scale = "SHE"\nk_self = 3.0e3\nradius = 3.6\nmedium = "water"\n'
                   'ionic_strength = 0.1\ntemperature = 298.15\nsource = "invented for the tests"\n',
                   encoding="utf-8")
    cand = tmp_path / "cand.csv"
    cand.write_text("id,charge_ox,charge_red,E,radius,lambda_total\nc-1,1,0,-0.2,4.5,95\nc-2,2,1,0.1,3.8,140\n"
                    "c-3,0,-1,0.4,5.2,60\n", encoding="utf-8")
    return lib, cand


def test_table_and_json(tmp_path, run_cli):
    lib, cand = _files(tmp_path)
    rc, out, err = run_cli("screen", "t-target", "--role", "oxidant", "--candidates", str(cand), "--no-bundled",
                           "--library", str(lib), "--top", "2", library=False)
    assert rc == 0, err
    assert "2 fastest of 3 candidates shown" in out and "not a safety assessment" in out
    rc, out, err = run_cli("screen", "t-target", "--role", "oxidant", "--candidates", str(cand), "--no-bundled",
                           "--library", str(lib), "--format", "json", library=False)
    data = json.loads(out)
    assert data["candidates"] == 3 and len(data["rows"]) == 3
    ks = [r["log10_k_obs"] for r in data["rows"]]
    assert ks == sorted(ks, reverse=True)


def test_bad_table_is_refused_with_cells(tmp_path, run_cli):
    lib, cand = _files(tmp_path)
    cand.write_text("id,charge_ox,charge_red,E,radius,lambda_total\nc-1,1,0,-0.2,45,95\n", encoding="utf-8")
    rc, out, err = run_cli("screen", "t-target", "--role", "oxidant", "--candidates", str(cand), "--no-bundled",
                           "--library", str(lib), library=False)
    assert rc == 2 and f"{cand}:2:5: couple c-1: field radius: got 45" in err and "Traceback" not in err
