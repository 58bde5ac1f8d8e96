"""Electrostatic work terms with ionic-strength screening (Debye-Hueckel-Brønsted form)."""

import numpy as np

from .constants import AVOGADRO, BOLTZMANN, ELEMENTARY_CHARGE, VACUUM_PERMITTIVITY


def debye_kappa(ionic_strength_M, eps_r, T_K):
    """Inverse Debye screening length, kappa^2 = 2 N_A e^2 I 1000 / (eps0 eps_s k_B T) (Debye-Hueckel theory).

    Args:
        ionic_strength_M: ionic strength I, mol/L (the factor 1000 converts to mol/m^3).
        eps_r: relative permittivity of the solvent (dimensionless).
        T_K: temperature, K.

    Returns:
        kappa, 1/m.
    """
    I = np.asarray(ionic_strength_M, dtype=float)
    num = 2.0 * AVOGADRO * ELEMENTARY_CHARGE**2 * I * 1000.0
    return np.sqrt(num / (VACUUM_PERMITTIVITY * np.asarray(eps_r, dtype=float) * BOLTZMANN * np.asarray(T_K, dtype=float)))


def work_term(z1, z2, distance_m, eps_r, T_K, ionic_strength_M):
    """Coulomb work to bring two ions to distance r, screened by the ionic atmosphere.

    w = z1 z2 e^2 N_A / (4 pi eps0 eps_s r (1 + kappa r))  (Debye-Hueckel-Brønsted work term, as used in
    the Marcus cross relation).

    Args:
        z1, z2: charges of the two reactants (integers, in units of e).
        distance_m: centre-to-centre distance r at reaction, m.
        eps_r: relative permittivity of the solvent.
        T_K: temperature, K.
        ionic_strength_M: ionic strength, mol/L.

    Returns:
        w, J/mol.
    """
    r = np.asarray(distance_m, dtype=float)
    kappa = debye_kappa(ionic_strength_M, eps_r, T_K)
    zz = np.asarray(z1, dtype=float) * np.asarray(z2, dtype=float)
    coulomb = ELEMENTARY_CHARGE**2 * AVOGADRO / (4.0 * np.pi * VACUUM_PERMITTIVITY * np.asarray(eps_r, dtype=float) * r)
    return zz * coulomb / (1.0 + kappa * r)
