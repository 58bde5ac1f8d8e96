"""The semiclassical sum at zero driving force, tabulated: the normalization of the quantum factor Q (the
Marcus–Levich–Jortner rate at Delta G deg' = 0, crossrate.core.level_sum) for many pairs sharing one mode.

At x = 0 the level sum of level_sum depends on the pair only through lambda_s and S = lambda_v / hbar omega
(for one hbar omega and T). Written as L0 = -lambda_s / 4 + M with

    M(rho, S) = ln sum_n w_n(S) exp(-n hbar omega / 2 - n^2 hbar omega^2 rho / 4),   rho = 1 / lambda_s

(RT units; w_n the weights of level_sum), M is smooth in rho and in S and is read by bilinear
interpolation from a grid of exact level sums. Each table checks itself when built: at the centres of
random cells, interpolated against exact sums, within ZERO_TABLE_TOLERANCE; a grid that fails is refined,
and when it still fails no table is used (the pairs are then summed one by one, as for mixed modes).
"""

import numpy as np

#: Largest accepted error of the table in ln (its share of level_sum.LEVEL_SUM_TOLERANCE).
ZERO_TABLE_TOLERANCE = 4e-6
#: Grid nodes along rho and along S at the first try (each refinement doubles both).
_FIRST_GRID = (400, 100)
_REFINEMENTS = 2
#: Random cell centres checked per table.
_CHECKS = 400
#: Growth allowance of the ranges (fraction of the span on each side); a map builds its table once over the
#: exact ranges of all its pairs (rate_grid.semiclassical_weights), other callers grow it as they go.
_ROOM = 0.1


class ZeroDriveTable:
    """M(rho, S) on a regular grid for one hbar omega (RT units). rho in [r0, r1], S in [s0, s1]."""

    def __init__(self, hw: float, r0: float, r1: float, s0: float, s1: float, M: np.ndarray):
        self.hw, self.r0, self.r1, self.s0, self.s1, self.M = hw, r0, r1, s0, s1, M

    def covers(self, r_lo, r_hi, s_lo, s_hi) -> bool:
        return self.r0 <= r_lo and r_hi <= self.r1 and self.s0 <= s_lo and s_hi <= self.s1

    def ln_sum_at_zero(self, ls, S) -> np.ndarray:
        """L0 (the level sum at x = 0 as level_sum._ln_sums gives it) for pairs with lambda_s / RT = ls and S,
        arrays inside the table's ranges."""
        return _bilinear(self, 1.0 / ls, S) - 0.25 * ls


def _bilinear(t: ZeroDriveTable, rho, s):
    nr, ns = t.M.shape
    u = (rho - t.r0) * ((nr - 1) / (t.r1 - t.r0)) if t.r1 > t.r0 else np.zeros_like(rho)
    v = (s - t.s0) * ((ns - 1) / (t.s1 - t.s0)) if t.s1 > t.s0 else np.zeros_like(s)
    i = np.clip(u.astype(np.intp), 0, max(nr - 2, 0))
    k = np.clip(v.astype(np.intp), 0, max(ns - 2, 0))
    fu, fv = u - i, v - k
    flat = t.M.reshape(-1)
    base = i * ns + k
    i1 = 1 if nr > 1 else 0
    k1 = 1 if ns > 1 else 0
    a, b = flat.take(base), flat.take(base + k1)
    c, d = flat.take(base + i1 * ns), flat.take(base + i1 * ns + k1)
    return (a + fv * (b - a)) * (1.0 - fu) + (c + fv * (d - c)) * fu


def build_zero_table(hw: float, r_lo: float, r_hi: float, s_lo: float, s_hi: float, exact_m):
    """A checked ZeroDriveTable covering rho in [r_lo, r_hi] and S in [s_lo, s_hi] (with room to grow),
    or None when no grid up to the finest tried meets ZERO_TABLE_TOLERANCE. exact_m(ls, S): M at those
    arrays of pairs (RT units), exact."""
    span_r, span_s = r_hi - r_lo, s_hi - s_lo
    r0, r1 = max(r_lo - _ROOM * span_r, 0.5 * r_lo), r_hi + _ROOM * span_r
    s0, s1 = max(s_lo - _ROOM * span_s, 0.5 * s_lo), s_hi + _ROOM * span_s
    nr, ns = _FIRST_GRID
    rng = np.random.default_rng(0)  # fixed draws: the same check every time
    for _ in range(_REFINEMENTS + 1):
        rho = np.linspace(r0, r1, nr)
        s = np.linspace(s0, s1, ns)
        R, Sq = np.meshgrid(rho, s, indexing="ij")
        M = exact_m(1.0 / R.ravel(), Sq.ravel()).reshape(nr, ns)
        t = ZeroDriveTable(hw, r0, r1, s0, s1, M)
        ci = rng.integers(0, max(nr - 1, 1), _CHECKS)
        ck = rng.integers(0, max(ns - 1, 1), _CHECKS)
        rc = rho[ci] + 0.5 * (rho[min(1, nr - 1)] - rho[0])
        sc = s[ck] + 0.5 * (s[min(1, ns - 1)] - s[0])
        err = np.abs(_bilinear(t, rc, sc) - exact_m(1.0 / rc, sc))
        if np.all(np.isfinite(M)) and float(np.max(err)) <= ZERO_TABLE_TOLERANCE:
            return t
        nr, ns = 2 * nr, 2 * ns
    return None
