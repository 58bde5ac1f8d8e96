"""Fixtures for the lambda tests: small CoupleSets built directly (values invented for testing, not data)."""

import pytest

from crossrate.library.couple import BondSet, Couple, Origin
from crossrate.library.couple_set import CoupleSet


def make_couple(cid, **kw) -> Couple:
    """A Couple with plausible invented defaults (aqueous, 0.1 M, 298.15 K, +3/+2, 3.5 angstrom)."""
    base = dict(
        name=cid,
        charge_ox=3,
        charge_red=2,
        E=0.5,
        E_scale="SHE",
        radius=3.5,
        medium="water",
        ionic_strength=0.1,
        temperature=298.15,
        source="invented for tests",
        origin=Origin("tests/lambda/conftest.py", 1, "test"),
    )
    base.update(kw)
    return Couple(id=cid, **base)


#: One bond set as in an octahedral aqua complex (invented test input): 6 bonds, 0.14 A, 250 / 160 N/m.
BONDS = (BondSet(count=6, delta_d=0.14, f_ox=250.0, f_red=160.0),)


@pytest.fixture
def make():
    return make_couple


@pytest.fixture
def lambda_set() -> CoupleSet:
    """Couples covering every route to k_self."""
    return CoupleSet(
        [
            make_couple("meas_w", k_self=4.0, bonds=BONDS),
            make_couple("meas_w_plain", k_self=1e3, charge_ox=1, charge_red=0, radius=4.0, E=0.2),
            make_couple("meas_mecn", k_self=5e6, charge_ox=1, charge_red=0, radius=3.8, medium="acetonitrile", E=0.4),
            make_couple("est_bonds", bonds=BONDS, E=0.3),
            make_couple("est_lin", lambda_in=40.0, charge_ox=1, charge_red=0, radius=4.5, E=0.1),
            make_couple("est_total", lambda_total=150.0, charge_ox=2, charge_red=1, E=0.05),
            make_couple("est_nonad", lambda_in=20.0, tags=("non-adiabatic",), E=0.25),
            make_couple("est_kappa", lambda_in=20.0, kappa_el=0.01, E=0.26),
            make_couple("bare", E=0.6),
        ]
    )
