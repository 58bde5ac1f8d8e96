"""Derivatives of the semiclassical (Marcus–Levich–Jortner) ln k with respect to lambda_s and lambda_v,
against mpmath's numerical derivative of the same sum evaluated independently at 30 digits."""

import mpmath as mp
import numpy as np
import pytest

from crossrate.core.constants import GAS_CONSTANT
from crossrate.core.semiclassical import mlj_ln_k
from crossrate.core.semiclassical_gradient import mlj_ln_k_curve, mlj_ln_k_gradient

T = 298.15
CM1 = 6.62607015e-34 * 299792458.0 * 100.0 * 6.02214076e23  # J/mol per cm^-1, h c (100 cm/m) N_A (exact SI)


def mp_ln_k(dG, ls, lv, hw):
    """ln of sqrt(lambda/lambda_s) sum_n P_n exp(-(dG + ls + n hw)^2 / (4 ls RT)), P_n the thermally averaged
    Skellam weight exp(-S(2 nu + 1)) ((nu + 1)/nu)^(n/2) I_n(2 S sqrt(nu (nu + 1))), S = lv/hw (Jortner 1976;
    from memory), summed over n = -10..60 in mpmath."""
    RT = mp.mpf(GAS_CONSTANT) * T
    S = lv / hw
    nu = 1 / mp.expm1(hw / RT)
    z = 2 * S * mp.sqrt(nu * (nu + 1))
    total = mp.fsum(mp.exp(-S * (2 * nu + 1)) * ((nu + 1) / nu) ** (mp.mpf(n) / 2) * mp.besseli(abs(n), z)
                    * mp.exp(-(dG + ls + n * hw) ** 2 / (4 * ls * RT)) for n in range(-10, 61))
    return mp.log(total) + mp.log((ls + lv) / ls) / 2


@pytest.mark.parametrize("ls_kJ, lv_kJ, hw_cm1", [(34.0, 43.0, 1500.0), (60.0, 8.0, 1200.0), (25.0, 90.0, 2000.0)])
def test_gradient_matches_mpmath_derivative(ls_kJ, lv_kJ, hw_cm1):
    ls, lv, hw = ls_kJ * 1e3, lv_kJ * 1e3, hw_cm1 * CM1
    dG = np.array([10e3, -40e3, -120e3, -220e3])
    ln_k, d_ls, d_lv = mlj_ln_k_gradient(dG, ls, lv, hw, T)
    with mp.workdps(30):
        for i, x in enumerate(dG):
            x = mp.mpf(float(x))
            ref_s = mp.diff(lambda v, x=x: mp_ln_k(x, v, mp.mpf(lv), mp.mpf(hw)), mp.mpf(ls))
            ref_v = mp.diff(lambda v, x=x: mp_ln_k(x, mp.mpf(ls), v, mp.mpf(hw)), mp.mpf(lv))
            # values: ln k to 1e-12 absolute (the sum is converged to 1e-13 relative)
            assert ln_k[i] == pytest.approx(float(mp_ln_k(x, mp.mpf(ls), mp.mpf(lv), mp.mpf(hw))), abs=1e-11)
            assert d_ls[i] == pytest.approx(float(ref_s), rel=1e-8, abs=1e-14)
            assert d_lv[i] == pytest.approx(float(ref_v), rel=1e-8, abs=1e-14)


def test_gradient_with_no_quantized_part():
    # lambda_v = 0: only P_-1, P_0 and P_1 move (module docstring); checked against a one-sided mpmath
    # derivative of the same sum.
    ls, hw = 50e3, 1500.0 * CM1
    dG = np.array([0.0, -100e3, -200e3])
    _, _, d_lv = mlj_ln_k_gradient(dG, ls, 0.0, hw, T)
    with mp.workdps(30):
        for i, x in enumerate(dG):
            xm = mp.mpf(float(x))
            ref = mp.diff(lambda v, xm=xm: mp_ln_k(xm, mp.mpf(ls), v, mp.mpf(hw)), mp.mpf(0), direction=1)
            assert d_lv[i] == pytest.approx(float(ref), rel=1e-7)


def test_curve_equals_the_general_sum():
    # The one-window sum of a fitted curve against crossrate.core.semiclassical.mlj_ln_k over a spread of
    # parameters, including a tiny quantized part (a Poisson weight far narrower than its Gaussian stand-in)
    # and a warm mode (300 cm^-1): the same sum, converged to 1e-13, so equal to 1e-11.
    x = -np.linspace(-0.3, 2.6, 30) * 96485.33212
    for hw_cm1 in (300.0, 1500.0, 3000.0):
        for lam in (3e3, 30e3, 300e3, 1.5e6):
            for phi in (0.0, 1e-6, 0.01, 0.5, 0.95):
                a = mlj_ln_k(x, lam * (1 - phi), lam * phi, hw_cm1 * CM1, T)
                b = mlj_ln_k_curve(x, lam * (1 - phi), lam * phi, hw_cm1 * CM1, T)
                np.testing.assert_allclose(b, a, rtol=1e-11, atol=1e-11)
