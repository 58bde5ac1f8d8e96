"""Fixtures of the analysis tests: a small invented couple set built from Couple(...) directly.

All values are invented (Halden Lake redox-mediator scenario), physically plausible, not literature.
"""

import pytest

from crossrate.library.couple import Couple
from crossrate.library.couple_set import CoupleSet


def _c(cid, z_ox, z_red, E, k_self, radius, **kw):
    base = dict(
        id=cid, name=f"invented couple {cid}", charge_ox=z_ox, charge_red=z_red, E=E, E_scale="SHE",
        radius=radius, medium="water", ionic_strength=0.1, temperature=298.15, source="invented (test)",
        k_self=k_self, E_sd=0.005, k_self_log10_sd=0.2,
    )
    base.update(kw)
    return Couple(**base)


COUPLES = (
    _c("hl-aqua", 3, 2, 0.74, 4.0, 3.4),
    _c("hl-bpy", 3, 2, 1.25, 4.0e8, 6.8),
    _c("hl-phen", 3, 2, 1.05, 3.0e8, 6.8),
    _c("hl-amm", 3, 2, 0.10, 4.0e3, 3.3),
    _c("hl-cyano", -3, -4, 0.40, 2.0e4, 4.5),
    _c("hl-spin", 3, 2, 0.05, 1.0e-6, 3.3, tags=("spin-change",)),
    _c("hl-slow", 1, 0, 0.55, 1.0e2, 4.0, kappa_el=0.01),
    _c("hl-quin", 0, -1, -0.20, 1.0e8, 3.8),
    _c("hl-nok", 1, 0, 0.30, None, 4.0, k_self_log10_sd=None),
    _c("hl-viol", 2, 1, -0.45, 3.0e8, 4.2),
    _c("hl-acn", 1, 0, 0.45, 5.0e6, 4.0, medium="acetonitrile"),
)


@pytest.fixture(scope="session")
def analysis_set() -> CoupleSet:
    return CoupleSet(list(COUPLES))


def couples_toml(couples=COUPLES) -> str:
    """The couples as a library file (format 1), so the CLI tests go through the real reader."""
    import tomli_w

    doc = {"library": {"title": "Halden Lake analysis test couples (invented)", "format": 1}, "couple": {}}
    for c in couples:
        row = {
            "name": c.name, "charge_ox": c.charge_ox, "charge_red": c.charge_red, "E": c.E, "E_scale": c.E_scale,
            "radius": c.radius, "medium": c.medium, "ionic_strength": c.ionic_strength,
            "temperature": c.temperature, "source": c.source,
        }
        for key in ("E_sd", "k_self", "k_self_log10_sd", "kappa_el"):
            if getattr(c, key) is not None:
                row[key] = getattr(c, key)
        if c.tags:
            row["tags"] = list(c.tags)
        doc["couple"][c.id] = row
    return "# Invented couples for the analysis tests (Halden Lake scenario); not literature values.\n" + tomli_w.dumps(doc)


@pytest.fixture(scope="session")
def analysis_library(tmp_path_factory):
    path = tmp_path_factory.mktemp("analysis_lib") / "halden_analysis.toml"
    path.write_text(couples_toml(), encoding="utf-8")
    return path


@pytest.fixture()
def isolated_env(monkeypatch, tmp_path):
    """No group or personal library from the machine leaks into a CLI test."""
    monkeypatch.delenv("CROSSRATE_GROUP_LIBRARY", raising=False)
    monkeypatch.delenv("CROSSRATE_PERSONAL_LIBRARY", raising=False)
    monkeypatch.setenv("HOME", str(tmp_path))
    monkeypatch.setenv("XDG_CONFIG_HOME", str(tmp_path / ".config"))
    return tmp_path
