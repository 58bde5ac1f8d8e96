"""The semiclassical (Marcus–Levich–Jortner) rate: one quantized high-frequency mode, the solvent classical.

Published form (Ulstrup & Jortner 1975, J. Chem. Phys.; Jortner 1976, J. Chem. Phys.; both from memory):
the high-frequency intramolecular mode (energy hbar omega, Huang–Rhys factor S = lambda_v / hbar omega) is
displaced between reactants and products; the solvent (lambda_s) is treated classically. With the mode
thermally populated (nu = 1/(exp(hbar omega / RT) - 1) quanta on average) the rate is a sum over the net
number n of quanta left in the mode,

    k = A sqrt(lambda / lambda_s) sum_n P_n exp(-(Delta G deg + lambda_s + n hbar omega)^2 / (4 lambda_s RT)),

    P_n = exp(-S(2 nu + 1)) ((nu + 1) / nu)^(n/2) I_n(2 S sqrt(nu (nu + 1)))   (n = ..., -1, 0, 1, ...),

with lambda = lambda_s + lambda_v. P_n is the Skellam distribution of N1 - N2, N1 ~ Poisson(S(nu + 1)),
N2 ~ Poisson(S nu), which is how it is computed here (no Bessel functions, all in log space). For a cold
mode (hbar omega >> RT, nu -> 0) P_n becomes the familiar Poisson weight e^-S S^j / j! over product levels
j >= 0; for hbar omega -> 0 at fixed lambda_v the sum becomes the classical Marcus quadratic form with
lambda = lambda_s + lambda_v. The factor sqrt(lambda / lambda_s) (the nonadiabatic prefactor
(4 pi lambda_s RT)^(-1/2) written against the classical (4 pi lambda RT)^(-1/2)) makes A mean the same as in the classical
form: the rate at the top of the curve when the mode is classical.

Energies in J/mol, temperatures in K, rates as natural logs (the unit of A: M^-1 s^-1 or s^-1).
"""

import math

import numpy as np

from .constants import GAS_CONSTANT

#: Relative truncation error of the sum over n and of the inner sum over k (both log-concave sequences,
#: so the omitted tails are bounded by the edge term times r / (1 - r), r the edge ratio).
SUM_TOLERANCE = 1e-13
_MAX_WIDENINGS = 12
_CHUNK = 4096


def _ln_skellam(n, mu1, mu2, ln_mu1, ln_mu2, K):
    """ln P(N1 - N2 = n) for N1 ~ Poisson(mu1), N2 ~ Poisson(mu2): logsumexp over k of
    ln Pois(n + k; mu1) + ln Pois(k; mu2), k from max(0, -n), K terms. n: (E, W) ints; mu, ln mu: (E, 1),
    ln 0 given as a large negative finite number so that 0 quanta times it stays 0."""
    k = np.maximum(0, -n)[..., None] + np.arange(K)
    m = n[..., None] + k
    t = m * ln_mu1[..., None] - _ln_factorial(m) + k * ln_mu2[..., None] - _ln_factorial(k)
    return _logsumexp(t, axis=-1) - mu1 - mu2


_LN_FACTORIALS = {"table": np.zeros(1)}


def _ln_factorial_table(top):
    """ln m! for m = 0..top (at least), cumulated logs grown on demand and kept (no scipy needed)."""
    table = _LN_FACTORIALS["table"]
    if table.size <= top:
        size = max(top + 1, 2 * table.size, 256)
        table = np.concatenate(([0.0], np.cumsum(np.log(np.arange(1.0, float(size))))))
        _LN_FACTORIALS["table"] = table
    return table


def _ln_factorial(m):
    """ln m! for integer arrays m >= 0."""
    m = np.maximum(np.asarray(m), 0).astype(np.int64)
    return _ln_factorial_table(int(np.max(m, initial=0)))[m]


def _logsumexp(t, axis):
    """ln sum exp(t) along an axis, shifted by the maximum (scipy's version costs more per call than the
    whole sum does here); -inf where every term is -inf."""
    m = np.max(t, axis=axis, keepdims=True)
    m = np.where(np.isfinite(m), m, 0.0)
    with np.errstate(divide="ignore"):
        return np.log(np.sum(np.exp(t - m), axis=axis)) + np.squeeze(m, axis=axis)


def _ln_bessel_i(n, z):
    """ln I_n(z) for integer n, z > 0 (arrays): scipy's exponentially scaled ive where it does not underflow,
    else the uniform asymptotic (Debye) expansion for large order with three correction terms (Abramowitz &
    Stegun 9.7.7 with the polynomials u1-u3 of 9.3.9; from memory, checked against mpmath in the tests)."""
    from scipy.special import ive  # only for a warm mode; importing scipy.special costs ~1 s

    n = np.abs(n).astype(float)
    with np.errstate(divide="ignore"):
        direct = np.log(ive(n, z)) + z
    far = ~(direct > -600.0 + z)
    if np.any(far):
        v, zz = np.maximum(n[far], 1.0), z[far] if np.ndim(z) else z
        w = zz / v
        s = np.sqrt(1.0 + w * w)
        t = 1.0 / s
        eta = s + np.log(w / (1.0 + s))
        t2 = t * t
        u1 = t * (3.0 - 5.0 * t2) / 24.0
        u2 = t2 * (81.0 - 462.0 * t2 + 385.0 * t2 * t2) / 1152.0
        u3 = t * t2 * (30375.0 - 369603.0 * t2 + 765765.0 * t2 * t2 - 425425.0 * t2**3) / 414720.0
        direct[far] = (v * eta - 0.5 * np.log(2.0 * np.pi * v) - 0.25 * np.log1p(w * w)
                       + np.log1p(u1 / v + u2 / v**2 + u3 / v**3))
    return direct


def _ln_skellam_bessel(n, mu1, mu2):
    """ln P(N1 - N2 = n), Skellam: -(mu1 + mu2) + (n/2) ln(mu1/mu2) + ln I_n(2 sqrt(mu1 mu2)); mu > 0."""
    z = np.broadcast_to(2.0 * np.sqrt(mu1 * mu2), n.shape)
    return -(mu1 + mu2) + 0.5 * n * (np.log(mu1) - np.log(mu2)) + _ln_bessel_i(n, z)


def _inner_terms(mu1, mu2):
    """Terms needed in the inner k-sum: the k-th ratio is at most mu1 mu2 / (k + 1)^2, so the sequence
    peaks before sqrt(mu1 mu2) and falls off like a Gaussian of width ~ (mu1 mu2)^(1/4) past it."""
    p = float(np.max(np.sqrt(mu1 * mu2), initial=0.0))
    if p == 0.0:
        return 1
    if p >= 1.0:
        return int(math.ceil(p + 8.0 * math.sqrt(p) + 12.0))
    # p < 1: product of ratios p^(2K) / (K!)^2 below the tolerance
    K, ln_prod = 1, 2.0 * math.log(p)
    while ln_prod > math.log(SUM_TOLERANCE) - 4.0:
        K += 1
        ln_prod += 2.0 * math.log(p) - 2.0 * math.log(K)
    return K


def _tails_ok(t, natural_left):
    """Per row of terms t (E, W): are both omitted tails below SUM_TOLERANCE of the largest term? The rows
    are log-concave sequences, so past an edge the terms fall at least by the edge ratio r each step and the
    tail is at most edge * r / (1 - r). natural_left: rows whose left edge is n = 0 of a cold mode."""
    tmax = np.max(t, axis=1)
    ok = np.ones(t.shape[0], bool)
    for edge, inner in ((-1, -2), (0, 1)):
        te, ti = t[:, edge], t[:, inner]
        with np.errstate(invalid="ignore"):
            ln_r = te - ti
            bound = te - tmax + ln_r - np.log(-np.expm1(np.minimum(ln_r, -1e-300)))
        good = (te == -np.inf) | ((ln_r < 0) & (bound < math.log(SUM_TOLERANCE)))
        if edge == 0:
            good |= natural_left
        ok &= good
    return ok


def _mlj_shared(x, ls, lv, hw, T, lnA):
    """Fast path for one set of parameters over many Delta G deg (a fitted curve), cold mode only: one
    window of levels for every point, the Skellam weights computed once. None when it does not apply or
    does not converge (the general path then runs). Arguments: x 1-D array, the rest floats (J/mol, K)."""
    RT = GAS_CONSTANT * T
    S = lv / hw
    nu = 1.0 / math.expm1(hw / RT)
    mu1, mu2 = S * (nu + 1.0), S * nu
    if math.sqrt(mu1 * mu2) >= 1.0 or x.size == 0:
        return None
    K = _inner_terms(np.array([mu1]), np.array([mu2]))
    var_p, var_g = S * (2.0 * nu + 1.0), 2.0 * ls * RT / hw**2
    xs = (float(x.min()), float(x.max()))
    ends = [-(v + ls) / hw for v in xs]
    if var_p > 0:
        ends = [(S * var_g + c * var_p) / (var_p + var_g) for c in ends]
        half = math.ceil(8.0 * math.sqrt(var_p * var_g / (var_p + var_g)) + 6.0)
    else:
        ends, half = [0.0, 0.0], 6
    start = math.floor(min(ends)) - half
    if mu2 == 0.0:
        start = max(start, 0)
    W = math.ceil(max(ends)) + half - start + 1
    if W > 4000:
        return None
    n = np.arange(start, start + W)
    k = np.maximum(0, -n)[:, None] + np.arange(K)
    m = n[:, None] + k
    fact = _ln_factorial_table(int(max(m.max(), k.max())))
    ln_mu1 = math.log(mu1) if mu1 > 0 else -1e300
    ln_mu2 = math.log(mu2) if mu2 > 0 else -1e300
    tk = m * ln_mu1 - fact[m] + k * ln_mu2 - fact[k]
    mk = tk.max(axis=1)
    lp = np.log(np.exp(tk - mk[:, None]).sum(axis=1)) + mk - mu1 - mu2
    t = lp - (x[:, None] + ls + n * hw) ** 2 / (4.0 * ls * RT)
    if not np.all(np.isfinite(t)):
        return None
    tmax = t.max(axis=1)
    if not _tails_ok(t, mu2 == 0.0 and start == 0).all():  # n = 0 of a cold mode: nothing lies to the left
        return None
    return lnA + 0.5 * math.log((ls + lv) / ls) + np.log(np.exp(t - tmax[:, None]).sum(axis=1)) + tmax


def mlj_ln_k(dG0_J_per_mol, lambda_s_J_per_mol, lambda_v_J_per_mol, hbar_omega_J_per_mol, T_K, ln_A=0.0):
    """ln k of the semiclassical Marcus–Levich–Jortner rate (Ulstrup & Jortner 1975; Jortner 1976; from
    memory), thermally averaged over the high-frequency mode (formula in the module docstring).

    Args (numpy arrays or scalars, broadcast together):
        dG0_J_per_mol: standard free energy of the step, J/mol (negative = downhill).
        lambda_s_J_per_mol: classical (solvent, low-frequency) reorganization energy, J/mol (> 0).
        lambda_v_J_per_mol: reorganization energy of the quantized mode, J/mol (>= 0; 0 gives the classical
            form with lambda = lambda_s).
        hbar_omega_J_per_mol: energy of one quantum of the mode, J/mol (> 0).
        T_K: temperature, K (> 0).
        ln_A: ln of the prefactor (M^-1 s^-1 for a bimolecular step, s^-1 for an intramolecular one); the
            rate at the top of the classical curve, see the module docstring.

    Returns:
        ln k, same unit as A, shape of the broadcast inputs. The sum over n is converged to a relative
        error below SUM_TOLERANCE (1e-13); no overflow for large S or large driving force (log space).
    """
    params = (lambda_s_J_per_mol, lambda_v_J_per_mol, hbar_omega_J_per_mol, T_K, ln_A)
    if all(np.ndim(a) == 0 for a in params):
        ls, lv, hw, T, lnA = (float(a) for a in params)
        if ls > 0 and lv >= 0 and hw > 0 and T > 0:
            x = np.asarray(dG0_J_per_mol, dtype=float)
            fast = _mlj_shared(x.reshape(-1), ls, lv, hw, T, lnA)
            if fast is not None:
                return fast.reshape(x.shape)
    x, ls, lv, hw, T, lnA = np.broadcast_arrays(*(np.asarray(a, dtype=float) for a in (
        dG0_J_per_mol, *params)))
    shape = x.shape
    x, ls, lv, hw, T, lnA = (a.reshape(-1) for a in (x, ls, lv, hw, T, lnA))
    if np.any(~(ls > 0)) or np.any(~(lv >= 0)) or np.any(~(hw > 0)) or np.any(~(T > 0)):
        raise ValueError("mlj_ln_k: expected lambda_s > 0, lambda_v >= 0, hbar_omega > 0 and T > 0")
    RT = GAS_CONSTANT * T
    S = lv / hw
    nu = 1.0 / np.expm1(hw / RT)
    var_p, var_g = S * (2.0 * nu + 1.0), 2.0 * ls * RT / hw**2
    width = np.sqrt(var_p * var_g / np.maximum(var_p + var_g, 1e-300))
    # A cold mode (few thermal quanta, the usual case for hbar omega >> RT): the inner sum over k is short.
    # A warm one: the Bessel form. Each kind is summed apart, in chunks of similar window width.
    hot = S * np.sqrt(nu * (nu + 1.0)) >= 1.0
    out = np.empty_like(x)
    for group, is_hot in ((~hot, False), (hot, True)):
        idx = np.flatnonzero(group)
        order = idx[np.argsort(width[idx], kind="stable")]
        for s in range(0, order.size, _CHUNK):
            sel = order[s:s + _CHUNK]
            out[sel] = _sum_levels(x[sel], ls[sel], hw[sel], RT[sel], S[sel], nu[sel], is_hot)
    lead = 0.5 * (np.log(ls + lv) - np.log(ls))
    return (lnA + lead + out).reshape(shape)


def _sum_levels(x, ls, hw, RT, S, nu, hot):
    """ln of the sum over n (module docstring) for 1-D arrays of one kind (all cold or all warm modes)."""
    mu1, mu2 = S * (nu + 1.0), S * nu
    with np.errstate(divide="ignore"):
        ln_mu1 = np.where(mu1 > 0, np.log(np.maximum(mu1, 1e-300)), -1e300)
        ln_mu2 = np.where(mu2 > 0, np.log(np.maximum(mu2, 1e-300)), -1e300)
    K = 0 if hot else _inner_terms(mu1, mu2)
    # Where the terms peak: the product of the Skellam weight (mean S, variance S(2 nu + 1)) and the
    # Gaussian in n (centre -(Delta G deg + lambda_s)/hbar omega, variance 2 lambda_s RT / hbar omega^2).
    var_p = S * (2.0 * nu + 1.0)
    var_g = 2.0 * ls * RT / hw**2
    centre_g = -(x + ls) / hw
    centre = np.where(var_p > 0, (S * var_g + centre_g * var_p) / np.maximum(var_p + var_g, 1e-300), 0.0)
    width = np.sqrt(var_p * var_g / np.maximum(var_p + var_g, 1e-300))
    centre = np.rint(centre).astype(np.int64)
    half = np.ceil(8.0 * width + 6.0).astype(np.int64)
    cold = mu2 == 0.0  # no thermal quanta: P_n = 0 for n < 0
    out = np.empty_like(x)
    todo = np.arange(x.size)
    for _ in range(_MAX_WIDENINGS):
        if todo.size == 0:
            break
        start = centre[todo] - half[todo]
        start = np.where(cold[todo], np.maximum(start, 0), start)
        W = int(np.max(2 * half[todo] + 1))
        n = start[:, None] + np.arange(W)
        c = todo[:, None]
        if hot:
            lp = np.where(mu2[c] > 0, _ln_skellam_bessel(n, mu1[c], np.maximum(mu2[c], 1e-300)),
                          np.where(n >= 0, n * ln_mu1[c] - _ln_factorial(n) - mu1[c], -np.inf))
        else:
            lp = _ln_skellam(n, mu1[c], mu2[c], ln_mu1[c], ln_mu2[c], K)
        g = -(x[c] + ls[c] + n * hw[c]) ** 2 / (4.0 * ls[c] * RT[c])
        t = lp + g
        ok = _tails_ok(t, cold[todo] & (start == 0))
        total = _logsumexp(t, axis=1)
        done = todo[ok]
        out[done] = total[ok]
        bad = todo[~ok]
        if bad.size:
            centre[bad] = start[~ok] + np.argmax(t[~ok], axis=1)
            half[bad] = 2 * half[bad] + 4
        todo = bad
    if todo.size:
        raise ArithmeticError("mlj_ln_k: the sum over vibrational levels did not converge")
    return out



def ln_skellam(n, mu1, mu2):
    """ln P(N1 - N2 = n), N1 ~ Poisson(mu1), N2 ~ Poisson(mu2) (the Skellam distribution; with mu1 = S(nu + 1)
    and mu2 = S nu the weight of a net change of n quanta in the mode, module docstring). n: integers; mu1,
    mu2 > 0 (broadcast). Small sqrt(mu1 mu2) by the short inner sum, large by the Bessel form (the same two
    paths as mlj_ln_k)."""
    n, mu1, mu2 = np.broadcast_arrays(np.asarray(n, dtype=np.int64), np.asarray(mu1, dtype=float),
                                      np.asarray(mu2, dtype=float))
    shape = n.shape
    n, mu1, mu2 = n.reshape(-1, 1), mu1.reshape(-1, 1), mu2.reshape(-1, 1)
    out = np.empty(n.shape)
    hot = (np.sqrt(mu1 * mu2) >= 1.0)[:, 0]
    if np.any(~hot):
        c = ~hot
        m1, m2 = mu1[c], mu2[c]
        out[c] = _ln_skellam(n[c], m1, m2, np.log(m1), np.log(m2), _inner_terms(m1, m2))
    if np.any(hot):
        out[hot] = _ln_skellam_bessel(n[hot], mu1[hot], mu2[hot])
    return out.reshape(shape)


def ln_factorial(m):
    """ln m! for integer arrays m >= 0 (a cumulated table of logs)."""
    return _ln_factorial(m)


def classical_ln_k(dG0_J_per_mol, lambda_J_per_mol, T_K, ln_A=0.0):
    """ln k = ln A - (lambda + Delta G deg)^2 / (4 lambda RT) (Marcus quadratic form), J/mol and K in."""
    lam = np.asarray(lambda_J_per_mol, dtype=float)
    return ln_A - (lam + np.asarray(dG0_J_per_mol, dtype=float)) ** 2 / (4.0 * lam * GAS_CONSTANT *
                                                                          np.asarray(T_K, dtype=float))


def ln_quantum_factor(dG0_J_per_mol, lambda_s_J_per_mol, lambda_v_J_per_mol, hbar_omega_J_per_mol, T_K):
    """ln Q: the semiclassical rate over the classical one at the same total lambda = lambda_s + lambda_v,
    normalized to Q = 1 at Delta G deg = 0.

    ln Q(dG) = [ln k_MLJ(dG) - ln k_cl(dG)] - [ln k_MLJ(0) - ln k_cl(0)]. Multiplying a classical rate
    (e.g. the Marcus cross relation, which reproduces the measured self-exchange rates at dG = 0) by Q keeps
    it equal to the classical one where no driving force acts and bends only its driving-force dependence.
    Arguments as mlj_ln_k (J/mol, K; broadcast); returns a dimensionless ln.
    """
    x = np.asarray(dG0_J_per_mol, dtype=float)
    lam = np.asarray(lambda_s_J_per_mol, dtype=float) + np.asarray(lambda_v_J_per_mol, dtype=float)
    here = mlj_ln_k(x, lambda_s_J_per_mol, lambda_v_J_per_mol, hbar_omega_J_per_mol, T_K) - classical_ln_k(
        x, lam, T_K)
    zero = mlj_ln_k(0.0 * x, lambda_s_J_per_mol, lambda_v_J_per_mol, hbar_omega_J_per_mol, T_K) - classical_ln_k(
        0.0 * x, lam, T_K)
    return here - zero


def mlj_minus_dG0_at_maximum(lambda_s_J_per_mol, lambda_v_J_per_mol, hbar_omega_J_per_mol, T_K):
    """-Delta G deg (J/mol) at which the semiclassical rate is largest (scalars), by a golden-section search
    on [0, 2 lambda + 10 hbar omega]; the curve is log-concave in Delta G deg, so the maximum is unique."""
    ls, lv, hw = float(lambda_s_J_per_mol), float(lambda_v_J_per_mol), float(hbar_omega_J_per_mol)
    a, b = 0.0, 2.0 * (ls + lv) + 10.0 * hw
    grid = np.linspace(a, b, 201)
    y = mlj_ln_k(-grid, ls, lv, hw, T_K)
    i = int(np.argmax(y))
    a, b = grid[max(i - 1, 0)], grid[min(i + 1, grid.size - 1)]
    g = (math.sqrt(5.0) - 1.0) / 2.0
    for _ in range(40):  # bracket shrinks to 0.618^40 ~ 4e-9 of a grid step
        c, d = b - g * (b - a), a + g * (b - a)
        fc, fd = mlj_ln_k(np.array([-c, -d]), ls, lv, hw, T_K)
        if fc >= fd:
            b = d
        else:
            a = c
    return 0.5 * (a + b)


def couple_inner_lambda(lambda_ii_J, lambda_in_J, default_fraction, max_fraction=0.95):
    """The inner (high-frequency) part of each couple's self-exchange lambda_ii, J/mol: lambda_in where given
    (NaN = not given: default_fraction x lambda_ii), held to [0, max_fraction x lambda_ii] (the inner part
    cannot exceed the whole). Arrays broadcast; fractions dimensionless."""
    lam = np.asarray(lambda_ii_J, dtype=float)
    v = np.where(np.isfinite(lambda_in_J), lambda_in_J, default_fraction * lam)
    return np.clip(v, 0.0, max_fraction * lam)


def pair_hbar_omega(lambda_v11_J, lambda_v22_J, hbar_omega1_J, hbar_omega2_J):
    """The effective mode energy of a cross reaction, J/mol: the two couples' hbar omega (J/mol) weighted by
    their inner lambdas lambda_v,ii (J/mol): (lambda_v11 hw1 + lambda_v22 hw2) / (lambda_v11 + lambda_v22), so
    that the couple whose high-frequency mode carries more of the reorganization sets more of the pair's
    mode (one effective mode standing for two, common practice). Equal weights where both are 0."""
    v1, v2 = np.asarray(lambda_v11_J, dtype=float), np.asarray(lambda_v22_J, dtype=float)
    tot = v1 + v2
    w1 = np.where(tot > 0, v1 / np.where(tot > 0, tot, 1.0), 0.5)
    return w1 * np.asarray(hbar_omega1_J, dtype=float) + (1.0 - w1) * np.asarray(hbar_omega2_J, dtype=float)


def pair_inner_lambda(lambda11_J, lambda22_J, lambda_in11_J, lambda_in22_J, default_fraction, max_fraction=0.95):
    """The high-frequency (inner) part of a cross reaction's lambda12, from the couples' inner parts.

    lambda_v,ii from couple_inner_lambda (lambda_in where given, else default_fraction x lambda_ii, held to at
    most max_fraction x lambda_ii); lambda_v12 = (lambda_v11 + lambda_v22)/2, the same additivity rule as
    lambda12 = (lambda11 + lambda22)/2 (Marcus cross relation).

    Args: self-exchange lambdas and inner parts in J/mol (arrays broadcast); fractions dimensionless.
    Returns: (lambda_v12 J/mol, clipped: bool array, any couple's inner part cut to max_fraction).
    """
    l11, l22 = np.asarray(lambda11_J, dtype=float), np.asarray(lambda22_J, dtype=float)
    v11 = np.where(np.isfinite(lambda_in11_J), lambda_in11_J, default_fraction * l11)
    v22 = np.where(np.isfinite(lambda_in22_J), lambda_in22_J, default_fraction * l22)
    clipped = (v11 > max_fraction * l11) | (v22 > max_fraction * l22)
    v11 = couple_inner_lambda(l11, lambda_in11_J, default_fraction, max_fraction)
    v22 = couple_inner_lambda(l22, lambda_in22_J, default_fraction, max_fraction)
    return 0.5 * (v11 + v22), clipped
