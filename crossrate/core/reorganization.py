"""Reorganization energies from structure and solvent: the Marcus two-sphere outer-sphere term and the
inner-sphere term from bond-length changes.

Conventions (documented in the README):
* lambda_out: Marcus two-sphere (dielectric continuum) model,
  lambda_out = (Delta e)^2 N_A / (4 pi eps0) [1/(2 a1) + 1/(2 a2) - 1/r] (1/n^2 - 1/eps_s),
  with a1, a2 the reactant radii, r their centre-to-centre distance and (1/n^2 - 1/eps_s) the Pekar factor.
  For a self-exchange a1 = a2 = a and r = 2a, so the bracket is 1/(2a).
* lambda_in: Marcus-Sutin harmonic bond-change formula,
  lambda_in = sum_j [f_ox,j f_red,j / (f_ox,j + f_red,j)] (Delta d_j)^2,
  the sum running over every bond that changes, in *both* reactants. The bracket is half the reduced force
  constant 2 f_ox f_red / (f_ox + f_red), so each term is the harmonic energy (1/2) f (Delta d)^2 of one bond
  displaced by Delta d when f_ox = f_red = f. A self-exchange Ox + Red has each bond set twice (once in the
  oxidized partner, once in the reduced one): self_exchange_inner_lambda counts it twice.
Units: metres, N/m (1 mdyn/angstrom = 100 N/m), J/mol out.
"""

import numpy as np

from .constants import AVOGADRO, ELEMENTARY_CHARGE, VACUUM_PERMITTIVITY

#: N/m per mdyn/angstrom (1 mdyn = 1e-8 N, 1 angstrom = 1e-10 m).
N_PER_M_PER_MDYN_PER_ANGSTROM = 100.0
#: (e^2 N_A / 4 pi eps0), J m / mol: the molar Coulomb constant for unit charges.
_COULOMB_MOLAR = ELEMENTARY_CHARGE**2 * AVOGADRO / (4.0 * np.pi * VACUUM_PERMITTIVITY)


def pekar_factor(n_D, eps_s):
    """Pekar factor 1/n^2 - 1/eps_s (dimensionless): the optical minus static dielectric response.

    Args:
        n_D: refractive index (n^2 approximates the optical permittivity eps_op).
        eps_s: static relative permittivity.
    """
    return 1.0 / np.asarray(n_D, dtype=float) ** 2 - 1.0 / np.asarray(eps_s, dtype=float)


def outer_sphere_lambda(a1_m, a2_m, distance_m, pekar, charge_transferred=1.0):
    """Outer-sphere reorganization energy of a pair, Marcus two-sphere model.

    lambda_out = (Delta e)^2 N_A/(4 pi eps0) [1/(2 a1) + 1/(2 a2) - 1/r] (1/n^2 - 1/eps_s).

    Args:
        a1_m, a2_m: radii of the two reactants, m.
        distance_m: centre-to-centre distance r at electron transfer, m (a1 + a2 at contact).
        pekar: Pekar factor 1/n^2 - 1/eps_s of the solvent (dimensionless).
        charge_transferred: Delta e in units of e (1 for the one-electron steps crossrate handles).

    Returns:
        lambda_out, J/mol.
    """
    a1 = np.asarray(a1_m, dtype=float)
    a2 = np.asarray(a2_m, dtype=float)
    r = np.asarray(distance_m, dtype=float)
    geometry = 0.5 / a1 + 0.5 / a2 - 1.0 / r
    return float(charge_transferred) ** 2 * _COULOMB_MOLAR * geometry * np.asarray(pekar, dtype=float)


def self_exchange_outer_lambda(radius_m, pekar):
    """lambda_out of a self-exchange (two-sphere model with a1 = a2 = a, r = 2a): e^2 N_A/(4 pi eps0) / (2a) * Pekar.

    Args: radius_m in m; pekar dimensionless.  Returns J/mol.
    """
    a = np.asarray(radius_m, dtype=float)
    return outer_sphere_lambda(a, a, 2.0 * a, pekar)


def inner_sphere_lambda(count, delta_d_m, f_ox_N_per_m, f_red_N_per_m):
    """Inner-sphere reorganization energy, sum_j count_j [f_ox f_red/(f_ox + f_red)] (Delta d_j)^2 N_A.

    Marcus-Sutin harmonic bond-change formula, summed over exactly the bonds given (count_j of each set).
    For a self-exchange use self_exchange_inner_lambda, which counts the bonds of both partners.

    Args:
        count: number of equivalent bonds in each set (array over sets).
        delta_d_m: bond-length change between the two forms, m (sign irrelevant).
        f_ox_N_per_m, f_red_N_per_m: force constants of the bond in the oxidized and reduced forms, N/m.

    Returns:
        lambda_in, J/mol (a scalar: the sum over the sets; 0.0 for no sets).
    """
    n = np.asarray(count, dtype=float)
    dd = np.asarray(delta_d_m, dtype=float)
    fo = np.asarray(f_ox_N_per_m, dtype=float)
    fr = np.asarray(f_red_N_per_m, dtype=float)
    per_bond = fo * fr / (fo + fr) * dd * dd
    return float(np.sum(n * per_bond)) * AVOGADRO


def self_exchange_inner_lambda(count, delta_d_m, f_ox_N_per_m, f_red_N_per_m):
    """lambda_in of a couple's self-exchange Ox + Red -> Red + Ox: each bond set appears in both partners.

    count is the number of bonds in one molecule (e.g. 6 metal-ligand bonds of an octahedral complex);
    the self-exchange sums over 2 x count bonds.  Units as inner_sphere_lambda; returns J/mol.
    """
    return inner_sphere_lambda(2.0 * np.asarray(count, dtype=float), delta_d_m, f_ox_N_per_m, f_red_N_per_m)
