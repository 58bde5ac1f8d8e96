"""Importing the core pulls in no face (Textual, Rich) and no scipy at all (the CODATA constants are written in
core/constants.py, checked against scipy.constants in test_core_constants.py, so a cold start skips scipy)."""

import json
import os
import subprocess
import sys

PROBE = """
import json, sys
import crossrate.core.cross_rate, crossrate.core.solvents, crossrate.core.rate_grid
import crossrate.core.potential_scales, crossrate.core.condition_transfer
print(json.dumps(sorted(sys.modules)))
"""


def test_core_import_is_light(repo_root):
    env = dict(os.environ, PYTHONPATH=str(repo_root) + os.pathsep + os.environ.get("PYTHONPATH", ""))
    out = subprocess.run([sys.executable, "-c", PROBE], cwd=repo_root, env=env, capture_output=True, text=True,
                         check=True, timeout=60)
    loaded = set(json.loads(out.stdout))
    for forbidden in ("textual", "rich", "scipy", "matplotlib", "tomli_w"):
        assert forbidden not in loaded, forbidden
    assert not any(m.startswith(("crossrate.library", "crossrate.services", "crossrate.cli", "crossrate.tui"))
                   for m in loaded)
