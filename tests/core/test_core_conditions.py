"""Driving force (n = 1 only) and carrying a self-exchange rate to other conditions (lambda held fixed)."""

import math

import numpy as np
import pytest
import scipy.constants as sc

from crossrate.core.barrier import self_exchange_lambda
from crossrate.core.condition_transfer import carry_ln_k_self
from crossrate.core.constants import FARADAY, GAS_CONSTANT
from crossrate.core.driving_force import ln_equilibrium_constant, reaction_free_energy
from crossrate.core.work_terms import work_term

LN_Z = math.log(1e11)


def test_reaction_free_energy_sign_and_size():
    # Delta G deg = -F (E1 - E2); 1 V downhill = -96.485 kJ/mol (scipy.constants: F = e N_A).
    assert reaction_free_energy(1.0, 0.0) == pytest.approx(-sc.e * sc.N_A, rel=1e-12)
    assert reaction_free_energy(0.2, 0.5) == pytest.approx(0.3 * FARADAY, rel=1e-12)
    np.testing.assert_allclose(reaction_free_energy(np.array([0.1, 0.2]), 0.1), [0.0, -0.1 * FARADAY], atol=1e-9)


def test_equilibrium_constant_of_a_0p1_V_step():
    # van 't Hoff isotherm: ln K = F dE / RT; 0.1 V at 25 degC: 96485.33 x 0.1 / 2478.957 = 3.8922,
    # i.e. K = 49.0 (common rule: a decade per 59.16 mV).
    lnK = ln_equilibrium_constant(reaction_free_energy(0.1, 0.0), 298.15)
    assert lnK == pytest.approx(3.8922, abs=1e-4)
    assert math.log10(math.exp(lnK)) == pytest.approx(0.1 / 0.05916, rel=1e-3)


@pytest.mark.parametrize("n", [2, 0, 3, 0.5])
def test_reaction_free_energy_refuses_n_other_than_one(n):
    with pytest.raises(ValueError) as exc:
        reaction_free_energy(0.5, 0.1, n=n)
    msg = str(exc.value)
    assert f"n = {n}" in msg and "one-electron" in msg and "only n = 1" in msg


def test_n_equal_one_accepted_explicitly():
    assert reaction_free_energy(0.5, 0.1, n=1) == pytest.approx(-0.4 * FARADAY)


COUPLE = dict(z_ox=3, z_red=2, radius_m=3.4e-10)


def _carry(lnk0, T0, I0, eps0, T, I, eps, dH=None):
    return carry_ln_k_self(lnk0, COUPLE["z_ox"], COUPLE["z_red"], COUPLE["radius_m"], T0, I0, eps0, T, I, eps,
                           LN_Z, dH_self_J_per_mol=dH)


def test_same_conditions_give_same_rate():
    lnk0 = math.log(4.2)
    assert _carry(lnk0, 298.15, 0.1, 78.36, 298.15, 0.1, 78.36) == pytest.approx(lnk0, abs=1e-12)
    assert _carry(lnk0, 298.15, 0.1, 78.36, 298.15, 0.1, 78.36, dH=40e3) == pytest.approx(lnk0, abs=1e-12)


def test_lambda_held_fixed_work_term_recomputed():
    # Documented assumption: lambda of the couple is kept, only w_ii = w(2 r) changes with I, T, eps.
    lnk0, T0, I0, eps0 = math.log(4.2), 298.15, 0.1, 78.36
    T, I, eps = 310.0, 1.0, 74.0
    lnk = _carry(lnk0, T0, I0, eps0, T, I, eps)
    d = 2 * COUPLE["radius_m"]
    lam0 = self_exchange_lambda(lnk0, work_term(3, 2, d, eps0, T0, I0), T0, LN_Z)
    lam1 = self_exchange_lambda(lnk, work_term(3, 2, d, eps, T, I), T, LN_Z)
    assert lam1 == pytest.approx(lam0, rel=1e-12)
    # Expected value written out: ln k = ln Z - (w(T, I, eps) + lambda/4) / RT.
    expected = LN_Z - (work_term(3, 2, d, eps, T, I) + lam0 / 4) / (GAS_CONSTANT * T)
    assert lnk == pytest.approx(expected, abs=1e-12)


def test_primary_salt_effect_like_charges_speed_up():
    # Brønsted-Bjerrum primary kinetic salt effect (common practice): between like-charged ions the rate
    # rises with ionic strength (screening lowers the repulsive work term).
    lnk0 = math.log(4.2)
    rates = [_carry(lnk0, 298.15, 0.1, 78.36, 298.15, I, 78.36) for I in (0.0, 0.1, 0.5, 2.0)]
    assert rates[1] == pytest.approx(lnk0, abs=1e-12)
    assert all(b > a for a, b in zip(rates, rates[1:], strict=False))


def test_eyring_temperature_step_with_activation_enthalpy():
    # Eyring equation k = (k_B T / h) exp(dS/R) exp(-dH/RT) (H. Eyring, J. Chem. Phys. 3, 107 (1935), citation from memory):
    # at fixed dH and dS, ln k(T) - ln k(T0) = ln(T/T0) - (dH/R)(1/T - 1/T0). The ionic-strength step is
    # taken first at T0 (fixed lambda), so with I = I0 and eps = eps0 only the Eyring step remains.
    lnk0, T0, T, dH = math.log(4.2), 298.15, 318.15, 43.0e3
    got = _carry(lnk0, T0, 0.1, 78.36, T, 0.1, 78.36, dH=dH)
    expected = lnk0 + math.log(T / T0) - dH / GAS_CONSTANT * (1 / T - 1 / T0)
    assert got == pytest.approx(expected, abs=1e-12)
    # 20 K up with dH = 43 kJ/mol: ln(318.15/298.15) + 43000/8.3145 x (1/298.15 - 1/318.15) = 0.0649 + 1.0904.
    assert got - lnk0 == pytest.approx(1.1553, abs=1e-3)


def test_eyring_step_after_ionic_strength_step():
    lnk0, T0, T, dH = math.log(4.2), 298.15, 318.15, 43.0e3
    at_T0_new_I = _carry(lnk0, T0, 0.1, 78.36, T0, 1.0, 78.36)
    got = _carry(lnk0, T0, 0.1, 78.36, T, 1.0, 78.36, dH=dH)
    assert got == pytest.approx(at_T0_new_I + math.log(T / T0) - dH / GAS_CONSTANT * (1 / T - 1 / T0), abs=1e-12)


def test_unknown_enthalpy_falls_back_to_fixed_lambda():
    lnk0 = np.array([math.log(4.2), math.log(4.2)])
    dH = np.array([43.0e3, np.nan])
    got = _carry(lnk0, 298.15, 0.1, 78.36, 318.15, 0.5, 78.36, dH=dH)
    fixed = _carry(lnk0[1], 298.15, 0.1, 78.36, 318.15, 0.5, 78.36)
    assert got[1] == pytest.approx(fixed, abs=1e-12)
    assert got[0] != pytest.approx(fixed, abs=1e-3)
