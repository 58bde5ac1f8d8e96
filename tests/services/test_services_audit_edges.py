"""Edge cases found in the round-2 correctness audit: the Eyring step's permittivity at T0, excited-state
couples seen the same way by every service, one-medium sets in the batch path, Monte Carlo with too few
draws, and strict JSON at the corners of the input range. Couples are invented for these tests."""

import json
import math

import numpy as np
import pytest

from crossrate.core.condition_transfer import carry_ln_k_self
from crossrate.core.constants import ANGSTROM, FARADAY, GAS_CONSTANT, KJ
from crossrate.core.screened_debye_table import TABLE_TOLERANCE
from crossrate.core.solvents import get_solvent
from crossrate.errors import ConditionsError
from crossrate.library.couple import Couple
from crossrate.library.couple_set import CoupleSet
from crossrate.services.batch_prediction import predict_many
from crossrate.services.conditions import Conditions
from crossrate.services.prediction import predict
from crossrate.services.rate_map import rate_map
from crossrate.services.screening import screen
from crossrate.services.self_exchange import self_exchange_at
from crossrate.services.solving import solve_potential

T0 = 298.15
LN_Z = math.log(1e11)


def _c(cid, z, E, k=None, **kw):
    base = dict(id=cid, name=cid, charge_ox=z, charge_red=z - 1, E=E, E_scale="SHE", radius=kw.pop("radius", 4.5),
                medium="water", ionic_strength=0.1, temperature=T0, source="invented for a test", k_self=k,
                verified=True)
    base.update(kw)
    return Couple(**base)


# ---- Eyring route: ionic-strength step at T0 with the target solvent's permittivity at T0 -----------------

def test_eyring_route_takes_the_ionic_strength_step_with_eps_at_T0():
    water = get_solvent("water")
    T = 318.15
    eps_T0, eps_T = float(water.permittivity(T0)), float(water.permittivity(T))
    cs = CoupleSet([_c("eyr", 3, 0.5, 4.2, dH_self=43.0, radius=3.4)])
    se = self_exchange_at(cs, [0], T, 1.0, eps_T, LN_Z, medium="water")
    # Hand route: lambda from (T0, I0 = 0.1, eps_water(T0)); ln k at (T0, I = 1.0, eps_water(T0)) with that lambda;
    # then Eyring ln k(T) = ln k(T0) + ln(T/T0) - (dH/R)(1/T - 1/T0) (Eyring, J. Chem. Phys. 3, 107 (1935),
    # citation from memory).
    from crossrate.core.barrier import self_exchange_lambda, self_exchange_ln_k
    from crossrate.core.work_terms import work_term

    d = 2 * 3.4 * ANGSTROM
    lam = self_exchange_lambda(math.log(4.2), work_term(3, 2, d, eps_T0, T0, 0.1), T0, LN_Z)
    at_T0 = self_exchange_ln_k(lam, work_term(3, 2, d, eps_T0, T0, 1.0), T0, LN_Z)
    expected = at_T0 + math.log(T / T0) - 43.0e3 / GAS_CONSTANT * (1 / T - 1 / T0)
    assert float(se.ln_k[0]) == pytest.approx(float(expected), abs=1e-12)
    # The old route (eps at the target T used at T0) differs by a visible amount for a 3+/2+ couple at 1 M.
    old = carry_ln_k_self(math.log(4.2), 3, 2, 3.4 * ANGSTROM, T0, 0.1, eps_T0, T, 1.0, eps_T, LN_Z,
                          dH_self_J_per_mol=43.0e3)
    assert abs(float(old) - float(expected)) > 1e-3


# ---- excited-state couples ---------------------------------------------------------------------------------

@pytest.fixture(scope="module")
def excited_set():
    return CoupleSet([
        # Rehm-Weller-style effective potential (documented in Couple.effective_E): E(Ox/*Red) = E - E00.
        _c("sens-red*", 3, 1.20, 2e8, E00=2.00, excited_form="red", radius=7.0, E_sd=0.01, k_self_log10_sd=0.3),
        _c("sens-ox*", 3, -1.10, 2e8, E00=2.00, excited_form="ox", radius=7.0, E_sd=0.01, k_self_log10_sd=0.3),
        _c("acc", 2, -0.30, 1e3, radius=4.0, E_sd=0.01, k_self_log10_sd=0.3),
        _c("don", 1, 0.45, 1e5, radius=4.0, E_sd=0.01, k_self_log10_sd=0.3),
    ])


def test_excited_state_potentials_enter_dG0_as_documented(excited_set):
    # *Red as reductant: Delta G deg = -F (E_acc - (E - E00)) = -F (-0.30 - (1.20 - 2.00)) = -F (0.50 V).
    p = predict(excited_set, "acc", "sens-red*", samples=0)
    assert p.dG0_kJ_per_mol == pytest.approx(-FARADAY * 0.50 / KJ, abs=1e-9)
    # *Ox as oxidant: Delta G deg = -F ((E + E00) - E_don) = -F ((-1.10 + 2.00) - 0.45) = -F (0.45 V).
    p = predict(excited_set, "sens-ox*", "don", samples=0)
    assert p.dG0_kJ_per_mol == pytest.approx(-FARADAY * 0.45 / KJ, abs=1e-9)


@pytest.mark.parametrize("ox,red", [("acc", "sens-red*"), ("sens-ox*", "don")])
def test_excited_state_screen_map_batch_and_solve_use_the_same_effective_E(excited_set, ox, red):
    p = predict(excited_set, ox, red, samples=0)
    t = predict_many(excited_set, [ox], [red])
    assert t.dG0_kJ_per_mol[0] == pytest.approx(p.dG0_kJ_per_mol, abs=1e-9)
    assert t.log10_k_obs[0] == pytest.approx(p.log10_k_obs, abs=1e-9)
    m = rate_map(excited_set)
    # The map reads the screened Debye factor from a table (within TABLE_TOLERANCE in ln k_D).
    assert m.log10_k_obs[m.ids.index(ox), m.ids.index(red)] == pytest.approx(p.log10_k_obs, abs=1e-9 + TABLE_TOLERANCE)
    s = screen(excited_set, ox, role="oxidant")
    assert s.table.log10_k_obs[s.partner.index(red)] == pytest.approx(p.log10_k_obs, abs=1e-9)
    # Solving for the excited couple's potential returns its library field E (ground-state value).
    star = ox if "*" in ox else red
    partner = red if star == ox else ox
    role = "oxidant" if star == ox else "reductant"
    q = predict(excited_set, ox, red, Conditions(diffusion=False), samples=0)
    sol = solve_potential(excited_set, star, partner, 10.0 ** q.log10_k_obs, role=role,
                          conditions=Conditions(diffusion=False))
    assert sol.E_V[0] == pytest.approx(excited_set[star].E, abs=1e-6)


# ---- batch path on a set with a single medium --------------------------------------------------------------

def test_predict_many_on_a_one_medium_set_with_ionic_strength_given():
    cs = CoupleSet([_c("a", 3, 0.9, 1e4), _c("b", 2, 0.1, 50.0), _c("c", 1, 0.3, 1e3, ionic_strength=0.5)])
    cond = Conditions(ionic_strength_M=0.2)
    t = predict_many(cs, ["a", "a"], ["b", "c"], cond)  # used to fail: per-pair eps against per-couple arrays
    for k, red in enumerate(["b", "c"]):
        p = predict(cs, "a", red, cond, samples=0)
        assert t.log10_k_obs[k] == pytest.approx(p.log10_k_obs, abs=1e-9)
        assert t.problem[k] == ""


# ---- Monte Carlo with too few draws ------------------------------------------------------------------------

def test_one_monte_carlo_draw_is_refused_two_are_fine():
    cs = CoupleSet([_c("a", 3, 0.9, 1e4), _c("b", 2, 0.1, 50.0)])
    with pytest.raises(ConditionsError, match="at least 2"):
        predict(cs, "a", "b", samples=1)
    with pytest.raises(ConditionsError):
        predict(cs, "a", "b", samples=-5)
    p = predict(cs, "a", "b", samples=2, seed=3)
    assert math.isfinite(p.log10_k_obs_sd_mc) and p.log10_k_obs_95[0] <= p.log10_k_obs_95[1]


# ---- strict JSON at the corners ----------------------------------------------------------------------------

@pytest.mark.parametrize(
    "couples,cond",
    [
        # I = 0 and neutral couples (no work at all: the Debye factor at delta = 0).
        ([_c("n1", 0, 0.5, 1e5, ionic_strength=0.0), _c("n2", 0, -0.2, 1e4, ionic_strength=0.0)], Conditions()),
        # Huge driving force (3.5 V), deep in the inverted region, diffusion cap on.
        ([_c("x1", 3, 2.5, 1e6), _c("x2", 1, -1.0, 1e6)], Conditions()),
        # Strongly attractive pair (4+ oxidant, 3- reductant) at I = 0: k_D far above the neutral value.
        ([_c("p1", 4, 1.0, 1e5, ionic_strength=0.0), _c("m1", -2, 0.0, 1e5, ionic_strength=0.0)], Conditions()),
        # Strongly repulsive pair (4+ with 4+) at I = 0.
        ([_c("p4", 4, 1.0, 1e2, ionic_strength=0.0), _c("q4", 5, 0.0, 1e2, ionic_strength=0.0)], Conditions()),
        # Tiny lambda12: both self-exchanges within a factor 2 of the no-barrier limit (w = 0).
        ([_c("f1", 0, 0.6, 4e10), _c("f2", 0, 0.0, 4e10)], Conditions(diffusion=False)),
    ],
)
def test_predictions_at_the_corners_are_finite_and_strict_json(couples, cond):
    cs = CoupleSet(couples)
    p = predict(cs, couples[0].id, couples[1].id, cond, samples=2000, seed=1)
    d = p.to_dict()
    json.dumps(d, allow_nan=False)  # raises on NaN / Infinity
    for key in ("log10_k_act", "log10_k_diff", "log10_k_obs", "lambda_kJ_per_mol", "dG_act_kJ_per_mol",
                "ln_f12", "ln_W12", "log10_k_obs_sd_linear"):
        assert d[key] is not None and math.isfinite(d[key]), key
    if cond.diffusion:
        assert p.log10_k_obs <= min(p.log10_k_act, p.log10_k_diff) + 1e-12
    lo, hi = p.log10_k_obs_95
    assert lo <= hi
    t = predict_many(cs, [couples[0].id], [couples[1].id], cond)
    json.dumps(t.records(), allow_nan=False)
    assert t.log10_k_obs[0] == pytest.approx(p.log10_k_obs, abs=1e-9)


def test_monte_carlo_interval_near_the_diffusion_cap_stays_below_k_D():
    # A fast pair near the activationless top sits on the plateau: every draw's k_obs is below k_D
    # (1/k_obs = 1/k_act + 1/k_D). Neutral couples (no work): lambda = 4 RT ln(1e11/1e9) = 45.7 kJ/mol, and
    # -Delta G deg = F x 0.47 V = 45.3 kJ/mol, so k_act ~ Z = 1e11 > 10 k_D (k_D ~ 7e9 M^-1 s^-1).
    cs = CoupleSet([_c("a", 0, 0.47, 1e9), _c("b", 0, 0.0, 1e9)])
    p = predict(cs, "a", "b", samples=5000, seed=7)
    assert p.diffusion_controlled
    # Every draw's k_obs is below that draw's k_D, and k_D itself is uncertain (SD log10_k_diff_sd), so the
    # interval's top stays below the top of k_D's own 95 % range, log10 k_D + 1.96 SD.
    assert p.log10_k_obs_95[1] <= p.log10_k_diff + 1.96 * p.log10_k_diff_sd + 1e-12
    assert np.isfinite(p.log10_k_obs_sd_mc)


# ---- solving carries self-exchange data to the chosen medium exactly as predict() does ---------------------

def test_solve_round_trip_across_media_matches_predict():
    from crossrate.services.solving import solve_k_self

    cs = CoupleSet([
        _c("w-ox", 1, 0.60, 1e5, lambda_in=40.0),
        _c("mecn-red", 0, 0.0, 1e6, medium="acetonitrile"),
    ])
    cond = Conditions(medium="acetonitrile", allow_mixed_media=True, allow_E_other_medium=True, ionic_strength_M=0.1,
                      diffusion=False)
    p = predict(cs, "w-ox", "mecn-red", cond, samples=0)
    # The water couple's k_self is carried to acetonitrile (Pekar rescaling of its outer-sphere lambda); the
    # solver must use the same carried partner rate, or the round trip misses the unknown's k_self.
    sol = solve_k_self(cs, "mecn-red", "w-ox", 10.0 ** p.log10_k_obs, role="reductant", conditions=cond)
    assert sol.log10_k_self == pytest.approx(p.log10_k22, abs=1e-6)
    sol = solve_k_self(cs, "w-ox", "mecn-red", 10.0 ** p.log10_k_obs, role="oxidant", conditions=cond)
    assert sol.log10_k_self == pytest.approx(p.log10_k11, abs=1e-6)


def test_excited_couple_in_the_producing_role_is_flagged(excited_set):
    # *Red couple used as the oxidant: its Ox takes the electron and the excited *Red would be the product.
    p = predict(excited_set, "sens-red*", "don", samples=0)
    assert any("excited red form is formed" in w for w in p.warnings)
    # In its reacting role (reductant) there is no such warning.
    q = predict(excited_set, "acc", "sens-red*", samples=0)
    assert not any("is formed, not consumed" in w for w in q.warnings)
