"""Shared start of the fault benchmarks: the checkout and tests/faults on sys.path, and an environment in
which no group or personal library of the machine is read (a plain module, not a benchmark itself)."""

import os
import sys
import tempfile
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]


def prepare() -> Path:
    """Put the checkout and tests/faults first on sys.path; isolate HOME and the config; a scratch folder."""
    for p in (str(ROOT / "tests" / "faults"), str(ROOT)):
        if p not in sys.path:
            sys.path.insert(0, p)
    scratch = Path(tempfile.mkdtemp(prefix="crossrate-faults-"))
    os.environ["HOME"] = str(scratch / "home")
    os.environ["XDG_CONFIG_HOME"] = str(scratch / "config")
    os.environ["XDG_CACHE_HOME"] = str(scratch / "cache")
    os.environ["NO_COLOR"] = "1"
    for name in ("CROSSRATE_GROUP_LIBRARY", "CROSSRATE_PERSONAL_LIBRARY"):
        os.environ.pop(name, None)
    return scratch


def verdict(failed: int) -> str:
    return "ok" if failed == 0 else "FAILED"
