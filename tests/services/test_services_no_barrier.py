"""A self-exchange rate above the activation-free limit leaves lambda <= 0: refused, never a silent rate."""

import math

import pytest

from crossrate.errors import ScienceError
from crossrate.library.couple import Couple
from crossrate.library.couple_set import CoupleSet
from crossrate.services.batch_prediction import predict_many
from crossrate.services.prediction import predict


def _couple(cid, k_self, charge_ox=3):
    return Couple(
        id=cid, name=cid, charge_ox=charge_ox, charge_red=charge_ox - 1, E=0.5, E_scale="SHE", radius=3.5,
        medium="water", ionic_strength=0.0, temperature=298.15, source="invented for a test", k_self=k_self,
    )


def test_k_self_above_collision_limit_is_refused():
    # For a 3+/2+ couple at 3.5 A in water at I = 0, w11 = 6 e^2 N_A / (4 pi eps0 eps 7e-10 m) ~ 15 kJ/mol,
    # so Z exp(-w/RT) = 1e11 * exp(-15e3 / 2479) ~ 2e8 M^-1 s^-1: k_self = 1e9 leaves lambda < 0.
    cs = CoupleSet([_couple("fast", 1e9), _couple("slow", 1.0, charge_ox=1)])
    with pytest.raises(ScienceError, match="fast.*no barrier"):
        predict(cs, "fast", "slow", samples=0)
    table = predict_many(cs, ["fast", "slow"], ["slow", "slow"])
    assert math.isnan(table.log10_k_obs[0]) and table.problem[0]
    assert math.isfinite(table.log10_k_obs[1]) and table.problem[1] == ""
