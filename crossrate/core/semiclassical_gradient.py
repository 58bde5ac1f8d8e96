"""Derivatives of the semiclassical (Marcus–Levich–Jortner) ln k with respect to lambda_s and lambda_v, for
fitting a driving-force series (an analytic Jacobian instead of finite differences).

With the sum of crossrate.core.semiclassical written as ln k = ln A + (1/2) ln(lambda / lambda_s) +
ln sum_n exp(t_n), t_n = ln P_n(S) - u_n^2 / (4 lambda_s RT), u_n = Delta G deg + lambda_s + n hbar omega,
S = lambda_v / hbar omega, and w_n = exp(t_n) / sum exp(t) the share of level n:

    d ln k / d lambda_s = 1/(2 lambda) - 1/(2 lambda_s) + sum_n w_n u_n (u_n - 2 lambda_s) / (4 lambda_s^2 RT),
    d ln k / d lambda_v = 1/(2 lambda) + (1/hbar omega) sum_n w_n d ln P_n / dS,

and for the Skellam weight P_n = sum_k Pois(n + k; S(nu + 1)) Pois(k; S nu) (d ln Pois(m; mu)/d mu = m/mu - 1)
d ln P_n / dS = (n + 2 <k>_n) / S - (2 nu + 1), <k>_n the mean of k in the inner sum. At S = 0 (no quantized
part) only P_-1, P_0 and P_1 move (dP/dS = nu, -(2 nu + 1), nu + 1): d ln k / dS = ((nu + 1) G_1 + nu G_-1)
/ G_0 - (2 nu + 1), G_n = exp(-u_n^2 / (4 lambda_s RT)).

The cold-mode window (the usual case, hbar omega >> RT) is summed here; otherwise the derivatives come from
central differences of mlj_ln_k. Energies J/mol, T in K.
"""

import math

import numpy as np

from .constants import GAS_CONSTANT
from .semiclassical import _inner_terms, _ln_factorial_table, _tails_ok, mlj_ln_k


def _window(x, ls, S, nu, hw, RT):
    """First level and number of levels that hold every point's terms: from the peak of the product of the
    Skellam weight and the Gaussian in n (as crossrate.core.semiclassical) out to the Gaussian's own centre,
    which a small S (a Poisson weight far narrower than a Gaussian approximation of it) can leave far off."""
    var_p, var_g = S * (2.0 * nu + 1.0), 2.0 * ls * RT / hw**2
    centres = [-(v + ls) / hw for v in (float(x.min()), float(x.max()))]
    if var_p > 0:
        ends = [(S * var_g + c * var_p) / (var_p + var_g) for c in centres] + centres
        half = math.ceil(8.0 * math.sqrt(var_p * var_g / (var_p + var_g)) + 8.0)
    else:
        ends, half = [0.0, 0.0], 8
    start = math.floor(min(ends)) - half
    if nu == 0.0 or S * nu == 0.0:
        start = max(start, 0)
    return start, math.ceil(max(ends)) + half - start + 1


def _cold_sum(x, ls, lv, hw, T, gradient):
    RT = GAS_CONSTANT * T
    S = lv / hw
    nu = 1.0 / math.expm1(hw / RT)
    mu1, mu2 = S * (nu + 1.0), S * nu
    if math.sqrt(mu1 * mu2) >= 1.0 or x.size == 0:
        return None
    K = _inner_terms(np.array([mu1]), np.array([mu2]))
    start, W = _window(x, ls, S, nu, hw, RT)
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
    ek = np.exp(tk - mk[:, None])
    sk = ek.sum(axis=1)
    lp = np.log(sk) + mk - mu1 - mu2
    u = x[:, None] + ls + n * hw
    t = lp - u * u / (4.0 * ls * RT)
    if not np.all(np.isfinite(t)):
        return None
    tmax = t.max(axis=1)
    if not _tails_ok(t, mu2 == 0.0 and start == 0).all():  # n = 0 of a cold mode: nothing lies to the left
        return None
    e = np.exp(t - tmax[:, None])
    z = e.sum(axis=1)
    lam = ls + lv
    ln_k = 0.5 * math.log(lam / ls) + np.log(z) + tmax
    if not gradient:
        return ln_k
    w = e / z[:, None]
    d_ls = 0.5 / lam - 0.5 / ls + (w * (u * (u - 2.0 * ls))).sum(axis=1) / (4.0 * ls * ls * RT)
    if S > 0.0:
        mean_k = (ek * k).sum(axis=1) / sk
        dlp = (n + 2.0 * mean_k) / S - (2.0 * nu + 1.0)
        d_lv = 0.5 / lam + (w * dlp).sum(axis=1) / hw
    else:
        g = -(x[:, None] + ls + np.array([-1.0, 0.0, 1.0]) * hw) ** 2 / (4.0 * ls * RT)
        d_lv = 0.5 / lam + ((nu + 1.0) * np.exp(g[:, 2] - g[:, 1]) + nu * np.exp(g[:, 0] - g[:, 1])
                            - (2.0 * nu + 1.0)) / hw
    return ln_k, d_ls, d_lv


def mlj_ln_k_curve(dG0_J_per_mol, lambda_s_J_per_mol, lambda_v_J_per_mol, hbar_omega_J_per_mol, T_K):
    """ln k of the Marcus–Levich–Jortner rate with ln A = 0 for one set of parameters over a 1-D array of
    Delta G deg (J/mol; the rest scalars in J/mol and K): the same sum as mlj_ln_k, one window of levels for
    every point (the fitted curve's fast path), mlj_ln_k itself where that does not apply."""
    x = np.asarray(dG0_J_per_mol, dtype=float).reshape(-1)
    ls, lv, hw, T = float(lambda_s_J_per_mol), float(lambda_v_J_per_mol), float(hbar_omega_J_per_mol), float(T_K)
    out = _cold_sum(x, ls, lv, hw, T, False)
    return mlj_ln_k(x, ls, lv, hw, T) if out is None else out


def mlj_ln_k_gradient(dG0_J_per_mol, lambda_s_J_per_mol, lambda_v_J_per_mol, hbar_omega_J_per_mol, T_K):
    """ln k of the Marcus–Levich–Jortner rate (Ulstrup & Jortner 1975; Jortner 1976; from memory) with
    ln A = 0, and its derivatives with respect to lambda_s and lambda_v (module docstring).

    Args: dG0_J_per_mol 1-D array (J/mol); lambda_s (> 0), lambda_v (>= 0), hbar omega (> 0) scalars in
    J/mol; T_K scalar, K.
    Returns: (ln k, d ln k / d lambda_s, d ln k / d lambda_v): arrays like dG0, the derivatives in mol/J.
    """
    x = np.asarray(dG0_J_per_mol, dtype=float).reshape(-1)
    ls, lv, hw, T = float(lambda_s_J_per_mol), float(lambda_v_J_per_mol), float(hbar_omega_J_per_mol), float(T_K)
    out = _cold_sum(x, ls, lv, hw, T, True)
    if out is not None:
        return out
    # A warm mode (or a window too wide for one pass): central differences (forward where lambda_v = 0).
    base = mlj_ln_k(x, ls, lv, hw, T)
    hs = 1e-6 * ls
    d_ls = (mlj_ln_k(x, ls + hs, lv, hw, T) - mlj_ln_k(x, ls - hs, lv, hw, T)) / (2.0 * hs)
    hv = 1e-6 * max(lv, ls)
    if lv > hv:
        d_lv = (mlj_ln_k(x, ls, lv + hv, hw, T) - mlj_ln_k(x, ls, lv - hv, hw, T)) / (2.0 * hv)
    else:
        d_lv = (mlj_ln_k(x, ls, lv + hv, hw, T) - base) / hv
    return base, d_ls, d_lv
