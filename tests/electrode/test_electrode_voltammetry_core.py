"""The CV solver against the Randles-Sevcik peak and Nicholson's working curve of Delta Ep against psi."""

import math

import numpy as np
import pytest
from scipy import constants

from crossrate.core.voltammetry import find_peaks, simulate_cv

F_RT = constants.physical_constants["Faraday constant"][0] / (constants.R * 298.15)


def _bv(lam_dimless, alpha=0.5):
    ln_l = math.log(lam_dimless)
    return lambda th: (ln_l - alpha * np.asarray(th), ln_l + (1.0 - alpha) * np.asarray(th))


def test_reversible_peak_is_randles_sevcik():
    # Randles-Sevcik (Bard & Faulkner, common practice): i_p = 0.4463 n F A C (n F v D / RT)^1/2, i.e. the
    # dimensionless peak flux chi_p = 0.4463 for a reversible couple (here k0 / (D f v)^1/2 = 1e4).
    v = simulate_cv(0.3 * F_RT, -0.3 * F_RT, _bv(1e4))
    assert find_peaks(v).chi_cathodic == pytest.approx(0.4463, rel=0.01)
    # The reversible separation with the switch 300 mV past E0' is about 58 mV (Bard & Faulkner table of
    # Delta Ep against switching potential, from memory: 57.8 mV at 271.5 mV, 57.0 mV in the limit).
    assert find_peaks(v).separation / F_RT * 1e3 == pytest.approx(57.8, abs=0.7)


# Nicholson, Anal. Chem. 37, 1351 (1965), working curve of n Delta Ep against psi at 25 degC, alpha = 0.5,
# D_O = D_R (values from memory).
NICHOLSON_1965 = [(20, 61), (7, 63), (6, 64), (5, 65), (4, 66), (3, 68), (2, 72), (1, 84), (0.75, 92),
                  (0.5, 105), (0.35, 121), (0.25, 141), (0.1, 212)]


@pytest.mark.parametrize(("psi", "dEp_mV"), NICHOLSON_1965)
def test_nicholson_working_curve_within_2_mV(psi, dEp_mV):
    # psi = k0 / (pi D f v)^1/2 for D_O = D_R, so the dimensionless k0 / (D f v)^1/2 is psi sqrt(pi).
    # Window +-200 mV about E0' (the switch well past each cathodic peak).
    v = simulate_cv(0.2 * F_RT, -0.2 * F_RT, _bv(psi * math.sqrt(math.pi)))
    assert find_peaks(v).separation / F_RT * 1e3 == pytest.approx(dEp_mV, abs=2.0)


def test_unequal_diffusion_and_resistance_move_the_peaks():
    base = find_peaks(simulate_cv(0.25 * F_RT, -0.25 * F_RT, _bv(1e3)))
    # Reversible wave: E1/2 = E0' + (RT/2F) ln(D_R/D_O) (common practice), so both peaks shift together.
    shifted = find_peaks(simulate_cv(0.25 * F_RT, -0.25 * F_RT, _bv(1e3), d_ratio=0.5))
    mid = 0.5 * (base.theta_cathodic + base.theta_anodic) + 0.5 * math.log(0.5)
    assert 0.5 * (shifted.theta_cathodic + shifted.theta_anodic) == pytest.approx(mid, abs=0.05)
    # An uncompensated resistance widens the separation and lowers the peak (common practice).
    ir = find_peaks(simulate_cv(0.25 * F_RT, -0.25 * F_RT, _bv(1e3), rho=0.5))
    # The drop at the peaks is about rho (chi_pc + |chi_pa|) = 0.5 x 0.76 = 0.38 in units of RT/F.
    assert ir.separation > base.separation + 0.3 and ir.chi_cathodic < base.chi_cathodic
