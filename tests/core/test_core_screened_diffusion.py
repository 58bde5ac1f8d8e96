"""Debye's encounter integral with the screened (Debye-Hueckel) potential, against mpmath quadrature.

Reference, written here from the published formula (P. Debye, Trans. Electrochem. Soc. 82, 265 (1942); citation
from memory): k_D = 4 pi N_A (D1 + D2) / Integral_{r12}^inf exp(U(r)/k_B T) r^-2 dr with the Debye-Hueckel
potential U(r) = z1 z2 e^2 exp(-kappa (r - r12)) / (4 pi eps0 eps r (1 + kappa r12)). Substituting x = r12 / r
gives k_D = 4 pi N_A (D1 + D2) r12 / J with J = Integral_0^1 exp(delta x exp(-b (1/x - 1))) dx, delta = U(r12)/k_B T,
b = kappa r12; the mpmath reference below integrates that J (mpmath.quad, tanh-sinh, split at 2^-k towards
both ends) at 20 digits, independently of crossrate's Gauss-Legendre rule.
"""

import math

import mpmath as mp
import numpy as np
import pytest
import scipy.constants as sc

from crossrate.core import screened_debye_table
from crossrate.core.cross_rate import cross_rate
from crossrate.core.diffusion import ln_debye_factor
from crossrate.core.screened_debye_table import (
    TABLE_TOLERANCE,
    ScreenedDebyeTable,
    screened_ln_factor,
)
from crossrate.core.screened_diffusion import ln_screened_debye_factor
from crossrate.core.solvents import get_solvent
from crossrate.core.work_terms import debye_kappa

T25 = 298.15


def _mp_ln_F(delta, b):
    """-ln J(delta, b) by mpmath quadrature at 20 digits (the screened Debye factor)."""
    with mp.workdps(20):
        d, bb = mp.mpf(delta), mp.mpf(b)

        def f(x):
            return mp.exp(d * x * mp.exp(-bb * (1 / x - 1))) if x > 0 else mp.mpf(1)

        pts = [mp.mpf(0)] + [mp.mpf(2) ** -k for k in range(24, 0, -1)]
        pts += [1 - mp.mpf(2) ** -k for k in range(2, 25)] + [mp.mpf(1)]
        return float(-mp.log(mp.quad(f, pts)))


def _bjerrum(eps, T):
    # e^2 / (4 pi eps0 eps k_B T), m (scipy.constants, CODATA)
    return sc.e**2 / (4 * math.pi * sc.epsilon_0 * eps * sc.k * T)


# (delta, b): like and opposite charges, weak to strong interaction, little to strong screening; the extremes
# (|delta| = 300) are a 3+/3- pair in dichloromethane at contact.
CASES = [(6.0, 0.3), (6.0, 2.5), (-6.0, 0.3), (-6.0, 2.5), (0.4, 1.0), (-0.4, 1.0), (25.0, 5.0), (-25.0, 5.0),
         (300.0, 1.5), (-300.0, 1.5), (-40.0, 12.0), (2.0, 1e-4)]


@pytest.mark.parametrize("delta,b", CASES)
def test_screened_factor_matches_mpmath_quadrature(delta, b):
    # Stated accuracy of the Gauss-Legendre rule: 1e-8 in ln F over this range (1e-4 is what k_D needs).
    assert float(ln_screened_debye_factor(delta, b)) == pytest.approx(_mp_ln_F(delta, b), abs=1e-8)


def test_unscreened_is_the_closed_form_exactly():
    # b = 0: J = (e^delta - 1)/delta in closed form (Debye 1942), so the two must be the same numbers.
    d = np.array([-50.0, -3.0, -1e-8, 0.0, 1e-8, 2.0, 40.0, 1e300])
    np.testing.assert_array_equal(ln_screened_debye_factor(d, 0.0), ln_debye_factor(d))
    # ... and tend to it continuously as b -> 0: dJ/db = O(delta) at b = 0, so the gap is O(b |delta|).
    for delta in (-8.0, 8.0):
        gap = abs(float(ln_screened_debye_factor(delta, 1e-7) - ln_debye_factor(delta)))
        assert gap < 1e-7 * abs(delta) * 2


def test_screening_raises_kD_for_like_and_lowers_it_for_opposite_charges():
    # The screened potential lies between 0 and the Coulomb one with the same contact value (e^-kappa (r - r12)
    # <= 1), so exp(U/kT) under the integral is smaller for repulsion and larger for attraction (derivation above).
    like = ln_screened_debye_factor(6.0, 1.0) - ln_debye_factor(6.0)
    unlike = ln_screened_debye_factor(-6.0, 1.0) - ln_debye_factor(-6.0)
    assert like > 0.1 and unlike < -0.1


def test_laplace_branch_for_huge_repulsion():
    # delta (1 + b) > 1e8: J = e^delta / (delta (1 + b)) (1 + O(1/delta)) (Laplace's method at x = 1).
    delta, b = 1e9, 0.5
    assert float(ln_screened_debye_factor(delta, b)) == pytest.approx(math.log(delta * 1.5) - delta, rel=1e-15)


def test_nan_stays_nan_and_shapes_broadcast():
    out = ln_screened_debye_factor(np.array([[1.0], [np.nan]]), np.array([0.5, np.nan, 0.0]))
    assert out.shape == (2, 3)
    assert np.isnan(out[1]).all() and np.isnan(out[0, 1]) and np.isfinite(out[0, [0, 2]]).all()


@pytest.mark.parametrize("solvent,I", [("water", 0.1), ("water", 1.0), ("acetonitrile", 0.1),
                                       ("dichloromethane", 0.5), ("water", 5.0)])
def test_table_accuracy_against_the_integral(solvent, I):
    # The table used by the fast paths must be within TABLE_TOLERANCE (2e-5) of the integral in ln F, which
    # keeps it well inside the 1e-4 relative accuracy aimed at for k_D; checked at 3000 random pairs.
    eps = float(get_solvent(solvent).permittivity(T25))
    kappa, lb = float(debye_kappa(I, eps, T25)), _bjerrum(eps, T25)
    zz = np.array([-16.0, -9.0, -6.0, -2.0, -1.0, 0.0, 2.0, 3.0, 6.0, 12.0])
    table = ScreenedDebyeTable(zz, 4e-10, 25e-10, lb, kappa)
    rng = np.random.default_rng(5)
    z, r = rng.choice(zz, 3000), rng.uniform(4e-10, 25e-10, 3000)
    exact = ln_screened_debye_factor(z * lb / (r * (1 + kappa * r)), kappa * r)
    err = np.max(np.abs(table.ln_factor(z, r) - exact))
    assert err <= TABLE_TOLERANCE
    # the ends of the range are covered too
    ends = table.ln_factor(np.array([-16.0, 12.0]), np.array([4e-10, 25e-10]))
    exact_ends = ln_screened_debye_factor(np.array([-16.0, 12.0]) * lb / (np.array([4e-10, 25e-10]) * (
        1 + kappa * np.array([4e-10, 25e-10]))), kappa * np.array([4e-10, 25e-10]))
    np.testing.assert_allclose(ends, exact_ends, rtol=0, atol=TABLE_TOLERANCE)


def test_table_refuses_non_integer_products_and_the_helper_falls_back():
    with pytest.raises(ValueError):
        ScreenedDebyeTable([1.5], 5e-10, 9e-10, 7e-10, 1e9)
    z = np.full(3000, 1.5)
    r = np.linspace(5e-10, 9e-10, 3000)
    got = screened_ln_factor(z, r, 7e-10, 1e9)  # no table: the integral pair by pair
    exact = ln_screened_debye_factor(1.5 * 7e-10 / (r * (1 + 1e9 * r)), 1e9 * r)
    np.testing.assert_array_equal(got, exact)


def _mp_ln_kD(z1, z2, r1, r2, eps, eta, T, I):
    """ln k_D (M^-1 s^-1) from Debye's integral, mpmath, with Stokes-Einstein D = k_B T / (6 pi eta a)."""
    kappa = math.sqrt(2 * sc.N_A * sc.e**2 * I * 1000 / (sc.epsilon_0 * eps * sc.k * T))
    r12 = r1 + r2
    delta = z1 * z2 * _bjerrum(eps, T) / (r12 * (1 + kappa * r12))
    D = sc.k * T / (6 * math.pi * eta) * (1 / r1 + 1 / r2)
    return math.log(4 * math.pi * sc.N_A * 1000 * D * r12) + _mp_ln_F(delta, kappa * r12)


@pytest.mark.parametrize("z_ox1,z_red2,I", [(3, 2, 0.1), (3, -4, 0.5), (-3, -4, 1.0), (2, 1, 0.0)])
def test_cross_rate_k_diff_is_debye_integral(z_ox1, z_red2, I):
    s = get_solvent("water")
    eps, eta = float(s.permittivity(T25)), float(s.viscosity_Pa_s(T25))
    r1, r2 = 4.2e-10, 3.5e-10
    res = cross_rate(0.3, 0.1, z_ox1, z_ox1 - 1, z_red2 + 1, z_red2, r1, r2, math.log(1e3), math.log(1e4),
                     T25, I, eps, eta, math.log(1e11))
    assert float(res.ln_k_diff) == pytest.approx(_mp_ln_kD(z_ox1, z_red2, r1, r2, eps, eta, T25, I), abs=1e-8)


def test_many_pairs_take_the_table_within_its_tolerance(monkeypatch):
    # From TABLE_MIN_PAIRS pairs on, one set of conditions: the table; below, the integral. Same numbers to 2e-5.
    s = get_solvent("water")
    eps, eta = float(s.permittivity(T25)), float(s.viscosity_Pa_s(T25))
    rng = np.random.default_rng(3)
    n = 3000
    z1 = rng.integers(-3, 4, n).astype(float)
    z2 = rng.integers(-3, 4, n).astype(float)
    r1, r2 = rng.uniform(3e-10, 8e-10, n), rng.uniform(3e-10, 8e-10, n)
    args = (0.2, 0.0, z1, z1 - 1, z2 + 1, z2, r1, r2, 5.0, 5.0, T25, 0.3, eps, eta, math.log(1e11))
    table = cross_rate(*args).ln_k_diff
    monkeypatch.setattr(screened_debye_table, "TABLE_MIN_PAIRS", 10**9)
    exact = cross_rate(*args).ln_k_diff
    assert 0 < np.max(np.abs(table - exact)) <= TABLE_TOLERANCE


def test_d_ln_k_diff_shifts_k_D():
    s = get_solvent("water")
    eps, eta = float(s.permittivity(T25)), float(s.viscosity_Pa_s(T25))
    args = (0.2, 0.0, 3, 2, 3, 2, 4e-10, 4e-10, 5.0, 5.0, T25, 0.1, eps, eta, math.log(1e11))
    base, moved = cross_rate(*args), cross_rate(*args, d_ln_k_diff=0.7)
    assert float(moved.ln_k_diff - base.ln_k_diff) == pytest.approx(0.7, abs=1e-12)
    assert float(moved.ln_k_act) == float(base.ln_k_act)


def test_per_pair_conditions_take_one_table_per_group():
    # A batch whose pairs carry their own conditions (two ionic strengths, one unknown) as arrays: each group of
    # TABLE_MIN_PAIRS or more pairs gets its table (within TABLE_TOLERANCE of the integral), unknown stays NaN.
    n = 3 * 2500
    rng = np.random.default_rng(8)
    zz = rng.integers(-9, 10, n).astype(float)
    r = rng.uniform(5e-10, 12e-10, n)
    lb = np.full(n, _bjerrum(78.4, T25))
    kap = np.repeat([float(debye_kappa(0.1, 78.4, T25)), float(debye_kappa(1.0, 78.4, T25)), np.nan], 2500)
    got = screened_ln_factor(zz, r, lb, kap)
    exact = ln_screened_debye_factor(zz * lb / (r * (1 + kap * r)), kap * r)
    np.testing.assert_allclose(got[:5000], exact[:5000], rtol=0, atol=TABLE_TOLERANCE)
    assert not np.array_equal(got[:5000], exact[:5000])  # the tables were used
    assert np.isnan(got[5000:]).all()


def test_gauss_legendre_rule_is_numpys_to_the_last_bit():
    # The 16-point rule is written out (no numpy.polynomial import at start-up); it must be the rule
    # numpy.polynomial.legendre.leggauss(16) computes, to a few ulp (bit-equal where the LAPACK build is
    # the development machine's), and integrate polynomials up to degree 31 exactly (Gauss-Legendre's
    # defining property, common practice): Integral_-1^1 x^30 dx = 2/31.
    from crossrate.core import screened_diffusion as sd

    x, w = np.polynomial.legendre.leggauss(16)
    np.testing.assert_allclose(sd._GL_X, x, rtol=1e-15, atol=1e-16)
    np.testing.assert_allclose(sd._GL_W, w, rtol=1e-14, atol=0)
    assert np.array_equal(sd._GL_X, -sd._GL_X[::-1]) and np.array_equal(sd._GL_W, sd._GL_W[::-1])
    assert math.isclose(float(np.sum(sd._GL_W * sd._GL_X**30)), 2 / 31, rel_tol=1e-13)
    assert math.isclose(float(np.sum(sd._GL_W)), 2.0, rel_tol=1e-15)
