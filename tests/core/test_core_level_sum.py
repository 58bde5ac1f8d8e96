"""The many-pair quantum factor (crossrate.core.level_sum) against the exact per-pair sum of
crossrate.core.semiclassical.ln_quantum_factor, and the semiclassical rate grid against cross_rate times it."""

import math

import numpy as np
import pytest

from crossrate.core.constants import GAS_CONSTANT
from crossrate.core.cross_rate import cross_rate
from crossrate.core.diffusion import ln_k_observed
from crossrate.core.level_sum import (
    LEVEL_SUM_TOLERANCE,
    LevelWeights,
    SemiclassicalMode,
    ln_q_pairs,
    ln_q_pairs_rt,
)
from crossrate.core.rate_grid import ln_k_obs_grid, ln_k_obs_pairs
from crossrate.core.semiclassical import ln_quantum_factor, pair_hbar_omega, pair_inner_lambda

T = 298.15
RT = GAS_CONSTANT * T
CM1 = 6.62607015e-34 * 299792458.0 * 100.0 * 6.02214076e23  # J/mol per cm^-1: h c (100 cm/m) N_A, exact SI


def _pairs(n, seed, lam_hi=350e3):
    rng = np.random.default_rng(seed)
    lam = rng.uniform(15e3, lam_hi, n)
    return rng.uniform(-350e3, 300e3, n), lam, rng.uniform(0.0, 0.95, n) * lam


@pytest.mark.parametrize("cm1", [300.0, 700.0, 1500.0, 3000.0, 5000.0])
def test_level_sum_equals_the_exact_sum(cm1):
    # Driving forces from the endergonic side to deep in the inverted region, inner shares 0-95 %.
    x, lam, lv = _pairs(400, int(cm1), lam_hi=200e3 if cm1 < 500 else 350e3)
    fast = ln_q_pairs(x, lam, lv, cm1 * CM1, T)
    exact = ln_quantum_factor(x, lam - lv, lv, cm1 * CM1, T)
    np.testing.assert_allclose(fast, exact, rtol=0, atol=LEVEL_SUM_TOLERANCE)


def test_level_sum_with_a_mode_per_pair():
    x, lam, lv = _pairs(400, 7)
    hw = np.random.default_rng(8).uniform(400.0, 5000.0, x.size) * CM1
    np.testing.assert_allclose(ln_q_pairs(x, lam, lv, hw, T), ln_quantum_factor(x, lam - lv, lv, hw, T),
                               rtol=0, atol=LEVEL_SUM_TOLERANCE)


def test_zero_drive_table_for_many_pairs_of_one_mode():
    # 30,000 pairs of one mode: the sums at zero driving force come from the checked table
    # (crossrate.core.zero_drive_table); a sample against the exact sum.
    rng = np.random.default_rng(11)
    n = 30000
    lam = rng.uniform(40e3, 250e3, n) / RT
    lv = rng.uniform(0.05, 0.6, n) * lam
    x = rng.uniform(-250e3, 150e3, n) / RT
    w = LevelWeights(T)
    q = ln_q_pairs_rt(x, lam, lv, 1500.0 * CM1 / RT, w)
    assert 1500.0 * CM1 / RT in w._zero and w._zero[1500.0 * CM1 / RT] is not None
    k = rng.choice(n, 300, replace=False)
    exact = ln_quantum_factor(x[k] * RT, (lam - lv)[k] * RT, lv[k] * RT, 1500.0 * CM1, T)
    np.testing.assert_allclose(q[k], exact, rtol=0, atol=LEVEL_SUM_TOLERANCE)


def test_edge_values():
    w = LevelWeights(T)
    q = ln_q_pairs_rt(np.array([5.0, np.nan, 5.0, -3.0]), np.array([40.0, 40.0, 40.0, 40.0]),
                      np.array([0.0, 10.0, 40.0, 10.0]), 7.0, w)
    assert q[0] == 0.0  # no inner part: the classical rate, Q = 1
    assert np.isnan(q[1]) and np.isnan(q[2])  # NaN input; inner part not below the whole
    assert q[3] == pytest.approx(float(ln_quantum_factor(-3.0 * RT, 30.0 * RT, 10.0 * RT, 7.0 * RT, T)),
                                 abs=LEVEL_SUM_TOLERANCE)


def _couples(n, seed):
    rng = np.random.default_rng(seed)
    z = rng.integers(-2, 4, n).astype(float)
    return (rng.uniform(-1.2, 1.4, n), z, z - 1.0, rng.uniform(3.0, 7.0, n) * 1e-10,
            np.log(10.0 ** rng.uniform(-2.0, 9.0, n)))


def _cond(I=0.1):
    from crossrate.core.solvents import get_solvent

    s = get_solvent("water")
    return (T, I, float(s.permittivity(T)), float(s.viscosity_Pa_s(T)), math.log(1e11))


@pytest.mark.parametrize("own_modes", [False, True])
def test_semiclassical_grid_equals_cross_rate_times_q(own_modes):
    # Reference: cross_rate's k_act (Marcus cross relation) times the exact Q of each pair, with lambda_v12 from
    # pair_inner_lambda (lambda_in where given, else 25 %) and the pair's mode from pair_hbar_omega, then capped
    # by 1/k_obs = 1/k_act + 1/k_D (Debye-Smoluchowski). The grid reads k_D from its screened table (2e-5 in
    # ln k_D) and Q from the level sum (LEVEL_SUM_TOLERANCE): the sum of the two is the stated agreement.
    cond = _cond()
    ox, red = _couples(23, 1), _couples(19, 2)
    rng = np.random.default_rng(3)
    lin1 = np.where(rng.random(23) < 0.5, rng.uniform(0.0, 60e3, 23), np.nan)
    lin2 = np.where(rng.random(19) < 0.5, rng.uniform(0.0, 60e3, 19), np.nan)
    hw1 = np.where(rng.random(23) < 0.5, rng.uniform(500.0, 3000.0, 23) * CM1, np.nan) if own_modes else None
    mode = SemiclassicalMode(1500.0 * CM1, 0.25)
    grid = ln_k_obs_grid(*ox, *red, *cond, semiclassical=mode, lambda_in1_J=lin1, lambda_in2_J=lin2,
                         hbar_omega1_J=hw1)
    E1, zo1, zr1, r1, k1 = (c[:, None] for c in ox)
    E2, zo2, zr2, r2, k2 = (c[None, :] for c in red)
    ref = cross_rate(E1, E2, zo1, zr1, zo2, zr2, r1, r2, k1, k2, *cond)
    lv, _ = pair_inner_lambda(ref.lambda11, ref.lambda22, lin1[:, None], lin2[None, :], 0.25)
    v1 = np.clip(np.where(np.isfinite(lin1[:, None]), lin1[:, None], 0.25 * ref.lambda11), 0, 0.95 * ref.lambda11)
    v2 = np.clip(np.where(np.isfinite(lin2[None, :]), lin2[None, :], 0.25 * ref.lambda22), 0, 0.95 * ref.lambda22)
    h1 = np.where(np.isfinite(hw1), hw1, 1500.0 * CM1)[:, None] if own_modes else 1500.0 * CM1
    hw = pair_hbar_omega(v1, v2, h1, 1500.0 * CM1)
    q = ln_quantum_factor(ref.dG0_prime, ref.lambda12 - lv, lv, hw, T)
    want = ln_k_observed(ref.ln_k_act + q, ref.ln_k_diff)
    np.testing.assert_allclose(grid.ln_k_obs, want, rtol=0, atol=2e-5 + LEVEL_SUM_TOLERANCE)
    # Listed pairs: the same numbers.
    both = tuple(np.concatenate([a, b]) for a, b in zip(ox, red, strict=True))
    oi, ri = np.meshgrid(np.arange(23), 23 + np.arange(19), indexing="ij")
    pairs = ln_k_obs_pairs(oi.ravel(), ri.ravel(), *both, *cond, semiclassical=mode,
                           lambda_in_J=np.concatenate([lin1, lin2]),
                           hbar_omega_J=np.concatenate([hw1, np.full(19, np.nan)]) if own_modes else None)
    np.testing.assert_allclose(pairs.ln_k_obs.reshape(23, 19), grid.ln_k_obs, rtol=0, atol=1e-9)


def test_pair_hbar_omega_rule():
    # The inner-lambda-weighted mean: (10 x 1000 + 30 x 2000) / 40 = 1750; equal weights when both are 0.
    assert float(pair_hbar_omega(10.0, 30.0, 1000.0, 2000.0)) == pytest.approx(1750.0, rel=1e-15)
    assert float(pair_hbar_omega(0.0, 0.0, 1000.0, 2000.0)) == pytest.approx(1500.0, rel=1e-15)
