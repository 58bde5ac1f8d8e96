"""The semiclassical model over many pairs: every map cell and screen row equals predict() under the same
model (the per-pair path, crossrate.core.semiclassical.ln_quantum_factor), to a stated tolerance."""

import json
import math

import numpy as np
import pytest

from crossrate.api import load_library
from crossrate.cli.main import main
from crossrate.core.level_sum import LEVEL_SUM_TOLERANCE
from crossrate.core.screened_debye_table import TABLE_TOLERANCE
from crossrate.services.batch_prediction import predict_many
from crossrate.services.conditions import Conditions
from crossrate.services.prediction import predict
from crossrate.services.rate_map import rate_map
from crossrate.services.screening import screen

# Map cells and screen rows against predict(): ln Q within LEVEL_SUM_TOLERANCE of the per-pair sum, and (at
# I > 0) ln k_D from the screened-diffusion table within TABLE_TOLERANCE of predict's integral; in log10:
ATOL_LOG10 = (LEVEL_SUM_TOLERANCE + TABLE_TOLERANCE) / math.log(10.0)


def _library_text(n=14):
    """Invented couples (Halden Lake scenario, not literature values): potentials from -1.4 to +1.6 V so that
    some pairs lie deep in the inverted region, charges 0 to 3, a few with lambda_in of their own."""
    rng = np.random.default_rng(5)
    out = ['# Invented couples for the semiclassical map tests; not literature values.', '[library]',
           'title = "semiclassical map test couples (invented)"', 'format = 1', 'medium = "water"',
           'temperature = 298.15', 'E_scale = "SHE"', '']
    for i in range(n):
        z = int(rng.integers(0, 4))
        lines = [f"[couple.hl-scm-{i:02d}]", f'name = "invented couple {i}"', f"charge_ox = {z}",
                 f"charge_red = {z - 1}", f"E = {-1.4 + 3.0 * i / (n - 1):.3f}", f"radius = {3.5 + 0.2 * i:.2f}",
                 "ionic_strength = 0.1", f"k_self = {10.0 ** rng.uniform(0, 9):.4g}", 'source = "invented for tests"']
        if i % 3 == 0:
            lines.append(f"lambda_in = {rng.uniform(5.0, 40.0):.2f}")
        out += lines + [""]
    return "\n".join(out)


SEMI = Conditions(rate_model="semiclassical")


@pytest.fixture(scope="module")
def lib(tmp_path_factory):
    path = tmp_path_factory.mktemp("scm") / "scm.toml"
    path.write_text(_library_text(), encoding="utf-8")
    return path


@pytest.fixture(scope="module")
def cs(lib):
    return load_library(str(lib), bundled=False, group=False, personal=False)


@pytest.mark.parametrize("cond", [SEMI, SEMI.with_(hbar_omega_cm1=800.0, diffusion=False)])
def test_map_cells_equal_predict(cs, cond):
    m = rate_map(cs, conditions=cond)
    assert m.rate_model == "semiclassical" and m.semiclassical["hbar_omega_cm1"] == (cond.hbar_omega_cm1 or 1500.0)
    classical = rate_map(cs, conditions=cond.with_(rate_model="classical"))
    assert np.nanmax(np.abs(m.log10_k_obs - classical.log10_k_obs)) > 1.0  # the inverted pairs move
    for i, ox in enumerate(m.ids):
        for j, red in enumerate(m.ids):
            p = predict(cs, ox, red, cond, samples=0)
            assert m.log10_k_obs[i, j] == pytest.approx(p.log10_k_obs, abs=ATOL_LOG10), (ox, red)


def test_map_json_says_the_model(cs):
    d = rate_map(cs, conditions=SEMI).to_dict()
    assert d["rate_model"] == "semiclassical"
    # 14 couples, every third (0, 3, 6, 9, 12) with lambda_in of its own: 9 use the default inner share.
    assert d["semiclassical"] == {"hbar_omega_cm1": 1500.0, "hbar_omega_default": True,
                                  "couples_with_own_hbar_omega": 0, "inner_default_fraction": 0.25,
                                  "couples_with_default_inner": 9}
    assert rate_map(cs).to_dict()["rate_model"] == "classical"


def test_screen_and_predict_many_equal_predict(cs):
    res = screen(cs, "hl-scm-13", "oxidant", SEMI)
    assert res.rate_model == "semiclassical"
    for partner, k, sd in zip(res.partner, res.table.log10_k_obs, res.table.log10_k_obs_sd_linear, strict=True):
        p = predict(cs, "hl-scm-13", partner, SEMI, samples=0)
        assert k == pytest.approx(p.log10_k_obs, abs=ATOL_LOG10)
        # The linear SD (central differences on the fast path) against predict's own linear propagation.
        assert sd == pytest.approx(p.log10_k_obs_sd_linear, rel=1e-3, abs=1e-6)
    t = predict_many(cs, ["hl-scm-00", "hl-scm-13"], ["hl-scm-13", "hl-scm-00"], SEMI)
    for k, (o, r) in enumerate((("hl-scm-00", "hl-scm-13"), ("hl-scm-13", "hl-scm-00"))):
        assert t.log10_k_obs[k] == pytest.approx(predict(cs, o, r, SEMI, samples=0).log10_k_obs, abs=ATOL_LOG10)


def test_cli_map_and_screen_say_the_model(lib, capsys):
    base = ["--no-bundled", "--library", str(lib), "--model", "semiclassical"]
    assert main(["map", *base, "--format", "json"]) == 0
    out = json.loads(capsys.readouterr().out)
    assert out["rate_model"] == "semiclassical" and out["semiclassical"]["hbar_omega_cm1"] == 1500.0
    assert main(["map", *base, "--hbar-omega", "1200"]) == 0
    cap = capsys.readouterr()
    assert cap.out.startswith("oxidant\\reductant,")  # the CSV keeps its shape
    assert "crossrate map: model: semiclassical" in cap.err and "hbar omega 1200 cm^-1" in cap.err
    assert main(["screen", "hl-scm-13", "--role", "oxidant", *base]) == 0
    text = capsys.readouterr().out
    assert "Model: semiclassical" in " ".join(text.split())
    assert main(["screen", "hl-scm-13", "--role", "oxidant", *base, "--format", "json"]) == 0
    assert json.loads(capsys.readouterr().out)["rate_model"] == "semiclassical"
