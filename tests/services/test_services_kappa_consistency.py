"""kappa_el (non-adiabatic couples) is treated the same way by prediction, batch, map, screening, solving,
the curves and the lambda breakdown: lambda_ii read from k_ii / (kappa_ii Z), k12 = kappa12 Z exp(-dG_act/RT)
with kappa12 = (kappa11 kappa22)^(1/2) (model stated in crossrate.core.cross_rate; the geometric-mean rule is
common practice, Marcus & Sutin, Biochim. Biophys. Acta 811, 265 (1985), from memory).

The couples are invented for these tests.
"""

import math

import numpy as np
import pytest

from crossrate.core.constants import GAS_CONSTANT, KJ
from crossrate.library.couple import Couple
from crossrate.library.couple_set import CoupleSet
from crossrate.services.batch_prediction import predict_many
from crossrate.services.conditions import Conditions
from crossrate.services.curves import driving_force_curve
from crossrate.services.lambda_estimate import lambda_breakdown
from crossrate.services.prediction import predict
from crossrate.services.rate_map import rate_map
from crossrate.services.screening import screen
from crossrate.services.self_exchange import self_exchange_at
from crossrate.services.solving import solve_k_self, solve_potential

T = 298.15
RT = GAS_CONSTANT * T
LN10 = math.log(10.0)


def _c(cid, z, E, k=None, **kw):
    base = dict(id=cid, name=cid, charge_ox=z, charge_red=z - 1, E=E, E_scale="SHE", radius=kw.pop("radius", 4.5),
                medium="water", ionic_strength=0.1, temperature=T, source="invented for a test", k_self=k,
                E_sd=0.01, k_self_log10_sd=0.3, verified=True)
    base.update(kw)
    return Couple(**base)


@pytest.fixture(scope="module")
def cs():
    return CoupleSet([
        _c("ox-a", 3, 0.95, 1e4),                          # adiabatic oxidant
        _c("red-na", 0, -0.20, 3e6, kappa_el=0.3),          # non-adiabatic reductant, measured k_self
        _c("red-est", 1, 0.10, None, lambda_total=150.0, kappa_el=0.2),  # non-adiabatic, from lambda_total
        _c("red-b", 2, 0.05, 50.0),                         # adiabatic reductant
    ])


def test_prediction_lambda_is_the_lambda_of_the_breakdown(cs):
    p = predict(cs, "ox-a", "red-na", samples=0)
    se = self_exchange_at(cs, cs.index_of(["ox-a", "red-na"]), T, 0.1, p.conditions.relative_permittivity,
                          math.log(1e11), medium="water")
    # The lambda shown for the non-adiabatic couple is the one its k_self implies with kappa_el Z,
    # lambda = 4 (RT ln(kappa Z/k) - w): the same number the lambda breakdown (crossrate lambda) prints.
    assert p.lambda22_kJ_per_mol == pytest.approx(se.lambda_J[1] / KJ, abs=1e-9)
    b = lambda_breakdown(cs, "red-na")
    assert p.lambda22_kJ_per_mol == pytest.approx(b.lambda_measured_kJ_per_mol, abs=1e-6)
    # Hand check: w22 = 0 (charges 0 and -1), so lambda22 = 4 RT ln(0.3e11 / 3e6).
    assert p.lambda22_kJ_per_mol == pytest.approx(4 * RT * math.log(0.3e11 / 3e6) / KJ, rel=1e-12)
    assert p.kappa_el12 == pytest.approx(math.sqrt(0.3), rel=1e-12)


def test_estimated_non_adiabatic_couple_keeps_its_given_lambda(cs):
    # k_self = kappa Z exp(-(w + lambda/4)/RT) from lambda_total = 150 kJ/mol; the prediction must read back
    # exactly 150 kJ/mol (before the fix it showed 150 - 4 RT ln 0.2 = 166 kJ/mol).
    p = predict(cs, "ox-a", "red-est", samples=0)
    assert p.lambda22_kJ_per_mol == pytest.approx(150.0, abs=1e-9)
    assert p.kappa_el12 == pytest.approx(math.sqrt(0.2), rel=1e-12)


def test_k_act_is_kappa12_z_exp_minus_barrier(cs):
    p = predict(cs, "ox-a", "red-na", Conditions(diffusion=False), samples=0)
    # ln k_act = ln(kappa12 Z) - dG_act/RT (barrier form), log10 units.
    expected = (math.log(p.kappa_el12 * 1e11) - p.dG_act_kJ_per_mol * KJ / RT) / LN10
    assert p.log10_k_act == pytest.approx(expected, abs=1e-9)
    # And the cross-relation form: log10 k12 = [log10 k11 + log10 k22 + log10 K12 + ln f12/ln10]/2 + ln W12/ln10.
    cross = 0.5 * (p.log10_k11 + p.log10_k22 + p.log10_K12 + p.ln_f12 / LN10) + p.ln_W12 / LN10
    assert p.log10_k_act == pytest.approx(cross, abs=1e-9)


def test_curve_passes_through_the_pair(cs):
    p = predict(cs, "ox-a", "red-na", samples=0)
    c = driving_force_curve(p, points=11)
    x = np.append(c.minus_dG0_prime_kJ, c.pair_x_kJ)
    from crossrate.core.cross_rate import marcus_curve

    act, _ = marcus_curve(x * KJ, p.lambda_kJ_per_mol * KJ, p.work_kJ_per_mol.w12 * KJ, T, math.log(1e11),
                          ln_kappa12=math.log(p.kappa_el12))
    np.testing.assert_allclose(act[:-1] / LN10, c.log10_k_act, rtol=0, atol=1e-12)
    assert act[-1] / LN10 == pytest.approx(p.log10_k_act, abs=1e-9)


@pytest.mark.parametrize("red", ["red-na", "red-est", "red-b"])
def test_batch_map_and_screen_agree_with_predict(cs, red):
    p = predict(cs, "ox-a", red, samples=0)
    t = predict_many(cs, ["ox-a"], [red])
    assert t.log10_k_obs[0] == pytest.approx(p.log10_k_obs, abs=1e-9)
    assert t.lambda_kJ_per_mol[0] == pytest.approx(p.lambda_kJ_per_mol, abs=1e-9)
    assert t.log10_k_obs_sd_linear[0] == pytest.approx(p.log10_k_obs_sd_linear, rel=1e-4)
    m = rate_map(cs)
    i, j = m.ids.index("ox-a"), m.ids.index(red)
    assert m.log10_k_obs[i, j] == pytest.approx(p.log10_k_obs, abs=1e-9)
    s = screen(cs, "ox-a", role="oxidant")
    row = s.partner.index(red)
    assert s.table.log10_k_obs[row] == pytest.approx(p.log10_k_obs, abs=1e-9)


@pytest.mark.parametrize("unknown,partner", [("red-na", "ox-a"), ("ox-a", "red-na"), ("red-est", "ox-a")])
def test_solving_round_trip_with_non_adiabatic_couples(cs, unknown, partner):
    ox, red = (partner, unknown) if unknown.startswith("red") else (unknown, partner)
    p = predict(cs, ox, red, Conditions(diffusion=False), samples=0)
    k = 10.0 ** p.log10_k_obs
    role = "reductant" if unknown.startswith("red") else "oxidant"
    sol = solve_k_self(cs, unknown, partner, k, role=role, conditions=Conditions(diffusion=False))
    own = p.log10_k22 if role == "reductant" else p.log10_k11
    assert sol.log10_k_self == pytest.approx(own, abs=1e-6)
    lam_own = p.lambda22_kJ_per_mol if role == "reductant" else p.lambda11_kJ_per_mol
    assert sol.lambda_unknown_kJ_per_mol == pytest.approx(lam_own, abs=1e-5)
    pot = solve_potential(cs, unknown, partner, k, role=role, conditions=Conditions(diffusion=False))
    assert pot.E_V[0] == pytest.approx(cs[unknown].E, abs=1e-6)
    assert pot.lambda_kJ_per_mol == pytest.approx(p.lambda_kJ_per_mol, abs=1e-6)


def test_no_barrier_limit_uses_kappa_z():
    # w = 0 (charges 0/-1), kappa = 0.1: kappa Z = 1e10. A k_self of 3e10 is below Z but above kappa Z, so its
    # lambda = 4 RT ln(1e10 / 3e10) < 0: refused with the reason naming kappa_el.
    cs = CoupleSet([_c("ox-a", 3, 0.95, 1e4), _c("fast", 0, -0.2, 3e10, kappa_el=0.1)])
    from crossrate.errors import ScienceError

    with pytest.raises(ScienceError, match="kappa_el = 0.1"):
        predict(cs, "ox-a", "fast", samples=0)


def test_map_diagonal_of_a_non_adiabatic_couple_is_its_self_exchange_rate(cs):
    # Ox + Red of the same couple: Delta G deg = 0, w12 = w21 = w11, lambda12 = lambda11, kappa12 = kappa11, so
    # k = kappa Z exp(-(w + lambda/4)/RT) = k_self itself (diffusion cap off).
    m = rate_map(cs, conditions=Conditions(diffusion=False))
    p = predict(cs, "ox-a", "red-na", Conditions(diffusion=False), samples=0)
    i = m.ids.index("red-na")
    assert m.log10_k_obs[i, i] == pytest.approx(p.log10_k22, abs=1e-9)
    assert p.log10_k22 == pytest.approx(math.log10(3e6), abs=1e-9)
