"""The semiclassical (Marcus–Levich–Jortner) rate against its limits, an mpmath sum and the textbook shape."""

import math

import mpmath as mp
import numpy as np
import pytest

from crossrate.core.constants import GAS_CONSTANT, KJ
from crossrate.core.semiclassical import (
    classical_ln_k,
    ln_quantum_factor,
    mlj_ln_k,
    mlj_minus_dG0_at_maximum,
)

T = 298.15
# J/mol per cm^-1: h c (100 cm/m) N_A with the exact SI (2019) values of h, c and N_A.
CM1 = 6.62607015e-34 * 299792458.0 * 100.0 * 6.02214076e23
HW_1500 = 1500.0 * CM1


def mp_mlj_ln_k(dG, ls, lv, hw, T_K):
    """The same formula summed independently in mpmath (40 digits): Skellam weights written with the
    modified Bessel function, P_n = exp(-S(2 nu + 1)) ((nu + 1)/nu)^(n/2) I_n(2 S sqrt(nu (nu + 1)))
    (Jortner 1976, thermally averaged mode; from memory), times sqrt(lambda/lambda_s), summed over n until
    the terms are below 1e-45 of the sum on both sides of the largest term."""
    with mp.workdps(40):
        dG, ls, lv, hw = (mp.mpf(v) for v in (dG, ls, lv, hw))
        RT = mp.mpf(GAS_CONSTANT) * mp.mpf(T_K)
        S = lv / hw
        nu = 1 / mp.expm1(hw / RT)
        z = 2 * S * mp.sqrt(nu * (nu + 1))

        def term(n):
            p = mp.exp(-S * (2 * nu + 1)) * ((nu + 1) / nu) ** (mp.mpf(n) / 2) * mp.besseli(abs(n), z)
            return p * mp.exp(-(dG + ls + n * hw) ** 2 / (4 * ls * RT))

        centre = int(mp.nint(-(dG + ls) / hw))
        total = mp.mpf(0)
        # walk out from n = S (the weight's mean) and from the Gaussian centre until the terms die
        lo, hi = min(int(S), centre) - 5, max(int(S), centre) + 5
        for n in range(lo, hi + 1):
            total += term(n)
        n = hi + 1
        while True:
            t = term(n)
            total += t
            if t < total * mp.mpf("1e-45"):
                break
            n += 1
        n = lo - 1
        while True:
            t = term(n)
            total += t
            if t < total * mp.mpf("1e-45"):
                break
            n -= 1
        return float(mp.log(total) + mp.log((ls + lv) / ls) / 2)


@pytest.mark.parametrize(
    "dG_kJ, ls_kJ, lv_kJ, hw",
    [
        (-60.0, 40.0, 30.0, HW_1500),  # cold mode (hbar omega / RT = 7.2), normal region
        (-250.0, 40.0, 30.0, HW_1500),  # deep inverted region
        (30.0, 60.0, 20.0, HW_1500),  # uphill: hot bands (thermal quanta) matter
        (-150.0, 25.0, 60.0, 400.0 * CM1),  # warm mode, S = 12.6, many quanta
        (-300.0, 50.0, 300.0, 800.0 * CM1),  # large S = 31
    ],
)
def test_sum_agrees_with_mpmath(dG_kJ, ls_kJ, lv_kJ, hw):
    # Independent 40-digit evaluation of the same sum (above); the engine truncates at 1e-13 relative.
    got = float(mlj_ln_k(dG_kJ * KJ, ls_kJ * KJ, lv_kJ * KJ, hw, T))
    want = mp_mlj_ln_k(dG_kJ * KJ, ls_kJ * KJ, lv_kJ * KJ, hw, T)
    assert got == pytest.approx(want, abs=1e-10)


def test_cold_mode_is_the_poisson_sum():
    # hbar omega = 3000 cm^-1 at 150 K: nu = 1/(e^28.8 - 1) ~ 3e-13, so the thermally averaged sum is the
    # familiar cold-mode form sum_j e^-S S^j / j! exp(-(dG + lambda_s + j hbar omega)^2 / 4 lambda_s RT)
    # (Ulstrup & Jortner 1975; from memory), written here directly.
    T_cold, hw = 150.0, 3000.0 * CM1
    ls, lv = 30.0 * KJ, 45.0 * KJ
    S = lv / hw
    RT = GAS_CONSTANT * T_cold
    for dG in (-20.0 * KJ, -90.0 * KJ, -200.0 * KJ):
        s = math.fsum(math.exp(-S) * S**j / math.factorial(j) * math.exp(-(dG + ls + j * hw) ** 2 / (4 * ls * RT))
                      for j in range(60))
        want = math.log(s) + 0.5 * math.log((ls + lv) / ls)
        assert float(mlj_ln_k(dG, ls, lv, hw, T_cold)) == pytest.approx(want, abs=1e-9)


def test_classical_limit():
    # hbar omega -> 0 at fixed lambda_v: the mode becomes classical and the rate the Marcus quadratic form
    # with lambda = lambda_s + lambda_v (common practice). The deviation falls like (hbar omega)^2: at
    # 0.01 kJ/mol (RT / 250) it is below 1e-3 in ln k from the endergonic side to -dG0 = 3 lambda.
    dG = np.linspace(50.0, -210.0, 27) * KJ
    ls, lv = 40.0 * KJ, 30.0 * KJ
    cl = classical_ln_k(dG, ls + lv, T)
    err_fine = np.max(np.abs(mlj_ln_k(dG, ls, lv, 0.01 * KJ, T) - cl))
    err_coarse = np.max(np.abs(mlj_ln_k(dG, ls, lv, 0.1 * KJ, T) - cl))
    assert err_fine < 1e-3
    assert err_fine < err_coarse / 20.0  # ~ (0.1/0.01)^2 = 100 expected; 20 leaves room
    # lambda_v = 0: exactly the classical form with lambda = lambda_s.
    np.testing.assert_allclose(mlj_ln_k(dG, ls, 0.0, HW_1500, T), classical_ln_k(dG, ls, T), rtol=0, atol=1e-12)


def test_maximum_and_asymmetry():
    ls, lv = 40.0 * KJ, 30.0 * KJ
    lam = ls + lv
    # Small hbar omega: the maximum sits at -dG0 = lambda (Marcus; common practice).
    assert mlj_minus_dG0_at_maximum(ls, lv, 0.1 * KJ, T) == pytest.approx(lam, rel=2e-3)
    # A high-frequency mode (1500 cm^-1): the maximum moves toward -dG0 = lambda_s (the 0 -> 0 channel
    # weighs e^-S) and the inverted side falls far more gently than the normal side (common practice).
    top = mlj_minus_dG0_at_maximum(ls, lv, HW_1500, T)
    assert ls < top < lam
    d = np.array([50.0, 100.0, 150.0]) * KJ

    def ln_k(x):
        return mlj_ln_k(-x, ls, lv, HW_1500, T)

    drop_inverted = ln_k(top) - ln_k(top + d)
    drop_normal = ln_k(top) - ln_k(top - d)
    assert np.all(drop_inverted < drop_normal)
    # 150 kJ/mol past the top: the classical curve falls by d^2/(4 lambda RT) = 32.3 (ln units); the
    # semiclassical one by less than a third of that.
    assert drop_inverted[-1] < (d[-1] ** 2 / (4 * lam * GAS_CONSTANT * T)) / 3.0
    # The classical form is symmetric about its maximum (quadratic).
    cl = classical_ln_k(-(lam + d), lam, T) - classical_ln_k(-(lam - d), lam, T)
    np.testing.assert_allclose(cl, 0.0, atol=1e-9)


def test_no_overflow_for_large_S_or_driving_force():
    # S = 400 (lambda_v = 2000 kJ/mol, hbar omega = 5 kJ/mol) and |dG0| up to 5000 kJ/mol: finite, and
    # tiny compared with the top of the curve.
    x = np.array([-5000.0, -2040.0, 0.0, 3000.0]) * KJ
    y = mlj_ln_k(x, 40.0 * KJ, 2000.0 * KJ, 5.0 * KJ, T)
    assert np.all(np.isfinite(y))
    assert y[1] > y[0] and y[1] > y[3]
    assert y[1] == pytest.approx(0.0, abs=1.0)  # near the top, ln k ~ ln A = 0


def test_broadcasting_and_bad_input():
    y = mlj_ln_k(np.zeros((2, 3)), np.array([30.0, 40.0, 50.0]) * KJ, 20.0 * KJ, HW_1500, T, ln_A=2.0)
    assert y.shape == (2, 3)
    assert float(y[0, 1]) == pytest.approx(float(mlj_ln_k(0.0, 40.0 * KJ, 20.0 * KJ, HW_1500, T)) + 2.0,
                                           abs=1e-12)
    with pytest.raises(ValueError):
        mlj_ln_k(0.0, -1.0, 0.0, HW_1500, T)


def test_quantum_factor_is_one_at_zero_driving_force():
    ls, lv = 45.0 * KJ, 25.0 * KJ
    x = np.array([0.0, -60.0 * KJ, -200.0 * KJ])
    q = ln_quantum_factor(x, ls, lv, HW_1500, T)
    assert q[0] == pytest.approx(0.0, abs=1e-12)
    assert q[2] > 5.0  # deep in the inverted region the quantum channel is far faster than classical
    # A soft mode is nearly classical: Q ~ 1 everywhere in the normal region.
    assert np.max(np.abs(ln_quantum_factor(x[:2], ls, lv, 0.01 * KJ, T))) < 1e-3
