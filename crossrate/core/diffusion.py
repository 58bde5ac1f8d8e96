"""Diffusion limit: Stokes-Einstein diffusion coefficients and the Debye-Smoluchowski encounter rate."""

import numpy as np

from .constants import AVOGADRO, BOLTZMANN, GAS_CONSTANT, LITRES_PER_M3


def stokes_einstein_diffusion(radius_m, viscosity_Pa_s, T_K):
    """D = k_B T / (6 pi eta a) (Stokes-Einstein relation, stick boundary condition).

    Args:
        radius_m: hydrodynamic radius a, m.
        viscosity_Pa_s: solvent viscosity eta, Pa s (1 mPa s = 1e-3 Pa s).
        T_K: temperature, K.

    Returns:
        D, m^2/s.
    """
    return BOLTZMANN * np.asarray(T_K, dtype=float) / (
        6.0 * np.pi * np.asarray(viscosity_Pa_s, dtype=float) * np.asarray(radius_m, dtype=float)
    )


def ln_debye_factor(delta):
    """ln[delta / (e^delta - 1)], the Debye factor for an encounter under a potential w = delta RT.

    Evaluated without overflow for |delta| up to ~1e300 and to full precision near delta = 0 (limit 1).
    """
    d = np.asarray(delta, dtype=float)
    small = np.abs(d) < 1e-6
    safe = np.where(small, 1.0, d)
    pos = safe > 0
    a = np.abs(safe)
    # For both signs: delta/(e^delta - 1) = |delta| e^{-max(delta,0)} / (1 - e^{-|delta|}); -expm1(-a) keeps
    # 1 - e^{-a} to full precision for small a (log1p(-exp(-a)) loses ~1e-11 at a = 1e-6).
    general = np.log(a) - np.where(pos, safe, 0.0) - np.log(-np.expm1(-a))
    # Series near zero: ln(delta/(e^delta-1)) = -delta/2 - delta^2/24 + delta^4/2880 - ... (Bernoulli numbers).
    ds = np.where(small, d, 0.0)  # keeps huge |delta| out of the square (no overflow warning)
    series = -0.5 * ds - ds * ds / 24.0
    return np.where(small, series, general)


def ln_k_diffusion(D1_m2_s, D2_m2_s, distance_m, w12_J_per_mol, T_K):
    """ln k_D, Debye-Smoluchowski diffusion-limited rate constant for ions.

    k_D = 4 pi N_A (D1 + D2) r12 * delta / (e^delta - 1), delta = w12 / RT (Debye 1942 extension of
    Smoluchowski's encounter rate; delta -> 0 recovers 4 pi N_A D r).

    Args:
        D1_m2_s, D2_m2_s: diffusion coefficients of the two reactants, m^2/s.
        distance_m: encounter distance r12, m.
        w12_J_per_mol: work to bring the reactants to r12, J/mol.
        T_K: temperature, K.

    Returns:
        ln k_D, ln(M^-1 s^-1).
    """
    base = 4.0 * np.pi * AVOGADRO * LITRES_PER_M3 * (
        np.asarray(D1_m2_s, dtype=float) + np.asarray(D2_m2_s, dtype=float)
    ) * np.asarray(distance_m, dtype=float)
    delta = np.asarray(w12_J_per_mol, dtype=float) / (GAS_CONSTANT * np.asarray(T_K, dtype=float))
    return np.log(base) + ln_debye_factor(delta)


def ln_k_observed(ln_k_act, ln_k_diff):
    """ln k_obs with 1/k_obs = 1/k_act + 1/k_D (steady-state diffusion-activation combination).

    Args: ln of rate constants in M^-1 s^-1.  Returns ln(M^-1 s^-1).
    """
    return -np.logaddexp(-np.asarray(ln_k_act, dtype=float), -np.asarray(ln_k_diff, dtype=float))
