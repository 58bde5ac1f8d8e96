"""Property test: for random couples and conditions, solving the cross relation backwards returns the
forward inputs (k_self to 1e-6 in log10, E to 1e-6 V) on whichever branch the forward pair lies."""

import math

import pytest
from hypothesis import HealthCheck, assume, example, given, settings
from hypothesis import strategies as st

from crossrate.errors import ScienceError
from crossrate.library.couple import Couple
from crossrate.library.couple_set import CoupleSet
from crossrate.services.conditions import Conditions
from crossrate.services.prediction import predict
from crossrate.services.solving import solve_k_self, solve_potential

charges = st.sampled_from([(3, 2), (2, 1), (1, 0), (0, -1), (-2, -3), (-3, -4)])


def _couple(cid, z, E, log_k, r):
    return Couple(id=cid, name=cid, charge_ox=z[0], charge_red=z[1], E=E, E_scale="SHE", radius=r, medium="water",
                  ionic_strength=0.1, temperature=298.15, source="generated (test)", k_self=10.0**log_k)


@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(
    z1=charges, z2=charges,
    E1=st.floats(-1.0, 1.5), dE=st.floats(0.0, 1.2),
    lk1=st.floats(-4.0, 9.0), lk2=st.floats(-4.0, 9.0),
    r1=st.floats(3.0, 8.0), r2=st.floats(3.0, 8.0),
    I=st.floats(0.0, 1.0),
)
# A pair at the activationless top: the k_self spread's nudge lifts the target past the largest rate allowed.
@example(z1=(-2, -3), z2=(2, 1), E1=0.0, dE=1.0, lk1=2.25, lk2=8.25, r1=3.0, r2=4.0, I=1.0)
@example(z1=(-2, -3), z2=(2, 1), E1=0.0, dE=1.0, lk1=2.25, lk2=8.25, r1=3.0, r2=4.0, I=0.5)
def test_solvers_invert_the_forward_prediction(z1, z2, E1, dE, lk1, lk2, r1, r2, I):
    ox = _couple("ox", z1, E1, lk1, r1)
    red = _couple("red", z2, E1 - dE, lk2, r2)  # downhill: E_ox >= E_red
    cs = CoupleSet([ox, red])
    cond = Conditions(ionic_strength_M=I, diffusion=False)  # the cap's own inversion is tested elsewhere
    try:
        p = predict(cs, "ox", "red", cond, samples=0)
    except ScienceError:
        assume(False)  # a generated k_self above Z exp(-w/RT): not a valid couple
    if p.log10_k_obs < -12 or p.log10_k_obs > 12.5:
        return  # outside any measurable rate
    k12 = 10.0**p.log10_k_obs
    sol = solve_k_self(cs, "ox", "red", k12, role="oxidant", conditions=cond)
    roots = [sol.log10_k_self] + ([sol.log10_k_self_second_root] if sol.log10_k_self_second_root is not None else [])
    assert min(abs(r - p.log10_k11) for r in roots) < 1e-6
    if sol.log10_k_self_second_root is None:
        assert sol.log10_k_self == pytest.approx(p.log10_k11, abs=1e-6)
    pot = solve_potential(cs, "red", "ox", k12, role="reductant", conditions=cond)
    assert min(abs(E - (E1 - dE)) for E in pot.E_V) < 1e-6
    gap = p.lambda_kJ_per_mol + p.dG0_prime_kJ_per_mol  # > 0 on the normal side of the maximum
    if abs(gap) > 1.0:  # clearly on one side (1 kJ/mol): the root of that side is the library E
        assert pot.E_V[0 if gap > 0 else 1] == pytest.approx(E1 - dE, abs=1e-6)
    assert math.isfinite(pot.E_sd_V[0])
