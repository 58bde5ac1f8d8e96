"""Activity coefficients and the formal-potential corrections (crossrate.core.potential_transfer)."""

import math

import mpmath
import numpy as np
import pytest
from scipy import constants as sc

from crossrate.core.potential_transfer import (
    DAVIES,
    EXTENDED_DEBYE_HUCKEL,
    debye_huckel_A,
    debye_huckel_B,
    ionic_strength_shift_V,
    log10_activity_coefficient,
    temperature_shift_V,
)
from crossrate.core.solvents import get_solvent

T25 = 298.15
EPS_W = float(get_solvent("water").permittivity(T25))  # the project's water permittivity at 25 degC


def _A_B_from_scipy(eps, T):
    # Debye-Hueckel theory (textbook form, e.g. Robinson & Stokes, "Electrolyte Solutions"; common practice):
    # kappa^2 = 2 N_A e^2 I(mol/m^3) / (eps0 eps k T); ln gamma = -z^2 e^2 kappa / (8 pi eps0 eps k T (1 + kappa a)).
    # With I in mol/L (x 1000): B = kappa / sqrt(I), A = e^2 B / (8 pi eps0 eps k T ln 10). Constants: scipy.constants.
    B = math.sqrt(2000.0 * sc.N_A * sc.e**2 / (sc.epsilon_0 * eps * sc.k * T))
    A = sc.e**2 * B / (8.0 * math.pi * sc.epsilon_0 * eps * sc.k * T * math.log(10.0))
    return A, B


def test_debye_huckel_constants_match_scipy_derivation_and_handbook():
    A, B = _A_B_from_scipy(EPS_W, T25)
    assert float(debye_huckel_A(EPS_W, T25)) == pytest.approx(A, rel=1e-12)
    assert float(debye_huckel_B(EPS_W, T25)) == pytest.approx(B, rel=1e-12)
    # Handbook: A = 0.509 kg^1/2 mol^-1/2 and B = 0.3286 per angstrom kg^1/2 mol^-1/2 in water at 25 degC (molal;
    # CRC Handbook / Robinson & Stokes; from memory). On the molar scale A_c = A_m / sqrt(rho), B_c = B_m /
    # sqrt(rho) with rho = 0.99705 kg/L (CRC, from memory): A_c = 0.5098, B_c = 0.3291 per angstrom.
    rho = 0.99705
    assert A == pytest.approx(0.509 / math.sqrt(rho), rel=5e-3)
    assert B * 1e-10 == pytest.approx(0.3286 / math.sqrt(rho), rel=5e-3)


def test_extended_debye_huckel_and_davies_against_textbook_forms():
    A, B = _A_B_from_scipy(EPS_W, T25)
    a = 6e-10
    for z, I in ((1, 0.01), (2, 0.05), (3, 0.1), (-4, 0.1)):
        # Extended Debye-Hueckel: log10 gamma = -A z^2 sqrt(I) / (1 + B a sqrt(I)) (textbook form).
        expected = -A * z * z * math.sqrt(I) / (1.0 + B * a * math.sqrt(I))
        got = float(log10_activity_coefficient(z, I, a, EPS_W, T25, EXTENDED_DEBYE_HUCKEL))
        assert got == pytest.approx(expected, rel=1e-12)
        # Davies: log10 gamma = -A z^2 (sqrt(I)/(1 + sqrt(I)) - 0.3 I) (Davies 1938, textbook form).
        expected = -A * z * z * (math.sqrt(I) / (1.0 + math.sqrt(I)) - 0.3 * I)
        got = float(log10_activity_coefficient(z, I, a, EPS_W, T25, DAVIES))
        assert got == pytest.approx(expected, rel=1e-12)
    # Tabulated Davies value for a 1:1 electrolyte at I = 0.1 M: gamma about 0.78 (textbook tables; from memory).
    assert 10 ** float(log10_activity_coefficient(1, 0.1, a, EPS_W, T25, DAVIES)) == pytest.approx(0.78, abs=0.01)
    with pytest.raises(ValueError, match="activity model"):
        log10_activity_coefficient(1, 0.1, a, EPS_W, T25, "Pitzer")


@pytest.mark.parametrize("model", [EXTENDED_DEBYE_HUCKEL, DAVIES])
def test_shift_of_3_2_and_3_4_couples_from_0_to_0_1_M(model):
    # Issue statement (from memory): from I = 0 to 0.1 M a 3+/2+ couple moves by about -30 mV and a 3-/4- couple
    # by about +40 mV. Both forms share a = 6 angstrom here.
    up = float(ionic_strength_shift_V(3, 2, 6e-10, 0.0, 0.1, EPS_W, T25, model)) * 1e3
    down = float(ionic_strength_shift_V(-3, -4, 6e-10, 0.0, 0.1, EPS_W, T25, model)) * 1e3
    assert -36.0 < up < -25.0
    assert 35.0 < down < 50.0


def test_shift_against_mpmath_at_50_digits():
    # E'(I2) - E'(I1) = (RT/nF) ln 10 [log10 g_ox - log10 g_red]_(I1)^(I2) (Nernst equation with activities),
    # recomputed independently in 50-digit arithmetic (mpmath) from CODATA constants (scipy.constants).
    mpmath.mp.dps = 50
    e, NA, eps0, k, R, F = (mpmath.mpf(x) for x in (sc.e, sc.N_A, sc.epsilon_0, sc.k, sc.R, sc.e * sc.N_A))
    eps, T, a = mpmath.mpf(EPS_W), mpmath.mpf(310), mpmath.mpf("5.5e-10")
    B = mpmath.sqrt(2000 * NA * e**2 / (eps0 * eps * k * T))
    A = e**2 * B / (8 * mpmath.pi * eps0 * eps * k * T * mpmath.log(10))

    def lg(z, I):
        return -A * z**2 * mpmath.sqrt(I) / (1 + B * a * mpmath.sqrt(I))

    for z_ox, z_red, I1, I2 in ((3, 2, "0.0", "0.1"), (-3, -4, "0.05", "0.5"), (1, 0, "0.2", "0.01")):
        I1, I2 = mpmath.mpf(I1), mpmath.mpf(I2)
        n = z_ox - z_red
        ref = R * T * mpmath.log(10) / (n * F) * ((lg(z_ox, I2) - lg(z_red, I2)) - (lg(z_ox, I1) - lg(z_red, I1)))
        got = ionic_strength_shift_V(z_ox, z_red, float(a), float(I1), float(I2), EPS_W, 310.0)
        assert float(got) == pytest.approx(float(ref), rel=1e-10, abs=1e-15)


def test_shift_is_zero_at_equal_ionic_strength_and_vectorized():
    z_ox = np.array([3.0, -3.0, 1.0])
    out = ionic_strength_shift_V(z_ox, z_ox - 1, 5e-10, np.array([0.1, 0.2, 0.0]), np.array([0.1, 0.2, 0.0]),
                                 EPS_W, T25)
    assert out.shape == (3,)
    np.testing.assert_allclose(out, 0.0, atol=1e-15)


def test_temperature_shift_is_linear_in_delta_T():
    # E'(T) = E'(T0) + (dE/dT)(T - T0), dE/dT = Delta S_rc / nF (common practice); 1.5 mV/K over 20 K is 30 mV.
    assert float(temperature_shift_V(1.5e-3, 298.15, 318.15)) == pytest.approx(0.030, rel=1e-12)
    assert float(temperature_shift_V(1.5e-3, 298.15, 298.15)) == 0.0
