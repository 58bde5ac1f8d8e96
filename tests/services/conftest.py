"""Fixtures of the services tests: a small invented couple set (tests/services/data/halden_screen_test.toml)."""

import importlib.util
import tomllib
from pathlib import Path

import pytest

from crossrate.core.potential_scales import PotentialScale, ScaleRegistry
from crossrate.library.couple import Couple
from crossrate.library.couple_set import CoupleSet

DATA = Path(__file__).parent / "data"
TEST_LIBRARY = DATA / "halden_screen_test.toml"


def _direct_set(path: Path) -> CoupleSet:
    """The file built into Couple(...) objects directly (no validation), for use without the library reader."""
    doc = tomllib.loads(path.read_text(encoding="utf-8"))
    lib = doc["library"]
    extra = {
        key: PotentialScale(key, s["name"], s.get("relative_to", key), float(s.get("offset_V", 0.0)), s["source"])
        for key, s in lib.get("scales", {}).items()
    }
    couples = []
    for cid, row in doc["couple"].items():
        row = dict(row)
        row.setdefault("medium", lib["medium"])
        row.setdefault("temperature", lib["temperature"])
        row.setdefault("E_scale", lib["E_scale"])
        row["tags"] = tuple(row.get("tags", ()))
        couples.append(Couple(id=cid, **row))
    return CoupleSet(couples, scales=ScaleRegistry(extra), files=[str(path)])


def load_test_set(path: Path = TEST_LIBRARY) -> CoupleSet:
    """Through the real reader when it exists (same couples either way)."""
    if importlib.util.find_spec("crossrate.library.layers") is not None:
        from crossrate.library.layers import load_layered

        return load_layered(extra_paths=(str(path),), bundled=False, group=False, personal=False)
    return _direct_set(path)


@pytest.fixture(scope="session")
def couple_set() -> CoupleSet:
    return load_test_set()


@pytest.fixture(scope="session")
def direct_set() -> CoupleSet:
    return _direct_set(TEST_LIBRARY)
