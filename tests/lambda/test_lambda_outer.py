"""Outer-sphere reorganization energy (Marcus two-sphere model) and the Pekar factor of the solvent table."""

import math

import numpy as np
import pytest
from scipy import constants as sc

from crossrate.core.reorganization import (
    outer_sphere_lambda,
    pekar_factor,
    self_exchange_outer_lambda,
)
from crossrate.core.solvents import get_solvent


def test_two_3p5_angstrom_spheres_at_contact_in_water_hand_calculation():
    # Source: Marcus two-sphere formula (R. A. Marcus, J. Chem. Phys. 24, 966 (1956); as written in issue 7),
    # lambda_out = (De)^2 N_A/(4 pi eps0) [1/(2 a1) + 1/(2 a2) - 1/r] (1/n^2 - 1/eps_s).
    # Hand calculation:
    #   e^2 N_A/(4 pi eps0) = 1.389354e-4 J m/mol = 1389.354 kJ/mol * angstrom (the same number as the
    #   electrostatic conversion factor 138.935458 kJ mol^-1 nm e^-2 of the GROMACS manual);
    #   a1 = a2 = 3.5 A, r = 7.0 A: 1/7 + 1/7 - 1/7 = 1/7 A^-1 = 0.142857 A^-1;
    #   1389.354 * 0.142857 = 198.479 kJ/mol;
    #   Pekar factor of water from the solvent table at 25 degC: n = 1.3325, eps_s(298.15 K) from
    #   Malmberg-Maryott = 87.740 - 0.40008*25 + 9.398e-4*625 - 1.410e-6*15625 = 78.30334;
    #   1/1.3325^2 - 1/78.30334 = 0.563204 - 0.012771 = 0.550433;
    #   lambda_out = 198.479 * 0.550433 = 109.25 kJ/mol (1.132 eV).
    water = get_solvent("water")
    pekar = float(water.pekar_factor(298.15))
    assert pekar == pytest.approx(0.550433, abs=2e-6)
    lam = outer_sphere_lambda(3.5e-10, 3.5e-10, 7.0e-10, pekar)
    assert lam / 1e3 == pytest.approx(198.479 * 0.550433, rel=2e-5)
    assert lam / 1e3 == pytest.approx(109.25, abs=0.01)
    # The self-exchange form (a1 = a2 = a, r = 2a) is the same number.
    assert self_exchange_outer_lambda(3.5e-10, pekar) == pytest.approx(lam, rel=1e-12)


def test_molar_coulomb_constant_from_scipy_constants():
    # Source: scipy.constants (CODATA 2018): e, N_A, epsilon_0. 1/(2a) with a = 1 m and Pekar 1 isolates it.
    expected = sc.e**2 * sc.N_A / (4 * math.pi * sc.epsilon_0)
    assert self_exchange_outer_lambda(0.5, 1.0) == pytest.approx(expected, rel=1e-12)
    # And the GROMACS manual's conversion factor f = 138.935458 kJ mol^-1 nm e^-2.
    assert expected == pytest.approx(138.935458e3 * 1e-9, rel=1e-7)


def test_cross_pair_geometry():
    # Source: the two-sphere formula itself (issue 7): unequal spheres at contact, r = a1 + a2.
    # a1 = 3 A, a2 = 5 A, r = 8 A: 1/6 + 1/10 - 1/8 = 0.141667 A^-1, times 1389.354 kJ/mol A = 196.825 kJ/mol.
    lam = outer_sphere_lambda(3e-10, 5e-10, 8e-10, 1.0)
    assert lam / 1e3 == pytest.approx(1389.354 * (1 / 6 + 1 / 10 - 1 / 8), rel=1e-5)
    # Symmetric in the two radii; grows toward [1/(2 a1) + 1/(2 a2)] as the spheres move apart.
    assert outer_sphere_lambda(5e-10, 3e-10, 8e-10, 1.0) == pytest.approx(lam, rel=1e-14)
    far = outer_sphere_lambda(3e-10, 5e-10, 1.0, 1.0)
    assert far / 1e3 == pytest.approx(1389.354 * (1 / 6 + 1 / 10), rel=1e-5)
    assert far > lam
    # Additivity (common practice, Marcus): lambda_out,12 at contact lies between the two self-exchange values.
    lo, hi = self_exchange_outer_lambda(5e-10, 1.0), self_exchange_outer_lambda(3e-10, 1.0)
    assert lo < lam < hi


def test_pekar_factor_broadcasts():
    out = pekar_factor(np.array([1.3325, 1.3416]), np.array([78.30334, 35.94]))
    # 1/1.3416^2 - 1/35.94 = 0.555589 - 0.027824 = 0.527765 (hand arithmetic)
    np.testing.assert_allclose(out, [0.550433, 0.527765], atol=2e-6)


def _chemicals_water():
    # Source: the `chemicals` package: IAPWS-95 density (chemicals.iapws.iapws95_rho), IAPWS permittivity
    # (chemicals.permittivity.permittivity_IAPWS) and IAPWS 1997 refractive index at the sodium D line
    # (chemicals.refractivity.RI_IAPWS, 589.29 nm).
    from chemicals.iapws import iapws95_rho
    from chemicals.permittivity import permittivity_IAPWS
    from chemicals.refractivity import RI_IAPWS

    rho = iapws95_rho(298.15, 101325.0)
    return permittivity_IAPWS(298.15, rho), RI_IAPWS(298.15, rho, 589.29e-9)


def _chemicals_acetonitrile():
    # Source: the `chemicals` package: CRC permittivity correlation eps = A + B T + C T^2 (+ D T^3)
    # (chemicals.permittivity.permittivity_data_CRC; D is missing for acetonitrile, so 0), and the CRC organic
    # refractive-index table (chemicals.refractivity.RI; 1.3442, which chemicals lists at 303.15 K).
    from chemicals.identifiers import CAS_from_any
    from chemicals.permittivity import permittivity_CRC, permittivity_data_CRC
    from chemicals.refractivity import RI

    cas = CAS_from_any("acetonitrile")
    row = permittivity_data_CRC.loc[cas]
    d = 0.0 if not np.isfinite(row.D) else row.D
    eps = permittivity_CRC(298.15, row.A, row.B, row.C, d)
    n, _T = RI(cas, method="CRC")
    return eps, n


def test_pekar_factor_water_against_chemicals():
    eps, n = _chemicals_water()
    expected = 1 / n**2 - 1 / eps  # about 0.55015 (n = 1.33286, eps = 78.409)
    # Table: n 1.3325 (CRC handbook) and Malmberg-Maryott eps 78.303; the two n differ by 3e-4, eps by 0.1:
    # together about 5e-4 relative in the Pekar factor.
    assert float(get_solvent("water").pekar_factor(298.15)) == pytest.approx(expected, rel=2e-3)


def test_pekar_factor_acetonitrile_against_chemicals():
    eps, n = _chemicals_acetonitrile()
    expected = 1 / n**2 - 1 / eps  # about 0.52542 (n = 1.3442, eps = 35.69)
    # Table: n 1.3416, eps 35.94 (Y. Marcus, The Properties of Solvents). The chemicals n is tabulated at a
    # different temperature (dn/dT about -4.5e-4 per K for acetonitrile), the CRC eps fit differs by 0.7 %:
    # together about 0.5 % relative in the Pekar factor.
    assert float(get_solvent("acetonitrile").pekar_factor(298.15)) == pytest.approx(expected, rel=1e-2)


def test_pekar_factor_water_follows_temperature():
    # Permittivity of water falls with T (Malmberg-Maryott), so 1/eps rises and the Pekar factor falls a little.
    w = get_solvent("water")
    assert float(w.pekar_factor(278.15)) > float(w.pekar_factor(318.15))
