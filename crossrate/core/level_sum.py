"""The semiclassical quantum factor ln Q for many pairs at once (an all-pairs map, a screen), each pair with its
own driving force, lambda, inner lambda and mode energy: the Marcus–Levich–Jortner sum over vibrational
levels done as a 2-D array (levels x pairs), with no Python loop over pairs.

Same quantity as crossrate.core.semiclassical.ln_quantum_factor (the exact per-pair path that predict uses):

    ln Q = [ln k_MLJ(x) - ln k_MLJ(0)] + (x^2 + 2 x lambda) / (4 lambda RT),

x = Delta G deg' and lambda = lambda_s + lambda_v (the second term is -[ln k_cl(x) - ln k_cl(0)] of the
Marcus quadratic form). Each ln k_MLJ is ln sum_n P_n exp(-(x + lambda_s + n hbar omega)^2 / (4 lambda_s RT))
(Ulstrup & Jortner 1975; Jortner 1976; from memory) up to terms that are the same at x and at 0 and cancel;
it is summed over a window of levels around the peak of the terms, whose edges are checked (a window found
short is widened; what still fails goes to the exact path).

The weight P_n (Skellam, mu1 = S(nu + 1), mu2 = S nu, S = lambda_v / hbar omega, nu the mode's thermal
quanta) is written as exp(-(mu1 + mu2)) mu^|n| G_n(y) with mu = mu1 above n = 0 and mu2 below, y = sqrt(mu1 mu2)
and G_n(y) = ln I_|n|(2y) - |n| ln y (I the modified Bessel function): G depends on y alone, not on hbar
omega, so one table (LevelWeights, on a grid uniform in sqrt(y), linearly interpolated) serves pairs with
different modes. Stated accuracy: |ln Q - exact| <= LEVEL_SUM_TOLERANCE (ln of a sum moves by no more than
the largest relative error of its terms; tested against ln_quantum_factor).

Energies are in units of RT (x_RT = x / RT, ...), as the rate grid carries them.
"""

import math
import threading
from dataclasses import dataclass

import numpy as np

from .constants import GAS_CONSTANT
from .level_window import level_window

#: Stated agreement of ln Q with the exact per-pair sum (crossrate.core.semiclassical.ln_quantum_factor).
LEVEL_SUM_TOLERANCE = 1e-5
#: Grid step in sqrt(y) of the weight table: the interpolation error of G_n is at most step^2 / 8 max|G_n''|
#: in that variable (G_n ~ y^2 / (|n| + 1) near 0 and ~ 2y far out, both smooth in sqrt(y)).
ROOT_Y_STEP = 1e-3
#: Levels added on each side of a window found too short, in turn, before the exact path takes over.
_RETRY_WIDENINGS = (4.0, 16.0)
#: Omitted tails below this share of the sum are accepted (ln of the sum then moves by less than it, a tenth of
#: LEVEL_SUM_TOLERANCE).
_EDGE = 1e-6
#: From this many pairs sharing one mode, the sums at zero driving force come from a table
#: (crossrate.core.zero_drive_table) rather than one by one.
ZERO_TABLE_MIN_PAIRS = 20000
#: Elements (levels x pairs) summed at a time, to bound the memory of the 2-D arrays.
_CHUNK_ELEMENTS = 1 << 16


@dataclass(frozen=True)
class SemiclassicalMode:
    """The semiclassical model's mode and the rule for each couple's inner part of lambda_ii
    (crossrate.core.semiclassical.couple_inner_lambda): hbar omega in J/mol (where a couple gives none of
    its own), the default inner fraction of lambda_ii where a couple gives no lambda_in, and the cap (a
    fraction of lambda_ii)."""

    hbar_omega_J_per_mol: float
    inner_default_fraction: float
    inner_max_fraction: float = 0.95


@dataclass(frozen=True)
class _Table:
    """G_n on the sqrt(y) grid (rows) for levels n_lo..n_hi (columns), sqrt(y) up to root_y_max."""

    g: np.ndarray
    #: g's step to the next grid row (0 in the last), so that interpolation reads both at the same position.
    d: np.ndarray
    n_lo: int
    n_hi: int
    root_y_max: float


class LevelWeights:
    """The table of G_n(y) (module docstring), grown on demand; T_K (K) is the temperature of the pairs (for
    the exact path). Safe to share between threads: a grown table is a new object and every sum reads the
    one it started with."""

    def __init__(self, T_K: float):
        self.T_K = float(T_K)
        self.current = _Table(np.zeros((2, 1)), np.zeros((2, 1)), 0, -1, -1.0)
        self._lock = threading.Lock()
        self._zero: dict[float, object] = {}

    def zero_table(self, hw: float, r_lo: float, r_hi: float, s_lo: float, s_hi: float):
        """The checked zero_drive_table.ZeroDriveTable of mode hw (RT units) covering rho = 1/lambda_s in
        [r_lo, r_hi] and S in [s_lo, s_hi], built or grown here; None when no table meets its tolerance."""
        from .zero_drive_table import build_zero_table

        with self._lock:
            t = self._zero.get(hw)
            if t is not None and t.covers(r_lo, r_hi, s_lo, s_hi):
                return t
            if t is not None:
                r_lo, r_hi, s_lo, s_hi = min(r_lo, t.r0), max(r_hi, t.r1), min(s_lo, t.s0), max(s_hi, t.s1)
            if hw in self._zero and t is None:
                return None  # no grid met the tolerance for this mode
        T_K = self.T_K

        def exact_m(ls, S):
            lv = S * hw
            p = _pairs(ls, lv, np.full(ls.shape, hw))
            with np.errstate(invalid="ignore", over="ignore", under="ignore", divide="ignore"):
                l0, bad = _level_sum(np.zeros_like(ls), p, self)
            if np.any(bad):
                l0[bad] = _exact_ln_sum_at_zero(ls[bad], lv[bad], hw, T_K)
            return l0 + 0.25 * ls

        t = build_zero_table(hw, r_lo, r_hi, s_lo, s_hi, exact_m)
        with self._lock:
            self._zero[hw] = t
        return t

    def ensure(self, root_y_max: float, n_lo: int, n_hi: int) -> _Table:
        """The table, grown (one rebuild, with room to spare) to cover sqrt(y) in [0, root_y_max] and levels
        n_lo..n_hi."""
        from .semiclassical import ln_factorial, ln_skellam

        with self._lock:
            cur = self.current
            if root_y_max <= cur.root_y_max and cur.n_lo <= n_lo and n_hi <= cur.n_hi:
                return cur
            if cur.n_hi >= cur.n_lo:
                n_lo, n_hi = min(n_lo, cur.n_lo - 8), max(n_hi, cur.n_hi + 8)
                root_y_max = max(root_y_max, 1.1 * cur.root_y_max)
            rows = int(math.ceil(max(root_y_max, 0.0) / ROOT_Y_STEP)) + 2
            y = (np.arange(1, rows) * ROOT_Y_STEP) ** 2
            n = np.arange(n_lo, n_hi + 1)
            g = np.empty((rows, n.size))
            # ln I_|n|(2y) = ln P_n(mu1 = mu2 = y) + 2y (Skellam with equal means)
            g[1:] = ln_skellam(n[None, :], y[:, None], y[:, None]) + 2.0 * y[:, None] - np.abs(n) * np.log(y)[:, None]
            g[0] = -ln_factorial(np.abs(n))  # y -> 0: I_m(2y) -> y^m / m!
            d = np.zeros_like(g)
            d[:-1] = g[1:] - g[:-1]
            self.current = _Table(g, d, int(n_lo), int(n_hi), (rows - 1) * ROOT_Y_STEP)
            return self.current


@dataclass(frozen=True)
class _Pairs:
    """Per-pair quantities shared by the sums at x and at 0 (RT units)."""

    ls: np.ndarray
    hw: np.ndarray
    nu: np.ndarray
    S: np.ndarray
    ln_mu1: np.ndarray
    ln_mu2: np.ndarray
    root_y: np.ndarray


def _ln_sums(x, p: _Pairs, start, count, tab: _Table):
    """ln sum_n exp(G_n(y) + |n| ln mu - (x + lambda_s + n hbar omega)^2 / (4 lambda_s)) per pair (RT units; the
    factor exp(-(mu1 + mu2)) left out, being the same at every x), over the levels start .. start + count - 1,
    and a mask of the pairs whose window was too short or reached past the table. Pairs are summed in groups
    of equal window width."""
    out = np.empty(x.shape)
    bad = np.zeros(x.shape, bool)
    ws = count.astype(np.int16)
    order = np.argsort(ws, kind="stable")
    pos = 0
    for W, size in enumerate(np.bincount(ws.astype(np.intp), minlength=1).tolist()):
        if size:
            sel = order[pos:pos + size]
            pos += size
            out[sel], bad[sel] = _sum_window(x[sel], p.ls[sel], p.hw[sel], p.ln_mu1[sel], p.ln_mu2[sel],
                                             p.root_y[sel], start[sel], W, tab)
    return out, bad


def _sum_window(x, ls, hw, ln_mu1, ln_mu2, root_y, start, W, tab: _Table):
    """_ln_sums for pairs sharing the window width W (levels start .. start + W - 1)."""
    bad = ~((start >= tab.n_lo) & (start + (W - 1) <= tab.n_hi))
    start = np.where(bad, tab.n_lo, start)
    out = np.empty(x.shape)
    if W > tab.n_hi - tab.n_lo + 1:
        return out, np.ones(x.shape, bool)
    j = np.arange(W, dtype=float)[:, None]
    j2 = j * j
    cols = tab.g.shape[1]
    flat, dflat = tab.g.reshape(-1), tab.d.reshape(-1)
    ps = root_y / ROOT_Y_STEP
    i = np.minimum(ps.astype(np.intp), tab.g.shape[0] - 2)
    frac = ps - i
    base = i * cols + (start.astype(np.intp) - tab.n_lo)
    # -(e0 + j hw)^2 / (4 ls) + (start + j) ln mu1 = c0 + c1 j + c2 j^2, e0 = x + ls + start hw; levels below
    # 0 then get -n (ln mu1 + ln mu2) more, making it |n| ln mu2.
    inv = 0.25 / ls
    e0 = x + ls + start * hw
    c0 = -e0 * e0 * inv + start * ln_mu1
    c1 = ln_mu1 - 2.0 * e0 * hw * inv
    c2 = -hw * hw * inv
    both = ln_mu1 + ln_mu2
    jint = np.arange(W, dtype=np.intp)[:, None]
    mid = W // 2
    rows = max(1, _CHUNK_ELEMENTS // W)
    idx_buf = np.empty((W, min(rows, x.size)), dtype=np.intp)
    for s in range(0, x.size, rows):
        sl = slice(s, s + rows)
        idx = idx_buf[:, :min(rows, x.size - s)]
        np.add(jint, base[sl], out=idx)
        t = dflat.take(idx)
        t *= frac[sl]
        r0 = flat.take(idx)
        t += r0
        np.multiply(j, c1[sl], out=r0)
        t += r0
        np.multiply(j2, c2[sl], out=r0)
        t += r0
        low = int(-start[sl].min())
        if low > 0:
            # only the first rows can hold levels below 0
            k = min(low, W)
            c = r0[:k]
            np.add(j[:k], start[sl], out=c)
            np.minimum(c, 0.0, out=c)
            c *= both[sl]
            t[:k] -= c
        # Shifted by the term at the window's middle (near the peak), so that exp cannot overflow for a usable
        # pair; a pair whose sum still does is marked.
        m = t[mid].copy()
        t -= m
        np.exp(t, out=t)
        total = np.add.reduce(t, axis=0)
        out[sl] = np.log(total) + m + c0[sl]
        if W >= 3:
            # Past each edge the terms fall at least by the edge ratio r = e / e_in per level (a log-concave
            # sequence), so the omitted tail is at most e r / (1 - r) = e^2 / (e_in - e); a rising edge fails.
            lim = _EDGE * total
            for e, e_in in ((t[0], t[1]), (t[-1], t[-2])):
                gap = e_in - e
                bad[sl] |= ~((gap > 0.0) & (e * e < lim * gap))
    bad |= ~np.isfinite(out)
    return out, bad


def _pairs(ls, lv, hw) -> _Pairs:
    """The per-pair quantities; hw an array or one number (then the mode's constants are worked out once and
    hw, nu are read-only broadcasts)."""
    if np.ndim(hw) == 0:
        hw = float(hw)
        nu = 1.0 / math.expm1(hw)
        S = lv / hw
        lnS = np.log(S)
        shape = S.shape
        return _Pairs(ls=ls, hw=np.broadcast_to(hw, shape), nu=np.broadcast_to(nu, shape), S=S,
                      ln_mu1=lnS + math.log1p(nu), ln_mu2=lnS + math.log(nu),
                      root_y=np.sqrt(S * math.sqrt(nu * (nu + 1.0))))
    nu = 1.0 / np.expm1(hw)
    S = lv / hw
    lnS = np.log(S)
    return _Pairs(ls=ls, hw=hw, nu=nu, S=S, ln_mu1=lnS + np.log1p(nu), ln_mu2=lnS + np.log(nu),
                  root_y=np.sqrt(S * np.sqrt(nu * (nu + 1.0))))


def _level_sum(x, p: _Pairs, w: LevelWeights):
    """(_ln_sums over each pair's window, widened where found short; mask of the pairs still failing)."""
    start, count = level_window(x, p)
    spread = max(_RETRY_WIDENINGS) + 1.0
    tab = w.ensure(float(np.max(p.root_y)), int(np.min(start) - spread), int(np.max(start + count) + spread))
    lx, bad = _ln_sums(x, p, start, count, tab)
    for widen in _RETRY_WIDENINGS:  # a short window: again, wider, for those pairs only
        if not np.any(bad):
            break
        k = np.flatnonzero(bad)
        sub = _Pairs(*(getattr(p, f)[k] for f in _Pairs.__dataclass_fields__))
        lx[k], bad[k] = _ln_sums(x[k], sub, start[k] - widen, count[k] + 2.0 * widen, tab)
    return lx, bad


def _exact_ln_sum_at_zero(ls, lv, hw, T_K):
    """The level sum at x = 0 from the exact per-pair path (mlj_ln_k without its prefactor and with the
    weights' common factor exp(-(mu1 + mu2)) taken back out), RT units in."""
    from .semiclassical import mlj_ln_k

    RT = GAS_CONSTANT * T_K
    nu = 1.0 / np.expm1(hw)
    S = lv / hw
    return (mlj_ln_k(0.0 * ls, ls * RT, lv * RT, hw * RT, T_K) - 0.5 * np.log((ls + lv) / ls)
            + S * (2.0 * nu + 1.0))


def _sums_at_zero(p: _Pairs, lv, w: LevelWeights):
    """(level sum at x = 0, mask of failures) per pair: from the zero-drive table of the pairs' mode when they
    share one (crossrate.core.zero_drive_table), else summed per pair."""
    hw0 = float(p.hw[0])
    one_mode = p.hw.strides == (0,) or bool(np.all(p.hw == hw0))  # a broadcast of one number, or all equal
    if one_mode and p.ls.size >= ZERO_TABLE_MIN_PAIRS:
        rho = 1.0 / p.ls
        t = w.zero_table(hw0, float(rho.min()), float(rho.max()), float(p.S.min()), float(p.S.max()))
        if t is not None:
            return t.ln_sum_at_zero(p.ls, p.S), np.zeros(p.ls.shape, bool)
    return _level_sum(np.zeros_like(p.ls), p, w)


def ln_q_pairs_rt(x_RT, lam_RT, lv_RT, hw_RT, w: LevelWeights) -> np.ndarray:
    """ln Q (module docstring) per pair, from 1-D arrays in units of RT: Delta G deg' / RT, lambda12 / RT, its
    inner part lambda_v12 / RT (0 <= lambda_v < lambda) and hbar omega / RT (an array or one number). The table
    w grows to cover the pairs; a pair whose window proves too short even when widened is summed exactly
    (crossrate.core.semiclassical.ln_quantum_factor). NaN inputs give NaN; lambda_v = 0 gives 0 (no inner
    part: the classical rate)."""
    x = np.asarray(x_RT, dtype=float).ravel()
    lam = np.asarray(lam_RT, dtype=float).ravel()
    lv = np.asarray(lv_RT, dtype=float).ravel()
    one_mode = np.ndim(hw_RT) == 0
    hw = np.broadcast_to(np.asarray(hw_RT, dtype=float).ravel(), x.shape)
    out = np.full(x.shape, np.nan)
    with np.errstate(invalid="ignore"):
        ok = np.isfinite(x) & np.isfinite(lam) & np.isfinite(lv) & (lv >= 0) & (lv < lam)
        out[ok & (lv == 0)] = 0.0  # whatever the mode: no inner part, the classical rate
        ok &= lv > 0
        if one_mode:
            ok &= bool(hw_RT > 0 and math.isfinite(hw_RT))
        else:
            ok &= (hw > 0) & np.isfinite(hw)
    if not np.any(ok):
        return out
    if np.all(ok):  # the usual case: no copies
        xs, lams, lvs, hws = x, lam, lv, hw
    else:
        xs, lams, lvs, hws = x[ok], lam[ok], lv[ok], hw[ok]
    p = _pairs(lams - lvs, lvs, float(hw_RT) if one_mode else hws)
    with np.errstate(invalid="ignore", over="ignore", under="ignore", divide="ignore"):
        lx, bad = _level_sum(xs, p, w)
        l0, bad0 = _sums_at_zero(p, lvs, w)
        q = lx - l0 + (xs * xs + 2.0 * xs * lams) / (4.0 * lams)
    bad |= bad0
    if np.any(bad):
        from .semiclassical import ln_quantum_factor

        RT = GAS_CONSTANT * w.T_K
        q[bad] = ln_quantum_factor(xs[bad] * RT, p.ls[bad] * RT, lvs[bad] * RT, hws[bad] * RT, w.T_K)
    if q.shape == out.shape:
        return q
    out[ok] = q
    return out


def ln_q_pairs(dG0_J_per_mol, lambda_J_per_mol, lambda_v_J_per_mol, hbar_omega_J_per_mol, T_K) -> np.ndarray:
    """ln Q per pair (dimensionless) from J/mol arrays (Delta G deg', lambda12, its inner part lambda_v12 and
    the mode's hbar omega, broadcast) at one temperature T (K): ln_q_pairs_rt with a table of its own."""
    RT = GAS_CONSTANT * float(T_K)
    arrs = np.broadcast_arrays(*(np.asarray(a, dtype=float) for a in (
        dG0_J_per_mol, lambda_J_per_mol, lambda_v_J_per_mol, hbar_omega_J_per_mol)))
    shape = arrs[0].shape
    x, lam, lv, hw = (a.reshape(-1) / RT for a in arrs)
    return ln_q_pairs_rt(x, lam, lv, hw, LevelWeights(float(T_K))).reshape(shape)
