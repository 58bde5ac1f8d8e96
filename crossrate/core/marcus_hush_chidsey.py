"""Marcus-Hush-Chidsey rate constants of an electrode reaction: Marcus kinetics summed over the metal's
electronic states weighted by the Fermi-Dirac distribution.

For reduction with an electron taken from a metal level at energy x kT above the Fermi level,
the Marcus rate is proportional to exp(-(x - lambda - e eta)^2 / (4 lambda kT)) and the level is occupied
with probability 1/(1 + e^x); the rate constant is the integral over all levels (Chidsey, Science 251, 919
(1991), from memory). In units of kT (lam = lambda/kT, u = e eta/kT):

    k_red(eta) proportional to J(lam + u),  k_ox(eta) proportional to J(lam - u),
    J(c) = integral of exp(-(x - c)^2 / (4 lam)) / (1 + e^x) dx over all x,

normalized so that k_red(0) = k_ox(0) = k0. Unlike the Marcus rate of a reaction in solution, k(eta) does not
fall again at large overpotential: metal levels below the Fermi level always offer an activationless channel,
so the inverted region is hidden and the rate levels off at k0 sqrt(4 pi lam) / J(lam).

J is computed by the trapezoidal rule on a uniform grid in x. The integrand is analytic in a strip of
half-width pi about the real axis (the Fermi function's nearest poles are at x = +-i pi), so the rule's error
falls like exp(-2 pi^2 / h): with h = 0.5 kT it is below 1e-15 relative, and the sum is taken in log space.
"""

import numpy as np

from .constants import FARADAY, GAS_CONSTANT

#: Grid step of the Fermi-level integral, units of kT (see the module docstring for the error bound).
_STEP_KT = 0.5
#: Half-widths of the integration window in Gaussian standard deviations (contributions below e^-45 dropped).
_WINDOW_SD = 9.5


def ln_fermi_integral(c, lam):
    """ln J(c) with J(c) = integral exp(-(x - c)^2/(4 lam)) / (1 + exp x) dx (Marcus-Hush-Chidsey integral).

    Args:
        c: centre of the Marcus Gaussian relative to the Fermi level, units of kT (array).
        lam: reorganization energy at the electrode, units of kT (scalar > 0).

    Returns:
        ln J, array shaped like c (dimensionless; J carries the unit kT of the integration variable).
    """
    lam = float(lam)
    if not lam > 0.0:
        raise ValueError(f"reorganization energy {lam!r} kT: expected a positive number")
    c = np.asarray(c, dtype=float)
    sd = np.sqrt(2.0 * lam)
    h = min(_STEP_KT, sd / 4.0)
    # The log integrand is concave with curvature >= 1/(2 lam); its peak lies near s = clip(-c, -2 lam, 0)
    # (within a few kT), so a window of +-_WINDOW_SD standard deviations about that point drops < e^-40.
    t = np.arange(-_WINDOW_SD * sd, _WINDOW_SD * sd + h, h)
    flat = c.reshape(-1, 1)
    s = np.clip(-flat, -2.0 * lam, 0.0) + t
    log_f = -(s * s) / (4.0 * lam) - np.logaddexp(0.0, flat + s)
    top = log_f.max(axis=1, keepdims=True)
    out = np.log(h) + top[:, 0] + np.log(np.exp(log_f - top).sum(axis=1))
    return out.reshape(c.shape)


def mhc_ln_rates(eta_V, ln_k0, lambda_J_per_mol, T_K):
    """ln k_red and ln k_ox at overpotential eta under Marcus-Hush-Chidsey kinetics (see module docstring).

    Args:
        eta_V: overpotential E - E0', V (array).
        ln_k0: ln of the standard rate constant (any unit; the returns share it).
        lambda_J_per_mol: reorganization energy at the electrode, J/mol (> 0).
        T_K: temperature, K.

    Returns:
        (ln k_red, ln k_ox), arrays shaped like eta_V.
    """
    RT = GAS_CONSTANT * float(T_K)
    lam = float(lambda_J_per_mol) / RT
    u = FARADAY / RT * np.asarray(eta_V, dtype=float)
    ref = ln_fermi_integral(np.array(lam), lam)
    both = ln_fermi_integral(np.concatenate([np.ravel(lam + u), np.ravel(lam - u)]), lam)
    n = u.size
    return (ln_k0 + both[:n].reshape(u.shape) - ref, ln_k0 + both[n:].reshape(u.shape) - ref)


def mhc_plateau_ln_ratio(lambda_J_per_mol, T_K):
    """ln of k(eta -> +-infinity)/k0 under Marcus-Hush-Chidsey kinetics: ln[sqrt(4 pi lam) / J(lam)], with
    lam = lambda/RT (the level the rate reaches where the Marcus rate in solution would fall again)."""
    lam = float(lambda_J_per_mol) / (GAS_CONSTANT * float(T_K))
    return 0.5 * np.log(4.0 * np.pi * lam) - float(ln_fermi_integral(np.array(lam), lam))
