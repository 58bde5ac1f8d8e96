"""Array-level Marcus free-energy relationship for a driving-force series (one couple, many partners).

These are the model equations the series fit uses; they hold no fitting logic:

* Marcus quadratic free-energy relationship (activation control):
  ln k_act = ln A - (lambda + Delta G deg)^2 / (4 lambda RT);
* the same curve with no inverted region (the barrier is held at 0 once -Delta G deg >= lambda, so the
  activation-controlled rate rises through the normal region and levels off at A): the comparison model of
  the inverted-region test;
* the steady-state combination with diffusion, 1/k_obs = 1/k_act + 1/k_D (crossrate.core.diffusion).

Energies in J/mol, temperatures in K, rates as natural logs of M^-1 s^-1.
"""

import numpy as np

from .constants import GAS_CONSTANT
from .diffusion import ln_k_observed


def marcus_ln_k_act(dG0_J_per_mol, lambda_J_per_mol, ln_A, T_K):
    """ln k_act = ln A - (lambda + Delta G deg)^2 / (4 lambda RT) (Marcus quadratic free-energy relationship).

    Args:
        dG0_J_per_mol: standard free energy of each step, J/mol (negative = downhill); array.
        lambda_J_per_mol: reorganization energy lambda, J/mol (> 0).
        ln_A: ln of the pre-exponential factor A, ln(M^-1 s^-1).
        T_K: temperature, K.

    Returns:
        ln k_act, ln(M^-1 s^-1), same shape as dG0.
    """
    x = np.asarray(dG0_J_per_mol, dtype=float)
    lam = float(lambda_J_per_mol) if np.ndim(lambda_J_per_mol) == 0 else np.asarray(lambda_J_per_mol, dtype=float)
    RT = GAS_CONSTANT * np.asarray(T_K, dtype=float)
    return ln_A - (lam + x) ** 2 / (4.0 * lam * RT)


def plateau_ln_k_act(dG0_J_per_mol, lambda_J_per_mol, ln_A, T_K):
    """ln k_act of a Marcus curve with no inverted region: the barrier is held at 0 past -Delta G deg = lambda.

    ln k_act = ln A - (lambda + Delta G deg)^2 / (4 lambda RT) while -Delta G deg < lambda, else ln A
    (the activation-controlled rising branch levels off at A instead of falling again). Same arguments and
    units as marcus_ln_k_act.
    """
    x = np.asarray(dG0_J_per_mol, dtype=float)
    lam = float(lambda_J_per_mol) if np.ndim(lambda_J_per_mol) == 0 else np.asarray(lambda_J_per_mol, dtype=float)
    marcus = marcus_ln_k_act(x, lam, ln_A, T_K)
    return np.where(-x < lam, marcus, ln_A + 0.0 * marcus)


def series_ln_k_obs(ln_k_act, ln_k_diff=None):
    """ln k_obs with 1/k_obs = 1/k_act + 1/k_D, or ln k_act when ln_k_diff is None (no diffusion cap).

    Args and return: natural logs of rate constants in M^-1 s^-1.
    """
    if ln_k_diff is None:
        return np.asarray(ln_k_act, dtype=float)
    return ln_k_observed(ln_k_act, ln_k_diff)


def minus_dG0_at_maximum(lambda_J_per_mol):
    """-Delta G deg of the fastest activation-controlled rate: -Delta G deg = lambda (Marcus, barrier vanishes).

    J/mol in, J/mol out.
    """
    return np.asarray(lambda_J_per_mol, dtype=float)
