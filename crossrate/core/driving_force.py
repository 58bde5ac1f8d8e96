"""Standard free energy of the cross reaction Ox1 + Red2 -> Red1 + Ox2 and its equilibrium constant."""

import numpy as np

from .constants import FARADAY, GAS_CONSTANT


def reaction_free_energy(E_oxidant_V, E_reductant_V, n=1):
    """Standard free energy of reaction, Delta G deg = -nF(E1 - E2) (Nernst relation).

    Args:
        E_oxidant_V: formal potential E1 of the oxidant's couple Ox1/Red1, V (any scale, same as E2).
        E_reductant_V: formal potential E2 of the reductant's couple Ox2/Red2, V.
        n: electrons transferred; the cross relation holds for one-electron steps only, so only 1 is accepted.

    Returns:
        Delta G deg in J/mol (negative when the reaction is downhill).
    """
    if n != 1:
        raise ValueError(
            f"n = {n}: the Marcus cross relation describes one-electron outer-sphere steps; only n = 1 is supported"
        )
    return -FARADAY * (np.asarray(E_oxidant_V, dtype=float) - np.asarray(E_reductant_V, dtype=float))


def ln_equilibrium_constant(dG0_J_per_mol, T_K):
    """Natural log of the equilibrium constant, ln K12 = -Delta G deg / RT (van 't Hoff isotherm).

    Args:
        dG0_J_per_mol: standard free energy of reaction, J/mol.
        T_K: temperature, K.

    Returns:
        ln K12 (dimensionless).
    """
    return -np.asarray(dG0_J_per_mol, dtype=float) / (GAS_CONSTANT * np.asarray(T_K, dtype=float))
