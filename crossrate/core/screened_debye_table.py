"""Debye's screened encounter factor tabulated for many pairs at one set of conditions (the fast paths).

At fixed kappa and Bjerrum length, ln F of Debye's integral with the screened potential
(crossrate.core.screened_diffusion) depends only on the charge product z1 z2 and the encounter distance r12,
and is smooth in r12: a table along r12 per charge product, read by linear interpolation, gives it within
TABLE_TOLERANCE (2e-5 in ln F, five times inside the 1e-4 relative accuracy aimed at for k_D) for a few
operations per pair instead of a quadrature.
"""

import numpy as np

from .constants import BOLTZMANN, ELEMENTARY_CHARGE, VACUUM_PERMITTIVITY
from .screened_diffusion import ln_screened_debye_factor
from .work_terms import debye_kappa

#: Chebyshev points per row of a table (in ln r12); rows are analytic there, so 24 points reach ~1e-9.
_CHEB_POINTS = 24
#: Target of the linear-interpolation error of a table, in ln F (the tables pick their step to meet it).
TABLE_TOLERANCE = 2e-5
_MAX_TABLE_POINTS = 1 << 16


class ScreenedDebyeTable:
    """ln F + 2 ln r12 along r12 for each integer charge product z1 z2, at one set of conditions.

    For many pairs (a map, a batch): at fixed kappa and Bjerrum length, ln F depends only on (z1 z2, r12) and
    is smooth in r12, so each charge product present is integrated at Chebyshev points in ln r12, carried to a
    uniform grid in r12 by the Chebyshev series and read back by linear interpolation. The grid step is
    chosen so that the interpolation error, estimated from the table's second differences (h^2 f''/8),
    stays below TABLE_TOLERANCE. Rows are laid out for every integer from the smallest to the largest
    product (row = z1 z2 - zz_min), so a pair's position is z1 z2 n + r12 / step + constant; rows of products
    not asked for are left at zero and never read.

    Args:
        zz: integer charge products z1 z2 present (floats holding integers).
        r12_min_m, r12_max_m: range of encounter distances to cover, m (> 0).
        bjerrum_m: Bjerrum length e^2 / (4 pi eps0 eps_s k_B T), m (delta = z1 z2 bjerrum / (r12 (1 + kappa r12))).
        kappa_per_m: Debye screening constant kappa, 1/m (> 0; at kappa = 0 the closed form is exact).
    """

    def __init__(self, zz, r12_min_m: float, r12_max_m: float, bjerrum_m: float, kappa_per_m: float):
        present = np.unique(np.asarray(zz, dtype=float))
        if present.size == 0 or np.any(present != np.round(present)):
            raise ValueError("ScreenedDebyeTable: charge products must be integers (and at least one given)")
        self.zz_min = float(present[0])
        self.zz_present = present
        self.bjerrum_m, self.kappa_per_m = float(bjerrum_m), float(kappa_per_m)
        rows = int(present[-1] - present[0]) + 1
        # A hair wider than asked, so that rounding in r1 + r2 never falls off either end.
        lo, hi = float(r12_min_m) * (1.0 - 1e-9), float(r12_max_m) * (1.0 + 1e-9)
        if not hi > lo:
            hi = lo * (1.0 + 1e-6)
        self.r0, self.r_end = lo, hi
        s_mid, s_half = 0.5 * (np.log(hi) + np.log(lo)), 0.5 * (np.log(hi) - np.log(lo))
        theta = np.pi * (np.arange(_CHEB_POINTS) + 0.5) / _CHEB_POINTS
        r_nodes = np.exp(s_mid + s_half * np.cos(theta))
        delta = present[:, None] * bjerrum_m / (r_nodes * (1.0 + kappa_per_m * r_nodes))[None, :]
        b = np.broadcast_to(kappa_per_m * r_nodes, delta.shape)
        values = ln_screened_debye_factor(delta, b)  # rows: charge products present, columns: nodes
        k = np.arange(_CHEB_POINTS)
        coef = (2.0 / _CHEB_POINTS) * values @ np.cos(np.outer(theta, k))
        coef[:, 0] *= 0.5

        def fine(n):
            r = lo + (hi - lo) * np.arange(n) / (n - 1)
            t = np.clip((np.log(r) - s_mid) / s_half, -1.0, 1.0)
            # Clenshaw-free: cos(k arccos t) = T_k(t), rows by a small matrix product.
            return coef @ np.cos(np.outer(k, np.arccos(t))) + 2.0 * np.log(r)[None, :]

        n = 256
        v = fine(n)
        err = np.max(np.abs(np.diff(v, 2, axis=1)), initial=0.0) / 8.0
        if err > TABLE_TOLERANCE:
            # Interpolation error scales as h^2: one refinement reaches the tolerance (with 20 % margin).
            n = int(min(_MAX_TABLE_POINTS, np.ceil((n - 1) * np.sqrt(1.2 * err / TABLE_TOLERANCE)) + 1))
            v = fine(n)
        self.n = n
        self.step = (hi - lo) / (n - 1)
        table = np.zeros((rows, n))
        slope = np.zeros((rows, n))
        at = (present - self.zz_min).astype(np.intp)
        table[at] = v
        slope[at, :-1] = np.diff(v, axis=1)
        #: Flattened rows, value and forward difference at each grid point (position row * n + column).
        self.values = table.ravel()
        self.slopes = slope.ravel()

    def covers(self, zz, r12_min_m: float, r12_max_m: float) -> bool:
        """True when every charge product in zz has a row and [r12_min_m, r12_max_m] (m) lies in the range."""
        rows_ok = bool(np.all(np.isin(np.asarray(zz, dtype=float), self.zz_present)))
        return rows_ok and self.r0 <= r12_min_m and r12_max_m <= self.r_end

    def position(self, zz, r12_m) -> np.ndarray:
        """Fractional table position (z1 z2 - zz_min) n + (r12 - r0) / step of pairs (z1 z2, r12 in m)."""
        return (np.asarray(zz, dtype=float) - self.zz_min) * self.n + (np.asarray(r12_m, dtype=float) - self.r0) / self.step

    def lookup(self, t) -> np.ndarray:
        """ln F + 2 ln r12 (r12 in m) at fractional positions t (from position(), or its separable pieces)."""
        t = np.asarray(t, dtype=float)
        i = t.astype(np.intp)
        return self.values[i] + (t - i) * self.slopes[i]

    def ln_factor(self, zz, r12_m) -> np.ndarray:
        """ln F of pairs (z1 z2, r12 in m) from the table."""
        return self.lookup(self.position(zz, r12_m)) - 2.0 * np.log(np.asarray(r12_m, dtype=float))


#: From this many pairs on (one set of conditions, integer charges) a table is made rather than integrating.
TABLE_MIN_PAIRS = 2048


#: Above this many distinct (Bjerrum length, kappa) among the pairs, the pairs are integrated one by one.
_MAX_CONDITION_GROUPS = 64


def _one_condition(zz, r, bjerrum_m: float, kappa_per_m: float):
    if (zz.size >= TABLE_MIN_PAIRS and kappa_per_m > 0.0 and np.all(np.isfinite(r)) and np.all(r > 0)
            and np.all(zz == np.round(zz))):
        return ScreenedDebyeTable(zz, float(np.min(r)), float(np.max(r)), bjerrum_m, kappa_per_m).ln_factor(zz, r)
    return ln_screened_debye_factor(zz * bjerrum_m / (r * (1.0 + kappa_per_m * r)), kappa_per_m * r)


def screened_ln_factor(z1z2, r12_m, bjerrum_m, kappa_per_m):
    """ln F for pairs (z1 z2, r12) at conditions (Bjerrum length, kappa): exact quadrature, or a table for
    each set of conditions shared by TABLE_MIN_PAIRS pairs or more (integer charge products).

    Args: z1z2 charge products; r12_m encounter distances, m; bjerrum_m, m; kappa_per_m, 1/m. Broadcast.
    Returns: ln F (dimensionless), the screened Debye factor of Debye's 1942 integral (module docstring).
    """
    arrays = np.broadcast_arrays(*(np.asarray(v, dtype=float) for v in (z1z2, r12_m, bjerrum_m, kappa_per_m)))
    shape = arrays[0].shape
    zz, r, lb, kap = (a.ravel() for a in arrays)
    if lb.size < TABLE_MIN_PAIRS:
        return ln_screened_debye_factor(zz * lb / (r * (1.0 + kap * r)), kap * r).reshape(shape)
    out = np.full(lb.size, np.nan)
    known = np.isfinite(lb) & np.isfinite(kap)  # unknown conditions (NaN ionic strength) stay NaN
    if np.all(lb[known] == lb[known][:1]) and np.all(kap[known] == kap[known][:1]):
        groups = [np.flatnonzero(known)] if known.any() else []
    else:
        # Per-pair conditions are usually a few (ionic strength, medium) groups: one table per group.
        keys, inverse = np.unique(np.stack([lb[known], kap[known]]), axis=1, return_inverse=True)
        if keys.shape[1] > _MAX_CONDITION_GROUPS:
            return ln_screened_debye_factor(zz * lb / (r * (1.0 + kap * r)), kap * r).reshape(shape)
        rows = np.flatnonzero(known)
        inverse = inverse.ravel()
        order = np.argsort(inverse, kind="stable")
        groups = np.split(rows[order], np.flatnonzero(np.diff(inverse[order])) + 1)
    for g in groups:
        out[g] = _one_condition(zz[g], r[g], float(lb[g[0]]), float(kap[g[0]]))
    return out.reshape(shape)


def bjerrum_length(eps_r, T_K):
    """Bjerrum length e^2 / (4 pi eps0 eps_s k_B T), m (eps_r relative permittivity, T_K in K)."""
    return ELEMENTARY_CHARGE**2 / (
        4.0 * np.pi * VACUUM_PERMITTIVITY * np.asarray(eps_r, dtype=float) * BOLTZMANN * np.asarray(T_K, dtype=float))


def table_inputs(z_ox1, r1, z_red2, r2):
    """(charge products, r12 min, r12 max in m) of all pairs of these columns (radii in m), or None when a
    table cannot serve them (charges not integers, a radius not a positive number, no pairs)."""
    z_ox1, z_red2, r1, r2 = (np.asarray(v, dtype=float).ravel() for v in (z_ox1, z_red2, r1, r2))
    if not (r1.size and r2.size):
        return None
    zz = np.unique(np.outer(np.unique(z_ox1), np.unique(z_red2)))
    radii_ok = np.all(np.isfinite(r1)) and np.all(np.isfinite(r2)) and r1.min() > 0 and r2.min() > 0
    if not radii_ok or not np.all(np.isfinite(zz)) or np.any(zz != np.round(zz)):
        return None
    return zz, float(r1.min() + r2.min()), float(r1.max() + r2.max())


def screened_debye_table(z_ox1, r1_m, z_red2, r2_m, T_K, I_M, eps_r):
    """The ScreenedDebyeTable serving every pair (oxidant i, reductant j) of these columns at one set of
    conditions, for passing to several crossrate.core.rate_grid calls (a map in row blocks, the shifted
    evaluations of a linear uncertainty) so that it is built once.

    Args: z_ox1, r1_m (m): oxidant charges and radii; z_red2, r2_m (m): reductant ones; T_K (K), I_M (mol/L),
    eps_r: scalars. Returns the table, or None where none is used (I = 0: closed form; charges not integers).
    """
    kappa = float(debye_kappa(float(I_M), float(eps_r), float(T_K)))
    got = table_inputs(z_ox1, r1_m, z_red2, r2_m)
    if not kappa > 0.0 or got is None:
        return None
    return ScreenedDebyeTable(got[0], got[1], got[2], float(bjerrum_length(eps_r, T_K)), kappa)


def table_for(z_ox1, r1_m, z_red2, r2_m, bjerrum_m: float, kappa_per_m: float, n_pairs: int, given=None):
    """The table for pairs of these columns (radii in m) at (Bjerrum length m, kappa 1/m): `given` when it was
    made for these conditions and covers the pairs, else a new one; None at kappa = 0 or NaN (closed form or
    NaN path), for fewer than TABLE_MIN_PAIRS pairs (integrating pair by pair is then cheaper, and exact) or
    when a table cannot serve the pairs (table_inputs)."""
    if not kappa_per_m > 0.0:
        return None
    got = table_inputs(z_ox1, r1_m, z_red2, r2_m)
    if got is None:
        return None
    zz, lo, hi = got
    same = given is not None and (given.bjerrum_m, given.kappa_per_m) == (float(bjerrum_m), float(kappa_per_m))
    if same and given.covers(zz, lo, hi):
        return given
    if n_pairs < TABLE_MIN_PAIRS:
        return None
    return ScreenedDebyeTable(zz, lo, hi, bjerrum_m, kappa_per_m)


def position_piece(table: ScreenedDebyeTable, r_m, first: bool) -> np.ndarray:
    """One couple's share of a pair's table position: r / step, and for the oxidant side also the constant
    -(zz_min n + r0 / step); the pair's position is z1 z2 n + piece(ox) + piece(red). r_m in m."""
    piece = np.asarray(r_m, dtype=float) / table.step
    return piece - (table.zz_min * table.n + table.r0 / table.step) if first else piece


def read_table(table: ScreenedDebyeTable, t, idx, out, work) -> None:
    """out = ln F + 2 ln r12 at positions t, by linear interpolation, into preallocated arrays (t, a float
    array, is overwritten with the fractional part; idx an intp array and work a float array of its shape)."""
    np.copyto(idx, t, casting="unsafe")  # positions are >= 0, so truncation is the floor
    np.subtract(t, idx, out=t)
    np.take(table.values, idx, out=out, mode="clip")
    np.take(table.slopes, idx, out=work, mode="clip")
    np.multiply(work, t, out=work)
    np.add(out, work, out=out)
