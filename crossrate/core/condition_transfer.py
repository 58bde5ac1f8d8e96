"""Carrying a self-exchange rate constant from the conditions it was measured under to target conditions.

Assumption (documented in the README): the reorganization energy lambda is a property of the couple and
is held fixed; only the electrostatic work term is recomputed for the new ionic strength, temperature and
solvent permittivity. Where the couple gives an activation enthalpy of its self-exchange, the temperature
step uses the Eyring form with that enthalpy instead, after the ionic-strength (and solvent) step taken at the
original temperature T0 with the target solvent's permittivity at T0.

ln_Z may be an array: pass ln(kappa_el Z) per couple for non-adiabatic couples, so that lambda is read from
k_ii = kappa_el Z exp(-(w_ii + lambda/4)/RT) consistently with crossrate.core.cross_rate.
"""

import numpy as np

from .barrier import self_exchange_lambda, self_exchange_ln_k
from .constants import GAS_CONSTANT
from .work_terms import work_term


def carry_ln_k_self(
    ln_k_self0, z_ox, z_red, radius_m, T0_K, I0_M, eps0, T_K, I_M, eps, ln_Z, dH_self_J_per_mol=None,
    eps_at_T0=None,
):
    """ln k_ii at (T, I, eps) from ln k_ii measured at (T0, I0, eps0); arrays broadcast.

    Args:
        ln_k_self0: ln of the measured self-exchange rate, ln(M^-1 s^-1).
        z_ox, z_red: charges of the couple's oxidized and reduced forms.
        radius_m: couple radius, m (self-exchange distance 2 radius).
        T0_K, I0_M, eps0: temperature (K), ionic strength (mol/L) and relative permittivity of the measurement.
        T_K, I_M, eps: target temperature, ionic strength and permittivity.
        ln_Z: ln of the collision factor, ln(M^-1 s^-1) (ln(kappa_el Z) for a non-adiabatic couple).
        dH_self_J_per_mol: Eyring activation enthalpy Delta H double-dagger of the self-exchange, J/mol, or
            None / NaN where unknown.
        eps_at_T0: relative permittivity of the target solvent at T0, for the ionic-strength step of the
            Eyring route; None takes eps (exact for solvents held at their 25 degC values).

    Returns:
        ln k_ii at the target conditions, ln(M^-1 s^-1).
    """
    d = 2.0 * np.asarray(radius_m, dtype=float)
    w0 = work_term(z_ox, z_red, d, eps0, T0_K, I0_M)
    lam = self_exchange_lambda(ln_k_self0, w0, T0_K, ln_Z)
    fixed_lambda = self_exchange_ln_k(lam, work_term(z_ox, z_red, d, eps, T_K, I_M), T_K, ln_Z)
    if dH_self_J_per_mol is None:
        return fixed_lambda
    dH = np.asarray(dH_self_J_per_mol, dtype=float)
    # Ionic-strength (and solvent) step at the measurement temperature, then the Eyring temperature step:
    # ln k(T) = ln k(T0) + ln(T/T0) - (dH/R)(1/T - 1/T0).
    eps_T0 = eps if eps_at_T0 is None else eps_at_T0
    at_T0 = self_exchange_ln_k(lam, work_term(z_ox, z_red, d, eps_T0, T0_K, I_M), T0_K, ln_Z)
    T = np.asarray(T_K, dtype=float)
    T0 = np.asarray(T0_K, dtype=float)
    eyring = at_T0 + np.log(T / T0) - np.nan_to_num(dH) / GAS_CONSTANT * (1.0 / T - 1.0 / T0)
    return np.where(np.isfinite(dH), eyring, fixed_lambda)
