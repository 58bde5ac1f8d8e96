"""One vectorized evaluation of a cross reaction Ox1 + Red2 -> Red1 + Ox2: work terms, the Marcus cross
relation, the barrier form, the diffusion limit and the regime, for arrays of pairs that broadcast.

For millions of pairs at one set of conditions, when only ln k_obs (and the regime) is wanted,
crossrate.core.rate_grid gives the same numbers some 40x faster."""

from typing import NamedTuple

import numpy as np

from .barrier import (
    activation_free_energy,
    cross_lambda,
    self_exchange_lambda,
    work_corrected_driving_force,
)
from .constants import GAS_CONSTANT
from .cross_relation import ln_f12, ln_k12_cross, ln_W12
from .diffusion import ln_k_diffusion, ln_k_observed, stokes_einstein_diffusion
from .driving_force import ln_equilibrium_constant, reaction_free_energy
from .regime import classify_regime, diffusion_controlled
from .screened_debye_table import bjerrum_length, screened_ln_factor
from .work_terms import debye_kappa, work_term


# A NamedTuple, not a frozen dataclass: an internal record on the path of every prediction, and Python 3.11
# compiles a dataclass's six methods at import (about 1 ms a class of a cold command; see DEVELOPERS.md).
class CrossRateArrays(NamedTuple):
    """Everything computed for a set of pairs. Energies J/mol, logs of rates ln(M^-1 s^-1)."""

    dG0: np.ndarray
    dG0_prime: np.ndarray
    ln_K12: np.ndarray
    w11: np.ndarray
    w22: np.ndarray
    w12: np.ndarray
    w21: np.ndarray
    lambda11: np.ndarray
    lambda22: np.ndarray
    lambda12: np.ndarray
    dG_act: np.ndarray
    ln_f12: np.ndarray
    ln_W12: np.ndarray
    ln_k_act: np.ndarray
    ln_k_diff: np.ndarray
    ln_k_obs: np.ndarray
    regime: np.ndarray
    diffusion_controlled: np.ndarray
    #: ln kappa12 = (ln kappa11 + ln kappa22)/2, the pair's electronic transmission factor (0 when adiabatic).
    ln_kappa12: np.ndarray | float = 0.0


def cross_rate(
    E1_V,
    E2_V,
    z_ox1,
    z_red1,
    z_ox2,
    z_red2,
    r1_m,
    r2_m,
    ln_k11,
    ln_k22,
    T_K,
    I_M,
    eps_r,
    viscosity_Pa_s,
    ln_Z,
    diffusion=True,
    ln_kappa11=0.0,
    ln_kappa22=0.0,
    d_ln_k_diff=0.0,
):
    """Marcus cross relation with work terms and Debye's diffusion cap, for many pairs.

    Diffusion limit: k_D = 4 pi N_A (D1 + D2) r12 F, D from Stokes-Einstein, F the Debye factor of Debye's
    (1942) integral; at finite ionic strength with the screened (Debye-Hueckel) potential, evaluated
    numerically (crossrate.core.screened_diffusion), at I = 0 the closed form delta / (e^delta - 1).

    Electronic transmission factors (non-adiabatic couples): each self-exchange is taken as
    k_ii = kappa_ii Z exp(-(w_ii + lambda_ii/4)/RT) and the cross reaction as
    k12 = kappa12 Z exp(-Delta G double-dagger_12/RT) with kappa12 = (kappa11 kappa22)^(1/2) (the usual
    geometric-mean rule, H_AB,12^2 = H_AB,11 H_AB,22 in the non-adiabatic limit). Then lambda_ii comes from
    ln(kappa_ii Z / k_ii), and the cross relation keeps its form with Z^2 in f12 replaced by
    kappa11 kappa22 Z^2. With kappa = 1 (ln_kappa = 0) this is the textbook adiabatic relation.

    Args:
        E1_V: potential of the oxidant's couple Ox1/Red1, V; E2_V: of the reductant's couple Ox2/Red2, V
            (same scale).
        z_ox1, z_red1, z_ox2, z_red2: charges of the four species.
        r1_m, r2_m: couple radii, m (r11 = 2 r1, r22 = 2 r2, r12 = r21 = r1 + r2).
        ln_k11, ln_k22: ln self-exchange rate constants already carried to these conditions, ln(M^-1 s^-1).
        T_K: temperature, K; I_M: ionic strength, mol/L; eps_r: relative permittivity; viscosity_Pa_s: Pa s.
        ln_Z: ln of the collision factor Z, ln(M^-1 s^-1).
        diffusion: apply the diffusion cap 1/k_obs = 1/k_act + 1/k_D; when False k_obs = k_act.
        ln_kappa11, ln_kappa22: ln of the electronic transmission factors kappa_el of the two couples
            (0 < kappa <= 1, so ln_kappa <= 0; default 0, adiabatic).
        d_ln_k_diff: shift added to ln k_D (natural log), for propagating the uncertainty of k_D.

    Returns:
        CrossRateArrays (J/mol and ln(M^-1 s^-1)).
    """
    r1 = np.asarray(r1_m, dtype=float)
    r2 = np.asarray(r2_m, dtype=float)
    r12 = r1 + r2
    w11 = work_term(z_ox1, z_red1, 2.0 * r1, eps_r, T_K, I_M)
    w22 = work_term(z_ox2, z_red2, 2.0 * r2, eps_r, T_K, I_M)
    w12 = work_term(z_ox1, z_red2, r12, eps_r, T_K, I_M)
    w21 = work_term(z_red1, z_ox2, r12, eps_r, T_K, I_M)

    dG0 = reaction_free_energy(E1_V, E2_V)
    lnK = ln_equilibrium_constant(dG0, T_K)
    # Rates with the transmission factor taken out, k_ii / kappa_ii = Z exp(-(w_ii + lambda_ii/4)/RT): the
    # adiabatic relation holds for them, and kappa12 = (kappa11 kappa22)^(1/2) is put back on k12.
    lk1 = np.asarray(ln_k11, dtype=float) - np.asarray(ln_kappa11, dtype=float)
    lk2 = np.asarray(ln_k22, dtype=float) - np.asarray(ln_kappa22, dtype=float)
    ln_kappa12 = 0.5 * (np.asarray(ln_kappa11, dtype=float) + np.asarray(ln_kappa22, dtype=float))
    lnf = ln_f12(lnK, lk1, lk2, w11, w22, w12, w21, T_K, ln_Z)
    lnW = ln_W12(w11, w22, w12, w21, T_K)
    ln_k_act = ln_k12_cross(lk1, lk2, lnK, lnf, lnW) + ln_kappa12

    lam11 = self_exchange_lambda(lk1, w11, T_K, ln_Z)
    lam22 = self_exchange_lambda(lk2, w22, T_K, ln_Z)
    lam12 = cross_lambda(lam11, lam22)
    dG0p = work_corrected_driving_force(dG0, w12, w21)
    dGact = activation_free_energy(lam12, dG0p, w12)

    D1 = stokes_einstein_diffusion(r1, viscosity_Pa_s, T_K)
    D2 = stokes_einstein_diffusion(r2, viscosity_Pa_s, T_K)
    kappa = debye_kappa(I_M, eps_r, T_K)
    if np.all(np.asarray(kappa) == 0.0):
        ln_kD = ln_k_diffusion(D1, D2, r12, w12, T_K)  # unscreened: the closed form is Debye's integral exactly
    else:
        zz = np.asarray(z_ox1, dtype=float) * np.asarray(z_red2, dtype=float)
        ln_kD = ln_k_diffusion(D1, D2, r12, 0.0, T_K) + screened_ln_factor(zz, r12, bjerrum_length(eps_r, T_K), kappa)
    ln_kD = ln_kD + np.asarray(d_ln_k_diff, dtype=float)
    ln_kobs = ln_k_observed(ln_k_act, ln_kD) if diffusion else np.asarray(ln_k_act, dtype=float)

    return CrossRateArrays(
        dG0=dG0,
        dG0_prime=dG0p,
        ln_K12=lnK,
        w11=w11,
        w22=w22,
        w12=w12,
        w21=w21,
        lambda11=lam11,
        lambda22=lam22,
        lambda12=lam12,
        dG_act=dGact,
        ln_f12=lnf,
        ln_W12=lnW,
        ln_k_act=ln_k_act,
        ln_k_diff=ln_kD,
        ln_k_obs=ln_kobs,
        regime=classify_regime(dG0p, lam12, T_K),
        diffusion_controlled=diffusion_controlled(ln_k_act, ln_kD) & bool(diffusion),
        ln_kappa12=ln_kappa12,
    )


def marcus_curve(minus_dG0_prime, lambda12, w12, T_K, ln_Z, ln_k_diff=None, ln_kappa12=0.0):
    """ln k_act (and ln k_obs if ln_k_diff given) along a driving-force axis, for drawing the Marcus curve.

    ln k_act = ln(kappa12 Z) - Delta G double-dagger/RT (Marcus barrier form, as in cross_rate).

    Args:
        minus_dG0_prime: -Delta G deg' values, J/mol (array).
        lambda12: reorganization energy, J/mol; w12: precursor work, J/mol; T_K: K; ln_Z: ln(M^-1 s^-1).
        ln_k_diff: ln k_D of the pair, ln(M^-1 s^-1), or None for no cap.
        ln_kappa12: ln of the pair's electronic transmission factor (0, adiabatic, by default).

    Returns:
        (ln_k_act, ln_k_obs) arrays, ln(M^-1 s^-1); ln_k_obs equals ln_k_act when ln_k_diff is None.
    """
    x = -np.asarray(minus_dG0_prime, dtype=float)
    ln_act = ln_Z + ln_kappa12 - activation_free_energy(lambda12, x, w12) / (GAS_CONSTANT * T_K)
    ln_obs = ln_act if ln_k_diff is None else ln_k_observed(ln_act, ln_k_diff)
    return ln_act, ln_obs
