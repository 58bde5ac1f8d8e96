"""Wrong argument types, out-of-range positions and invalid records through the Python API: crossrate's
own errors (CrossrateError subclasses) naming the argument and what was expected, never a bare numpy error
or a NaN."""

import dataclasses

import numpy as np
import pytest

import crossrate
from crossrate.errors import (
    ArgumentError,
    ConditionsError,
    CrossrateError,
    LibraryError,
    ScienceError,
)


@pytest.fixture
def cs(isolated_env, test_library_path):
    return crossrate.load_library(test_library_path, bundled=False, group=False, personal=False)


def _pair(cs):
    water = [c.id for c in cs if c.medium == "water" and c.E_scale == "SHE" and c.k_self]
    return water[0], water[1]


@pytest.mark.parametrize("ox,red,match", [
    (np.array([0, 1]), np.array([1, 99]), "reductants: position 99 is out of range; expected 0 to"),
    ([0, -1], [1, 2], "oxidants: position -1 is out of range"),
    (3.5, "x", "oxidants: got float; expected a list or array"),
    ("ab", ["a", "b"], "oxidants: got str; expected a list or array"),
    ([None], [1], "oxidants: holds NoneType None; expected couple ids"),
    ([0, "x"], [1, 2], "expected couple ids .text. or whole-number positions, not a mix"),
    (np.array([0.5]), np.array([1]), "oxidants: got an array of float64"),
    (np.zeros((2, 2), dtype=int), np.zeros((2, 2), dtype=int), "2 dimensions"),
])
def test_predict_many_bad_arguments(cs, ox, red, match):
    with pytest.raises(ArgumentError, match=match):
        crossrate.predict_many(cs, ox, red)


def test_predict_bad_arguments(cs):
    ox, red = _pair(cs)
    cases = [
        ((1, 2), "oxidant: got int"),
        ((None, red), "oxidant: got NoneType"),
        ((ox, red, "298 K"), "conditions: got str; expected crossrate.Conditions"),
    ]
    for args, match in cases:
        with pytest.raises(ArgumentError, match=match):
            crossrate.predict(cs, *args)
    with pytest.raises(ArgumentError, match="couple_set: got list; expected a CoupleSet"):
        crossrate.predict([], ox, red)
    with pytest.raises(ArgumentError, match="samples: got str"):
        crossrate.predict(cs, ox, red, samples="many")
    with pytest.raises(ArgumentError, match="couple id: got list"):
        cs[["a"]]
    with pytest.raises(ArgumentError, match="couple id: got int"):
        cs[3]


def test_other_api_functions_check_their_arguments(cs):
    ox, red = _pair(cs)
    with pytest.raises(ArgumentError, match="k_measured: got str"):
        crossrate.solve_k_self(cs, ox, red, "1e5")
    with pytest.raises(ArgumentError, match="couple_set"):
        crossrate.screen("not a set", ox)
    with pytest.raises(ArgumentError, match="conditions"):
        crossrate.rate_map(cs, conditions={"temperature_K": 300})
    with pytest.raises(ArgumentError, match="rows: got str"):
        crossrate.check_measured(cs, "measured.csv")
    with pytest.raises(ArgumentError, match="radius_A: got str"):
        crossrate.lambda_for_structure("3.5", "water")
    # ArgumentError is a CrossrateError and a TypeError (so `except TypeError` code keeps working)
    assert issubclass(ArgumentError, CrossrateError) and issubclass(ArgumentError, TypeError)


@pytest.mark.parametrize("changes,match", [
    ({"Z": 1e300}, "Z 1e.300: expected a collision factor from 1e.09 to 1e.13"),
    ({"Z": 0.0}, "expected a collision factor"),
    ({"Z": True}, "expected a collision factor"),
    ({"medium": ""}, "unknown medium ''"),
    ({"medium": 3}, "unknown medium 3"),
    ({"temperature_K": float("nan")}, "temperature nan K"),
    ({"ionic_strength_M": "0.1"}, "ionic strength '0.1' M"),
])
def test_conditions_out_of_the_documented_range(changes, match):
    with pytest.raises(ConditionsError, match=match):
        crossrate.Conditions(**changes)


def test_lambda_radius_outside_the_library_range():
    with pytest.raises(ScienceError, match=r"radius 0.1 angstrom: expected a finite number from 1 to 30 angstrom"):
        crossrate.lambda_for_structure(0.1, "water")


def test_couple_built_directly_is_validated(cs):
    c = next(iter(cs))
    with pytest.raises(LibraryError, match="field radius: got -1 angstrom; expected a finite number from 1 to 30"):
        dataclasses.replace(c, radius=-1.0)
    with pytest.raises(LibraryError, match="field k_self: got nan"):
        dataclasses.replace(c, k_self=float("nan"))
    with pytest.raises(LibraryError, match="field medium: unknown medium 'benzene'"):
        dataclasses.replace(c, medium="benzene")
    with pytest.raises(LibraryError, match="charge_ox - charge_red = 2"):
        dataclasses.replace(c, charge_ox=c.charge_red + 2)
    with pytest.raises(LibraryError) as info:
        crossrate.Couple(id="x", name="", charge_ox=1, charge_red=0, E=9.0, E_scale="SHE", radius=0.0,
                         medium="water", ionic_strength=0.1, temperature=298.15, source="test")
    fields = {p.field for p in info.value.problems}
    assert {"name", "E", "radius"} <= fields  # every problem at once
    assert str(info.value).startswith("Couple(...): couple x: field")
    ok = dataclasses.replace(c, radius=4.0)
    assert ok.radius == 4.0
