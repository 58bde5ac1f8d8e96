"""Marcus barrier form: reorganization energies, work-corrected driving force and activation free energy."""

import numpy as np

from .constants import GAS_CONSTANT


def self_exchange_lambda(ln_k_self, w_self, T_K, ln_Z):
    """Reorganization energy implied by a self-exchange rate: lambda = 4 (RT ln(Z/k_ii) - w_ii).

    Marcus relation for a self-exchange (Delta G deg = 0): k_ii = Z exp(-(w_ii + lambda/4)/RT). For a
    non-adiabatic couple pass ln(kappa_el Z) as ln_Z (k_ii = kappa_el Z exp(...); see cross_rate).

    Args:
        ln_k_self: ln k_ii, ln(M^-1 s^-1).
        w_self: self-exchange work term w_ii, J/mol.
        T_K: temperature, K.
        ln_Z: ln Z, ln(M^-1 s^-1).

    Returns:
        lambda_ii, J/mol.
    """
    RT = GAS_CONSTANT * np.asarray(T_K, dtype=float)
    return 4.0 * (RT * (ln_Z - ln_k_self) - w_self)


def self_exchange_ln_k(lambda_J_per_mol, w_self, T_K, ln_Z):
    """ln k_ii = ln Z - (w_ii + lambda/4)/RT (Marcus self-exchange rate, adiabatic).

    Args: lambda and w_self in J/mol, T_K in K, ln_Z in ln(M^-1 s^-1).  Returns ln(M^-1 s^-1).
    """
    RT = GAS_CONSTANT * np.asarray(T_K, dtype=float)
    return ln_Z - (w_self + 0.25 * np.asarray(lambda_J_per_mol, dtype=float)) / RT


def cross_lambda(lambda11, lambda22):
    """lambda12 = (lambda11 + lambda22)/2 (Marcus additivity postulate).  J/mol in, J/mol out."""
    return 0.5 * (np.asarray(lambda11, dtype=float) + np.asarray(lambda22, dtype=float))


def work_corrected_driving_force(dG0, w12, w21):
    """Delta G deg' = Delta G deg + w21 - w12, the free energy change between precursor and successor complexes.

    Args and return in J/mol.
    """
    return dG0 + w21 - w12


def activation_free_energy(lambda12, dG0_prime, w12):
    """Delta G double-dagger = w12 + (lambda/4)(1 + Delta G deg'/lambda)^2 (Marcus quadratic barrier).

    Args and return in J/mol.
    """
    lam = np.asarray(lambda12, dtype=float)
    return w12 + 0.25 * lam * (1.0 + dG0_prime / lam) ** 2


def ln_k_activated(dG_act, T_K, ln_Z):
    """ln k = ln Z - Delta G double-dagger / RT (activation-controlled rate).  ln(M^-1 s^-1)."""
    return ln_Z - dG_act / (GAS_CONSTANT * np.asarray(T_K, dtype=float))
