"""Facts of the trade about the Marcus barrier and the cross relation (common practice)."""

import math

import numpy as np
import pytest

from crossrate.core.barrier import (
    activation_free_energy,
    cross_lambda,
    ln_k_activated,
    self_exchange_lambda,
    self_exchange_ln_k,
    work_corrected_driving_force,
)
from crossrate.core.constants import FARADAY, GAS_CONSTANT
from crossrate.core.cross_rate import cross_rate, marcus_curve
from crossrate.core.cross_relation import ln_f12, ln_k12_cross, ln_W12

T = 298.15
RT = GAS_CONSTANT * T
LN_Z = math.log(1e11)
LAMBDAS = [20e3, 80e3, 150e3, 400e3]  # J/mol


def _neutral_pair(E1, E2, lnk11, lnk22, **kw):
    """cross_rate for two couples whose species carry no charge (all work terms zero)."""
    args = dict(T_K=T, I_M=0.1, eps_r=78.36, viscosity_Pa_s=0.89e-3, ln_Z=LN_Z)
    args.update(kw)
    return cross_rate(E1, E2, 0, 0, 0, 0, 4e-10, 4e-10, lnk11, lnk22, **args)


@pytest.mark.parametrize("lam", LAMBDAS)
def test_self_exchange_barrier_is_quarter_lambda(lam):
    # Common practice: for a self-exchange (Delta G deg = 0, no work) Delta G double-dagger = lambda / 4.
    assert activation_free_energy(lam, 0.0, 0.0) == pytest.approx(lam / 4, rel=1e-15)
    # ... and the Marcus self-exchange rate inverts self_exchange_lambda: lambda = 4 RT ln(Z / k).
    lnk = self_exchange_ln_k(lam, 0.0, T, LN_Z)
    assert lnk == pytest.approx(LN_Z - lam / (4 * RT), rel=1e-15)
    assert self_exchange_lambda(lnk, 0.0, T, LN_Z) == pytest.approx(lam, rel=1e-13)


@pytest.mark.parametrize("lam", LAMBDAS)
def test_barrier_vanishes_at_minus_dG_equal_lambda(lam):
    # Common practice: the quadratic barrier (lambda/4)(1 + dG/lambda)^2 is zero at -Delta G deg = lambda.
    assert activation_free_energy(lam, -lam, 0.0) == pytest.approx(0.0, abs=1e-9 * lam)
    # With a precursor work term the barrier is just w12 there.
    assert activation_free_energy(lam, -lam, 3.5e3) == pytest.approx(3.5e3, rel=1e-12)


@pytest.mark.parametrize("lam", LAMBDAS)
def test_barrier_at_twice_lambda_equals_that_at_zero(lam):
    # Common practice (parabola symmetric about -dG = lambda): barrier at -dG = 2 lambda equals that at dG = 0.
    assert activation_free_energy(lam, -2 * lam, 0.0) == pytest.approx(activation_free_energy(lam, 0.0, 0.0), rel=1e-14)


@pytest.mark.parametrize("lam", [40e3, 120e3])
def test_ln_k12_maximum_at_minus_dG_prime_equal_lambda12(lam):
    # Common practice: ln k12 as a function of -Delta G deg' peaks at -Delta G deg' = lambda12 (activationless
    # point), symmetric on both sides. Scanned on a 0.1 J/mol grid around lambda.
    axis = lam + np.arange(-20000, 20001) * 0.1
    ln_act, ln_obs = marcus_curve(axis, lam, 0.0, T, LN_Z)
    peak = axis[np.argmax(ln_act)]
    assert peak == pytest.approx(lam, abs=0.1)
    assert ln_act.max() == pytest.approx(LN_Z, abs=1e-9)
    np.testing.assert_allclose(ln_act, ln_act[::-1], rtol=0, atol=1e-9)
    np.testing.assert_array_equal(ln_obs, ln_act)  # no cap requested


def test_cross_rate_peak_sits_at_lambda12_through_the_potentials():
    # Same fact through cross_rate (neutral couples: dG' = dG = -F(E1 - E2)): scanning E1, the largest
    # ln k_act is where F(E1 - E2) = lambda12 = (lambda11 + lambda22)/2.
    lnk11, lnk22 = math.log(1e3), math.log(1e-2)
    lam12 = 0.5 * (4 * RT * (LN_Z - lnk11) + 4 * RT * (LN_Z - lnk22))
    E1 = np.linspace(0.0, 3.0, 300001)  # 10 uV steps
    res = _neutral_pair(E1, 0.0, lnk11, lnk22, diffusion=False)
    E_peak = E1[np.argmax(res.ln_k_act)]
    assert FARADAY * E_peak == pytest.approx(lam12, abs=FARADAY * 1e-5)
    np.testing.assert_allclose(res.lambda12, lam12, rtol=1e-13)


def test_cross_relation_reduces_to_geometric_mean_at_zero_driving_force():
    # Common practice: with K12 = 1 and no work, f12 = 1 and k12 = (k11 k22)^(1/2).
    lnk11, lnk22 = math.log(4e5), math.log(2.5e-1)
    res = _neutral_pair(0.3, 0.3, lnk11, lnk22, diffusion=False)
    assert float(res.ln_f12) == 0.0
    assert float(res.ln_k_act) == pytest.approx(0.5 * (lnk11 + lnk22), abs=1e-12)


def test_cross_relation_with_no_work_textbook_form():
    # Marcus cross relation without work terms (R. A. Marcus, J. Chem. Phys. 43, 679 (1965), citation from memory):
    # ln f = (ln K12)^2 / (4 ln(k11 k22 / Z^2)); example k11 = 1e4, k22 = 1e2, dE = 0.3 V:
    # ln K = F x 0.3 / RT = 11.677; ln(k11 k22/Z^2) = ln(1e-16) = -36.841; ln f = 136.36 / -147.36 = -0.9253.
    lnK = FARADAY * 0.3 / RT
    expected_lnf = lnK**2 / (4 * math.log(1e4 * 1e2 / 1e22))
    res = _neutral_pair(0.3, 0.0, math.log(1e4), math.log(1e2), diffusion=False)
    assert float(res.ln_K12) == pytest.approx(lnK, rel=1e-14)
    assert float(res.ln_f12) == pytest.approx(expected_lnf, rel=1e-12)
    assert float(res.ln_f12) == pytest.approx(-0.9253, abs=2e-4)
    assert float(res.ln_k_act) == pytest.approx(0.5 * (math.log(1e6) + lnK + expected_lnf), rel=1e-13)


def test_cross_relation_pieces_match_barrier_pieces():
    # The pieces compose as the published formulas say (work terms in J/mol).
    w11, w22, w12, w21 = 2e3, -1e3, 1.5e3, -0.4e3
    lnk11, lnk22, lnK = math.log(3e2), math.log(7e5), 4.2
    lnf = ln_f12(lnK, lnk11, lnk22, w11, w22, w12, w21, T, LN_Z)
    assert lnf == pytest.approx((lnK + (w12 - w21) / RT) ** 2 / (4 * (lnk11 + lnk22 - 2 * LN_Z + (w11 + w22) / RT)))
    assert ln_W12(w11, w22, w12, w21, T) == pytest.approx(-(w12 + w21 - w11 - w22) / (2 * RT))
    lnk12 = ln_k12_cross(lnk11, lnk22, lnK, lnf, ln_W12(w11, w22, w12, w21, T))
    lam = cross_lambda(self_exchange_lambda(lnk11, w11, T, LN_Z), self_exchange_lambda(lnk22, w22, T, LN_Z))
    dGp = work_corrected_driving_force(-lnK * RT, w12, w21)
    assert lnk12 == pytest.approx(ln_k_activated(activation_free_energy(lam, dGp, w12), T, LN_Z), abs=1e-12)


def test_diffusion_switch_and_cap():
    # 1/k_obs = 1/k_act + 1/k_D: near the activationless point (lambda12 = 4 RT ln 100 = 45.7 kJ/mol, F x 0.47 V
    # = 45.3 kJ/mol) k_act ~ Z = 1e11 exceeds 10 k_D (7.4e9): capped and flagged; the switch turns the cap off.
    res = _neutral_pair(0.47, 0.0, math.log(1e9), math.log(1e9))
    assert float(res.ln_k_obs) == pytest.approx(-np.logaddexp(-res.ln_k_act, -res.ln_k_diff), abs=1e-12)
    assert float(res.ln_k_obs) < float(res.ln_k_diff) < float(res.ln_k_act)
    assert bool(res.diffusion_controlled)
    off = _neutral_pair(0.47, 0.0, math.log(1e9), math.log(1e9), diffusion=False)
    assert float(off.ln_k_obs) == float(off.ln_k_act)
    assert not bool(off.diffusion_controlled)
