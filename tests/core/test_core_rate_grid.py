"""The fast path (crossrate.core.rate_grid) gives cross_rate()'s ln k_obs, regime and diffusion flag."""

import math

import numpy as np
import pytest

from crossrate.core import rate_grid, rate_kernel
from crossrate.core.barrier import self_exchange_ln_k
from crossrate.core.cross_rate import cross_rate
from crossrate.core.rate_grid import ln_k_obs_grid, ln_k_obs_pairs
from crossrate.core.screened_debye_table import TABLE_TOLERANCE, screened_debye_table
from crossrate.core.solvents import get_solvent, solvent_table
from crossrate.core.work_terms import work_term

LN_Z = math.log(1e11)
# Stated agreement with cross_rate(): 1e-12 in ln k, relative to max(1, |ln k|) (the two evaluate the same
# model in different, algebraically equal arrangements, so they differ by rounding only).
RTOL = ATOL = 1e-12
# At finite ionic strength the fast path reads the screened Debye factor from a table (stated accuracy
# TABLE_TOLERANCE in ln k_D; the error in ln k_obs is no larger, as d ln k_obs / d ln k_D = k_obs / k_D <= 1)
# while cross_rate() integrates it (1e-8 or better): there they agree to that tolerance, 1.5x for the estimate.
ATOL_SCREENED = 1.5 * TABLE_TOLERANCE


def _couples(n, seed, T, I, eps, one_electron=True):
    """n synthetic couples in the model's domain: lambda_ii drawn in 10-300 kJ/mol, k_self derived from it."""
    rng = np.random.default_rng(seed)
    z_ox = rng.integers(-3, 5, n).astype(float)
    z_red = z_ox - 1.0 if one_electron else rng.integers(-4, 5, n).astype(float)
    r = rng.uniform(1.5, 12.0, n) * 1e-10
    lam = rng.uniform(10e3, 300e3, n)
    ln_k = self_exchange_ln_k(lam, work_term(z_ox, z_red, 2 * r, eps, T, I), T, LN_Z)
    return rng.uniform(-2.0, 2.0, n), z_ox, z_red, r, ln_k


def _reference(ox, red, cond, diffusion=True):
    E1, zo1, zr1, r1, lk1 = (c[:, None] for c in ox)
    E2, zo2, zr2, r2, lk2 = (c[None, :] for c in red)
    return cross_rate(E1, E2, zo1, zr1, zo2, zr2, r1, r2, lk1, lk2, *cond, diffusion=diffusion)


def _cond(key="water", T=298.15, I=0.1):
    s = get_solvent(key)
    return (T, I, float(s.permittivity(T)), float(s.viscosity_Pa_s(T)), LN_Z)


def _assert_same(fast, ref, atol=ATOL_SCREENED):
    np.testing.assert_allclose(fast.ln_k_obs, ref.ln_k_obs, rtol=RTOL, atol=atol)
    if fast.regime is not None:
        np.testing.assert_array_equal(fast.regime, ref.regime)
        np.testing.assert_array_equal(fast.diffusion_controlled, ref.diffusion_controlled)


@pytest.mark.parametrize("one_electron", [True, False])
@pytest.mark.parametrize("I", [0.0, 0.1, 2.0])
def test_grid_equals_cross_rate(monkeypatch, one_electron, I):
    monkeypatch.setattr(rate_grid, "BLOCK_PAIRS", 100)  # many blocks, with a remainder block
    cond = _cond(I=I)
    ox = _couples(37, 1, cond[0], I, cond[2], one_electron)
    red = _couples(53, 2, cond[0], I, cond[2], one_electron)
    ref = _reference(ox, red, cond)
    fast = ln_k_obs_grid(*ox, *red, *cond, classify=True)
    assert fast.ln_k_obs.shape == (37, 53) and fast.regime.dtype == np.int8
    _assert_same(fast, ref, ATOL if I == 0.0 else ATOL_SCREENED)
    # The sample exercises every regime and both outcomes of the diffusion flag.
    assert set(np.unique(ref.regime)) == {0, 1, 2, 3}
    assert ref.diffusion_controlled.any() and (~ref.diffusion_controlled).any()


@pytest.mark.parametrize("key", sorted(solvent_table()))
@pytest.mark.parametrize("T", [255.0, 335.0])
def test_grid_equals_cross_rate_every_solvent(key, T):
    cond = _cond(key, T, 0.05)
    ox, red = _couples(20, 3, T, 0.05, cond[2]), _couples(25, 4, T, 0.05, cond[2])
    _assert_same(ln_k_obs_grid(*ox, *red, *cond, classify=True), _reference(ox, red, cond))


def test_grid_without_diffusion_cap():
    cond = _cond()
    ox, red = _couples(30, 5, *cond[:3]), _couples(30, 6, *cond[:3])
    ref = _reference(ox, red, cond, diffusion=False)
    fast = ln_k_obs_grid(*ox, *red, *cond, diffusion=False, classify=True)
    np.testing.assert_allclose(fast.ln_k_obs, ref.ln_k_act, rtol=RTOL, atol=ATOL)
    _assert_same(fast, ref, ATOL)
    assert not fast.diffusion_controlled.any()


def test_generic_debye_path_gives_the_same(monkeypatch):
    cond = _cond(I=0.0)  # the unscreened closed form; at I > 0 the table (or the integral) is used
    ox, red = _couples(30, 7, *cond[:3]), _couples(31, 8, *cond[:3])
    monkeypatch.setattr(rate_kernel, "_SAFE_DELTA", 0.0)  # force the overflow-proof generic Debye factor
    _assert_same(ln_k_obs_grid(*ox, *red, *cond, classify=True), _reference(ox, red, cond), ATOL)


def test_threads_do_not_change_results(monkeypatch):
    monkeypatch.setattr(rate_grid, "BLOCK_PAIRS", 64)
    cond = _cond()
    ox, red = _couples(41, 9, *cond[:3]), _couples(29, 10, *cond[:3])
    one = ln_k_obs_grid(*ox, *red, *cond, classify=True, workers=1)
    two = ln_k_obs_grid(*ox, *red, *cond, classify=True, workers=2)
    three = ln_k_obs_grid(*ox, *red, *cond, classify=True, workers=3)
    for other in (two, three):
        np.testing.assert_array_equal(one.ln_k_obs, other.ln_k_obs)
        np.testing.assert_array_equal(one.regime, other.regime)
        np.testing.assert_array_equal(one.diffusion_controlled, other.diffusion_controlled)


def test_pairs_equal_cross_rate(monkeypatch):
    monkeypatch.setattr(rate_grid, "BLOCK_PAIRS", 333)
    cond = _cond(I=0.3)
    couples = _couples(60, 11, *cond[:3])
    rng = np.random.default_rng(12)
    oi, ri = rng.integers(0, 60, 2000), rng.integers(0, 60, 2000)
    E, zo, zr, r, lk = couples
    ref = cross_rate(E[oi], E[ri], zo[oi], zr[oi], zo[ri], zr[ri], r[oi], r[ri], lk[oi], lk[ri], *cond)
    fast = ln_k_obs_pairs(oi, ri, *couples, *cond, classify=True)
    assert fast.ln_k_obs.shape == (2000,)
    _assert_same(fast, ref)
    # Pairs and grid agree with each other exactly where they overlap, given the same screened-diffusion table
    # (the grid makes one for its 3600 pairs, the 2000 listed pairs integrate; TABLE_MIN_PAIRS = 2048).
    grid = ln_k_obs_grid(*couples, *couples, *cond)
    np.testing.assert_allclose(fast.ln_k_obs, grid.ln_k_obs[oi, ri], rtol=0, atol=ATOL_SCREENED)
    table = screened_debye_table(zo, r, zr, r, *cond[:3])
    assert table is not None
    grid = ln_k_obs_grid(*couples, *couples, *cond, debye_table=table)
    fast = ln_k_obs_pairs(oi, ri, *couples, *cond, debye_table=table)
    np.testing.assert_allclose(fast.ln_k_obs, grid.ln_k_obs[oi, ri], rtol=0, atol=1e-13)
    # A table made for other conditions is not used.
    other = screened_debye_table(zo, r, zr, r, cond[0], 0.9, cond[2])
    again = ln_k_obs_pairs(oi, ri, *couples, *cond, debye_table=other)
    np.testing.assert_allclose(again.ln_k_obs, ref.ln_k_obs, rtol=RTOL, atol=ATOL)


def test_unknown_values_stay_unknown():
    cond = _cond()
    ox, red = _couples(4, 13, *cond[:3]), _couples(5, 14, *cond[:3])
    ox[4][1] = np.nan  # the second oxidant has no self-exchange rate
    with np.errstate(invalid="ignore"):
        fast = ln_k_obs_grid(*ox, *red, *cond)
        no_I = ln_k_obs_grid(*ox, *red, cond[0], np.nan, *cond[2:])
    assert np.isnan(fast.ln_k_obs[1]).all() and np.isfinite(np.delete(fast.ln_k_obs, 1, axis=0)).all()
    assert np.isnan(no_I.ln_k_obs).all()  # unknown ionic strength: no silent fallback to I = 0


def test_empty_inputs():
    cond = _cond()
    ox = _couples(3, 15, *cond[:3])
    empty = tuple(np.array([]) for _ in range(5))
    assert ln_k_obs_grid(*ox, *empty, *cond).ln_k_obs.shape == (3, 0)
    assert ln_k_obs_grid(*empty, *ox, *cond, classify=True).regime.shape == (0, 3)
    assert ln_k_obs_pairs([], [], *ox, *cond).ln_k_obs.shape == (0,)


def test_conditions_must_be_scalars_and_columns_consistent():
    cond = _cond()
    ox = _couples(3, 16, *cond[:3])
    with pytest.raises(ValueError, match="one set of conditions"):
        ln_k_obs_grid(*ox, *ox, np.array([298.0, 310.0]), *cond[1:])
    with pytest.raises(ValueError, match="ln_k_self: 2 values for 3 couples"):
        ln_k_obs_grid(*ox[:4], ox[4][:2], *ox, *cond)
    with pytest.raises(ValueError, match="oxidant positions"):
        ln_k_obs_pairs([0, 1], [0], *ox, *cond)
    with pytest.raises(IndexError, match="red_index: positions must lie in 0..2 for 3 couples"):
        ln_k_obs_pairs([0, 1], [0, 3], *ox, *cond)
    with pytest.raises(IndexError, match="ox_index"):
        ln_k_obs_pairs([-1], [0], *ox, *cond)
