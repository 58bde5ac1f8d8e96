"""`crossrate predict` shows the k_D uncertainty it propagates and the flat-model note (JSON and table).

Two invented neutral couples on the diffusion plateau (k_obs ~ 0.9 k_D; derivation in
tests/services/test_services_kd_uncertainty.py).
"""

import json


def test_cli_json_carries_the_sd_and_the_note(tmp_path, run_cli):
    lib = tmp_path / "plateau.toml"
    lib.write_text(
        '[library]\ntitle = "plateau test (invented)"\nformat = 1\nmedium = "water"\ntemperature = 298.15\n'
        'E_scale = "SHE"\n'
        + "".join(
            f'\n[couple.{cid}]\nname = "{cid} (invented)"\ncharge_ox = 0\ncharge_red = -1\nE = {E}\nE_sd = 0.01\n'
            f'radius = 4.5\nionic_strength = 0.1\nk_self = 1e9\nk_self_log10_sd = 0.2\nsource = "invented for tests"\n'
            for cid, E in (("pa", 0.32), ("pb", 0.0))
        ),
        encoding="utf-8",
    )
    rc, out, err = run_cli("predict", "pa", "pb", "--format", "json", "--no-bundled", "--library", str(lib), library=False)
    assert rc == 0, err
    data = json.loads(out)
    assert data["log10_k_diff_sd"] == 0.3
    assert sum(w.startswith("flat model") for w in data["warnings"]) == 1
    rc, out, err = run_cli("predict", "pa", "pb", "--no-bundled", "--library", str(lib), library=False)
    assert rc == 0 and "flat model on the diffusion plateau" in " ".join(out.split())
