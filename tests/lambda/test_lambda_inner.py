"""Inner-sphere reorganization energy from bond-length changes (Marcus-Sutin harmonic formula)."""

import math

import pytest
from scipy import constants as sc

from crossrate.core.reorganization import (
    N_PER_M_PER_MDYN_PER_ANGSTROM,
    inner_sphere_lambda,
    self_exchange_inner_lambda,
)
from crossrate.library.couple import BondSet
from crossrate.services.couple_lambda import (
    LAMBDA_IN_BONDS,
    LAMBDA_IN_FIELD,
    LAMBDA_IN_NONE,
    couple_lambda_in,
)


def _breathing_mode_force_constant(wavenumber_per_cm, ligand_mass_u):
    """f = (2 pi c nu~)^2 m_L, the force constant of the symmetric M-L stretch of an ML6 complex, N/m."""
    return (2 * math.pi * sc.c * 100.0 * wavenumber_per_cm) ** 2 * ligand_mass_u * sc.atomic_mass


def test_hexaaquairon_worked_example():
    # Worked example: Fe(H2O)6 3+/2+ self-exchange, in the style of B. S. Brunschwig, C. Creutz,
    # D. H. Macartney, T.-K. Sham and N. Sutin, Faraday Discuss. Chem. Soc. 74, 113 (1982) (inputs from memory):
    # Fe-O bond-length change 0.14 A; symmetric Fe-O stretch 490 cm^-1 (Fe III) and 389 cm^-1 (Fe II).
    # Force constants, f = (2 pi c nu~)^2 m(H2O), m = 18.015 u = 2.99151e-26 kg:
    #   Fe(III): (2 pi * 2.99792e10 cm/s * 490 cm^-1)^2 = 8.5190e27 s^-2, times m = 254.85 N/m;
    #   Fe(II):  (2 pi * 2.99792e10 * 389)^2 = 5.3690e27 s^-2, times m = 160.61 N/m.
    # f_ox f_red/(f_ox + f_red) = 254.85 * 160.61 / 415.46 = 98.52 N/m; times (0.14e-10 m)^2 = 1.9310e-20 J
    # per bond; 6 bonds in each of the two partners = 12 bonds: 2.3172e-19 J, times N_A = 139.55 kJ/mol
    # (1.45 eV; lambda_in / 4 = 34.9 kJ/mol = 8.3 kcal/mol of inner-sphere barrier).
    f_ox = _breathing_mode_force_constant(490.0, 18.015)
    f_red = _breathing_mode_force_constant(389.0, 18.015)
    assert f_ox == pytest.approx(254.85, abs=0.01)
    assert f_red == pytest.approx(160.61, abs=0.01)
    lam = self_exchange_inner_lambda([6], [0.14e-10], [f_ox], [f_red])
    assert lam / 1e3 == pytest.approx(139.55, abs=0.01)
    # The same sum written over the 12 bonds explicitly.
    assert inner_sphere_lambda([12], [0.14e-10], [f_ox], [f_red]) == pytest.approx(lam, rel=1e-14)


def test_equal_force_constants_give_the_harmonic_vertical_energy():
    # Common practice (harmonic oscillator): with f_ox = f_red = f, a bond displaced by Dd stores (1/2) f Dd^2.
    # lambda is the vertical energy of the self-exchange: both partners, count bonds each, so
    # lambda = 2 * count * (1/2) f Dd^2 * N_A = count f Dd^2 N_A. With count 6, f 200 N/m, Dd 0.1 A:
    # 6 * 200 * 1e-22 = 1.2e-19 J, times N_A = 72.266 kJ/mol.
    lam = self_exchange_inner_lambda(6, 0.1e-10, 200.0, 200.0)
    assert lam == pytest.approx(6 * 200.0 * (0.1e-10) ** 2 * sc.N_A, rel=1e-12)
    assert lam / 1e3 == pytest.approx(72.266, abs=1e-3)


def test_sets_add_and_sign_of_delta_d_does_not_matter():
    one = self_exchange_inner_lambda([4], [0.05e-10], [300.0], [250.0])
    two = self_exchange_inner_lambda([2], [0.12e-10], [150.0], [100.0])
    both = self_exchange_inner_lambda([4, 2], [-0.05e-10, 0.12e-10], [300.0, 150.0], [250.0, 100.0])
    assert both == pytest.approx(one + two, rel=1e-12)
    assert self_exchange_inner_lambda([], [], [], []) == 0.0


def test_mdyn_per_angstrom_conversion():
    # Unit arithmetic (SI definitions): 1 dyn = 1e-5 N, so 1 mdyn = 1e-3 dyn = 1e-8 N; 1 A = 1e-10 m;
    # 1 mdyn/A = 1e-8 / 1e-10 = 100 N/m.
    assert N_PER_M_PER_MDYN_PER_ANGSTROM == pytest.approx(1e-3 * 1e-5 / 1e-10, rel=1e-12)


def test_couple_lambda_in_prefers_the_field_over_bonds(make):
    bonds = (BondSet(6, 0.1, 200.0, 200.0),)
    lam, code = couple_lambda_in(make("a", bonds=bonds))
    assert code == LAMBDA_IN_BONDS
    assert lam / 1e3 == pytest.approx(72.266, abs=1e-3)  # as in the harmonic check above
    lam, code = couple_lambda_in(make("b", bonds=bonds, lambda_in=30.0))
    assert (lam, code) == (30.0e3, LAMBDA_IN_FIELD)
    lam, code = couple_lambda_in(make("c"))
    assert code == LAMBDA_IN_NONE and math.isnan(lam)
