"""Standard heterogeneous rate constant k0 of a couple from its self-exchange rate (Marcus 1965 relation).

Marcus related the electrode reaction of a couple to its self-exchange: the electrode's reorganization
energy is about half the self-exchange one (the reactant's image in the metal replaces a second reactant),
so with the work terms removed

    ln(k0 / Z_el) = 1/2 ln(k_ex / Z_sol) + 1/2 w_ex/RT - w_el/RT

(Marcus, J. Chem. Phys. 43, 679 (1965); commonly written k0/Z_el ~ (k_ex/Z_sol)^1/2). k_ex in M^-1 s^-1 with
its collision factor Z_sol in the same unit; k0 and Z_el in m/s (the services give cm/s).
"""

import numpy as np

from .constants import GAS_CONSTANT

#: Default electrode collision factor Z_el, m/s (1e4 cm/s; common practice for a couple of unknown mass).
DEFAULT_Z_EL_M_PER_S = 1.0e2


def electrode_collision_factor(molar_mass_kg_per_mol, T_K):
    """Z_el = (k_B T / 2 pi m)^1/2 = (R T / 2 pi M)^1/2 (gas-kinetic wall collision frequency per unit
    concentration, as in Marcus' treatment of the electrode reaction).

    Args:
        molar_mass_kg_per_mol: molar mass M of the reacting species, kg/mol (g/mol divided by 1000).
        T_K: temperature, K.

    Returns:
        Z_el, m/s.
    """
    M = np.asarray(molar_mass_kg_per_mol, dtype=float)
    return np.sqrt(GAS_CONSTANT * np.asarray(T_K, dtype=float) / (2.0 * np.pi * M))


def ln_k0_from_self_exchange(ln_k_ex, w_ex_J_per_mol, T_K, ln_Z_sol, ln_Z_el, w_el_J_per_mol=0.0):
    """ln k0 from the self-exchange rate (Marcus 1965 relation between electrode and self-exchange rates).

    ln k0 = ln Z_el + 1/2 (ln k_ex - ln Z_sol + w_ex/RT) - w_el/RT: the self-exchange barrier without its
    work term, halved (lambda_el = lambda_ex / 2), plus the work of bringing the reactant to the electrode.

    Args:
        ln_k_ex: ln of the self-exchange rate constant, ln(M^-1 s^-1).
        w_ex_J_per_mol: work term of the self-exchange pair, J/mol.
        T_K: temperature, K.
        ln_Z_sol: ln of the solution collision factor, ln(M^-1 s^-1).
        ln_Z_el: ln of the electrode collision factor, ln(m/s).
        w_el_J_per_mol: work of bringing the reactant to the reaction site at the electrode, J/mol.

    Returns:
        ln k0, ln(m/s).
    """
    RT = GAS_CONSTANT * np.asarray(T_K, dtype=float)
    half = 0.5 * (np.asarray(ln_k_ex, dtype=float) - ln_Z_sol + np.asarray(w_ex_J_per_mol, dtype=float) / RT)
    return np.asarray(ln_Z_el, dtype=float) + half - np.asarray(w_el_J_per_mol, dtype=float) / RT


def electrode_lambda(lambda_self_J_per_mol):
    """Reorganization energy at the electrode, lambda_el = lambda_ex / 2 (Marcus 1965), J/mol."""
    return 0.5 * np.asarray(lambda_self_J_per_mol, dtype=float)
