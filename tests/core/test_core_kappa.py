"""Electronic transmission factors (non-adiabatic couples) in the core: cross relation, barrier form, fast path.

Model (documented in crossrate.core.cross_rate): k_ii = kappa_ii Z exp(-(w_ii + lambda_ii/4)/RT) and
k12 = kappa12 Z exp(-Delta G double-dagger_12/RT) with kappa12 = (kappa11 kappa22)^(1/2) (geometric-mean
rule for the electronic coupling, H_AB,12^2 = H_AB,11 H_AB,22: Marcus & Sutin, Biochim. Biophys. Acta 811,
265 (1985), section on non-adiabatic reactions; from memory).
"""

import mpmath
import numpy as np
from hypothesis import given, settings
from hypothesis import strategies as st

from crossrate.core.barrier import activation_free_energy, self_exchange_ln_k
from crossrate.core.constants import ANGSTROM, FARADAY, GAS_CONSTANT, KJ
from crossrate.core.cross_rate import cross_rate, marcus_curve
from crossrate.core.rate_grid import ln_k_obs_grid, ln_k_obs_pairs
from crossrate.core.screened_debye_table import TABLE_TOLERANCE
from crossrate.core.work_terms import work_term

T = 298.15
RT = GAS_CONSTANT * T
LN_Z = float(np.log(1e11))
EPS, VISC, I = 78.3, 0.89e-3, 0.1


def _random_pairs(n, seed):
    rng = np.random.default_rng(seed)
    z1 = rng.integers(-2, 4, n).astype(float)
    z2 = rng.integers(-2, 4, n).astype(float)
    r1 = rng.uniform(3.0, 7.0, n) * ANGSTROM
    r2 = rng.uniform(3.0, 7.0, n) * ANGSTROM
    lam1 = rng.uniform(60.0, 300.0, n) * KJ
    lam2 = rng.uniform(60.0, 300.0, n) * KJ
    lk1 = np.log(rng.uniform(0.01, 1.0, n))
    lk2 = np.log(rng.uniform(0.01, 1.0, n))
    E1 = rng.uniform(-1.0, 1.5, n)
    E2 = rng.uniform(-1.0, 1.5, n)
    # Self-exchange rates generated from lambda with each couple's own kappa_el Z.
    w11 = work_term(z1, z1 - 1, 2 * r1, EPS, T, I)
    w22 = work_term(z2, z2 - 1, 2 * r2, EPS, T, I)
    k11 = lk1 + self_exchange_ln_k(lam1, w11, T, LN_Z)
    k22 = lk2 + self_exchange_ln_k(lam2, w22, T, LN_Z)
    return dict(E1=E1, E2=E2, z1=z1, z2=z2, r1=r1, r2=r2, lam1=lam1, lam2=lam2, lk1=lk1, lk2=lk2, k11=k11, k22=k22)


def _cross(p, diffusion=False, kappa=True):
    return cross_rate(
        p["E1"], p["E2"], p["z1"], p["z1"] - 1, p["z2"], p["z2"] - 1, p["r1"], p["r2"], p["k11"], p["k22"],
        T, I, EPS, VISC, LN_Z, diffusion=diffusion,
        ln_kappa11=p["lk1"] if kappa else 0.0, ln_kappa22=p["lk2"] if kappa else 0.0,
    )


def test_lambda_read_with_kappa_z_is_the_lambda_the_rate_was_made_from():
    p = _random_pairs(300, 1)
    res = _cross(p)
    # lambda_ii = 4 (RT ln(kappa Z / k_ii) - w_ii) inverts k_ii = kappa Z exp(-(w + lambda/4)/RT) exactly.
    np.testing.assert_allclose(res.lambda11, p["lam1"], rtol=1e-10)
    np.testing.assert_allclose(res.lambda22, p["lam2"], rtol=1e-10)
    np.testing.assert_allclose(res.ln_kappa12, 0.5 * (p["lk1"] + p["lk2"]), rtol=0, atol=1e-15)


def test_cross_relation_with_kappa_equals_barrier_form_with_kappa12_z():
    p = _random_pairs(500, 2)
    res = _cross(p)
    # Barrier form: ln k12 = ln(kappa12 Z) - [w12 + (lambda12/4)(1 + dG0'/lambda12)^2] / RT.
    lam12 = 0.5 * (p["lam1"] + p["lam2"])
    expected = 0.5 * (p["lk1"] + p["lk2"]) + LN_Z - activation_free_energy(lam12, res.dG0_prime, res.w12) / RT
    np.testing.assert_allclose(res.ln_k_act, expected, rtol=0, atol=1e-9)


def test_kappa_changes_lambda_and_f12_but_not_the_self_exchange_limit():
    p = _random_pairs(200, 3)
    with_k = _cross(p)
    without = _cross(p, kappa=False)  # the old reading: kappa folded into an inflated lambda
    # lambda read with Z alone is too high by -4 RT ln kappa.
    np.testing.assert_allclose(without.lambda11 - with_k.lambda11, -4 * RT * p["lk1"], rtol=1e-9)
    # The two readings agree at Delta G deg' = 0 without work asymmetry only; in general f12 differs.
    assert np.max(np.abs(with_k.ln_f12 - without.ln_f12)) > 1e-3


def test_kappa_mpmath_reference():
    """Independent evaluation at 40 digits (mpmath) of k12 = sqrt(kappa11 kappa22) Z exp(-dG_act/RT)."""
    mpmath.mp.dps = 40
    p = _random_pairs(60, 4)
    res = _cross(p)
    R = mpmath.mpf(GAS_CONSTANT)
    for i in range(60):
        Tm = mpmath.mpf(T)
        w12, w21 = mpmath.mpf(float(res.w12[i])), mpmath.mpf(float(res.w21[i]))
        dG0 = -mpmath.mpf(FARADAY) * (mpmath.mpf(p["E1"][i]) - mpmath.mpf(p["E2"][i]))
        lam = (mpmath.mpf(float(p["lam1"][i])) + mpmath.mpf(float(p["lam2"][i]))) / 2
        dGp = dG0 + w21 - w12
        dGa = w12 + lam / 4 * (1 + dGp / lam) ** 2
        ln_k = (mpmath.mpf(float(p["lk1"][i])) + mpmath.mpf(float(p["lk2"][i]))) / 2 + LN_Z - dGa / (R * Tm)
        assert abs(float(ln_k) - float(res.ln_k_act[i])) < 1e-9


def test_fast_paths_take_kappa_like_cross_rate():
    p = _random_pairs(40, 5)
    E, z, r, lnk, lkap = p["E1"], p["z1"], p["r1"], p["k11"], p["lk1"]
    lkap = np.where(np.arange(40) % 3 == 0, 0.0, lkap)  # a mix of adiabatic and non-adiabatic couples
    grid = ln_k_obs_grid(E, z, z - 1, r, lnk, E, z, z - 1, r, lnk, T, I, EPS, VISC, LN_Z,
                         classify=True, ln_kappa1=lkap, ln_kappa2=lkap)
    ref = cross_rate(E[:, None], E[None, :], z[:, None], z[:, None] - 1, z[None, :], z[None, :] - 1,
                     r[:, None], r[None, :], lnk[:, None], lnk[None, :], T, I, EPS, VISC, LN_Z,
                     ln_kappa11=lkap[:, None], ln_kappa22=lkap[None, :])
    # The fast paths read the screened Debye factor from a table (within TABLE_TOLERANCE in ln k_D, see
    # test_core_screened_diffusion); everything else agrees to rounding.
    np.testing.assert_allclose(grid.ln_k_obs, ref.ln_k_obs, rtol=0, atol=1e-10 + TABLE_TOLERANCE)
    np.testing.assert_array_equal(grid.regime, ref.regime)
    ox = np.arange(40)
    red = (ox * 7 + 3) % 40
    pairs = ln_k_obs_pairs(ox, red, E, z, z - 1, r, lnk, T, I, EPS, VISC, LN_Z, ln_kappa=lkap)
    np.testing.assert_allclose(pairs.ln_k_obs, ref.ln_k_obs[ox, red], rtol=0, atol=1e-10 + TABLE_TOLERANCE)
    # All-adiabatic kappa columns give exactly the kappa-free result.
    plain = ln_k_obs_grid(E, z, z - 1, r, lnk, E, z, z - 1, r, lnk, T, I, EPS, VISC, LN_Z)
    zeros = ln_k_obs_grid(E, z, z - 1, r, lnk, E, z, z - 1, r, lnk, T, I, EPS, VISC, LN_Z,
                          ln_kappa1=np.zeros(40), ln_kappa2=np.zeros(40))
    np.testing.assert_array_equal(plain.ln_k_obs, zeros.ln_k_obs)


def test_marcus_curve_with_kappa_passes_through_the_pair():
    p = _random_pairs(10, 6)
    res = _cross(p)
    for i in range(10):
        act, _ = marcus_curve(-np.atleast_1d(res.dG0_prime[i]), res.lambda12[i], res.w12[i], T, LN_Z,
                              ln_kappa12=float(res.ln_kappa12[i]))
        assert abs(float(act[0]) - float(res.ln_k_act[i])) < 1e-9


@settings(max_examples=150, deadline=None)
@given(
    dE=st.floats(-2.0, 2.0),
    lk11=st.floats(-10.0, 18.0),
    lk22=st.floats(-10.0, 18.0),
    z1=st.integers(-3, 4),
    z2=st.integers(-3, 4),
    kap_a=st.floats(1e-3, 1.0),
    kap_b=st.floats(1e-3, 1.0),
)
def test_smaller_kappa_with_the_same_measured_rates_never_speeds_the_cross_reaction(dE, lk11, lk22, z1, z2,
                                                                                     kap_a, kap_b):
    # With k11, k22 fixed (measured), a smaller kappa11 lowers lambda11 (lambda = 4(RT ln(kappa Z/k) - w)), so
    # the denominator of ln f12 shrinks in size and ln f12 <= 0 can only fall: k12 never rises
    # (common practice: f12 < 1 penalizes driving force more for a lower intrinsic barrier).
    hi, lo = max(kap_a, kap_b), min(kap_a, kap_b)
    r = 4.5 * ANGSTROM
    args = (dE, 0.0, z1, z1 - 1, z2, z2 - 1, r, r, lk11, lk22, T, I, EPS, VISC, LN_Z)
    w11 = float(work_term(z1, z1 - 1, 2 * r, EPS, T, I))
    w22 = float(work_term(z2, z2 - 1, 2 * r, EPS, T, I))
    # Keep to couples with a barrier left at the smaller kappa (lambda > 0), the documented input range.
    if min(4 * (RT * (LN_Z + np.log(lo) - lk11) - w11), 4 * (RT * (LN_Z + np.log(lo) - lk22) - w22)) <= 1e3:
        return
    a = cross_rate(*args, diffusion=True, ln_kappa11=np.log(hi))
    b = cross_rate(*args, diffusion=True, ln_kappa11=np.log(lo))
    assert np.isfinite(b.ln_k_obs) and np.isfinite(b.ln_f12) and np.isfinite(b.lambda12)
    assert float(b.ln_k_act) <= float(a.ln_k_act) + 1e-9
    assert float(b.ln_k_obs) <= min(float(b.ln_k_act), float(b.ln_k_diff)) + 1e-12
