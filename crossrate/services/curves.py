"""Data for the two pictures of a prediction: the driving-force (Marcus) curve and the free-energy surfaces.

Both are computed from a Prediction alone (its lambda12, w12, T, Z, kappa_el12, k_D and Delta G deg'),
through the core: the driving-force curve with crossrate.core.cross_rate.marcus_curve, the regions with
crossrate.core.regime.classify_regime (the same rule the prediction uses), the surfaces with
crossrate.core.energy_surfaces. Energies here are kJ/mol, rates log10(M^-1 s^-1).
"""

from dataclasses import dataclass

import numpy as np

from ..core.constants import KJ
from ..core.cross_rate import marcus_curve
from ..core.energy_surfaces import free_energy_surfaces, surface_crossing
from ..core.regime import classify_regime, regime_name
from .results import Prediction

LN10 = float(np.log(10.0))


@dataclass(frozen=True)
class Region:
    """One stretch of the driving-force axis: name ('endergonic', 'normal', 'activationless', 'inverted')
    and its bounds in -Delta G deg' (kJ/mol)."""

    name: str
    low_kJ: float
    high_kJ: float


@dataclass(frozen=True)
class DrivingForceCurve:
    """log10 k versus -Delta G deg' for one pair's lambda12, w12, T and Z.

    minus_dG0_prime_kJ: axis, kJ/mol; log10_k_act: activation-controlled curve; log10_k_obs: with the
    diffusion cap 1/k_obs = 1/k_act + 1/k_D (equal to log10_k_act when the cap is off); log10_k_diff: k_D of the
    pair or None when the cap is off. pair_x_kJ, pair_log10_k_act, pair_log10_k_obs: the pair's own point.
    regions: contiguous regions in axis order. lambda_kJ: lambda12, where the activationless top sits.
    """

    minus_dG0_prime_kJ: np.ndarray
    log10_k_act: np.ndarray
    log10_k_obs: np.ndarray
    log10_k_diff: float | None
    regions: tuple[Region, ...]
    pair_x_kJ: float
    pair_log10_k_act: float
    pair_log10_k_obs: float
    lambda_kJ: float
    #: For a semiclassical prediction: the semiclassical curve (k_obs, capped like the classical one) and the
    #: -Delta G deg' of its maximum, where its inverted region begins (kJ/mol); None otherwise.
    semiclassical_log10_k_obs: np.ndarray | None = None
    semiclassical_top_kJ: float | None = None


@dataclass(frozen=True)
class EnergySurfaces:
    """Marcus parabolic free-energy surfaces of one pair, kJ/mol, relative to the precursor complex.

    x: reaction coordinate (0 reactants, 1 products); G_react, G_prod: the two parabolas; x_cross, G_cross:
    their crossing (G_cross = intrinsic barrier); lambda_kJ, dG0_prime_kJ; dG_act_kJ = w12_kJ + G_cross.
    """

    x: np.ndarray
    G_react: np.ndarray
    G_prod: np.ndarray
    x_cross: float
    G_cross: float
    lambda_kJ: float
    dG0_prime_kJ: float
    dG_act_kJ: float
    w12_kJ: float


def _regions(x_kJ: np.ndarray, lambda_J: float, T_K: float) -> tuple[Region, ...]:
    codes = classify_regime(-x_kJ * KJ, lambda_J, T_K)
    out, start = [], 0
    for i in range(1, len(codes) + 1):
        if i == len(codes) or codes[i] != codes[start]:
            # Boundaries halfway between the last point of one region and the first of the next.
            lo = x_kJ[0] if start == 0 else 0.5 * (x_kJ[start - 1] + x_kJ[start])
            hi = x_kJ[-1] if i == len(codes) else 0.5 * (x_kJ[i - 1] + x_kJ[i])
            out.append(Region(regime_name(codes[start]), float(lo), float(hi)))
            start = i
    return tuple(out)


def driving_force_curve(prediction: Prediction, points: int = 601) -> DrivingForceCurve:
    """The Marcus curve of a pair from the endergonic side through the inverted region.

    Args:
        prediction: a Prediction (from services.prediction.predict).
        points: number of axis points (>= 3).

    Returns:
        DrivingForceCurve; the axis runs from -0.5 lambda12 to 2.5 lambda12, widened to include the pair. For a
        semiclassical prediction both curves are given: the classical one (log10_k_act, log10_k_obs, the
        regions from lambda12) and the semiclassical one (the classical k_act times the prediction's quantum
        factor Q(-x), services.rate_model), with the position of its maximum.
    """
    p = prediction
    lam_kJ = p.lambda_kJ_per_mol
    x_pair = -p.dG0_prime_kJ_per_mol
    lo = min(-0.5 * lam_kJ, x_pair - 0.1 * lam_kJ)
    hi = max(2.5 * lam_kJ, x_pair + 0.1 * lam_kJ)
    x = np.linspace(lo, hi, max(int(points), 3))
    T = p.conditions.temperature_K
    ln_Z = float(np.log(p.conditions.Z))
    ln_kD = p.log10_k_diff * LN10 if p.conditions.diffusion else None
    ln_act, ln_obs = marcus_curve(
        x * KJ, lam_kJ * KJ, p.work_kJ_per_mol.w12 * KJ, T, ln_Z, ln_kD, ln_kappa12=float(np.log(p.kappa_el12))
    )
    sc_obs = sc_top = None
    if p.rate_model == "semiclassical" and p.semiclassical:
        from ..core.diffusion import ln_k_observed
        from ..core.semiclassical import ln_quantum_factor
        from .rate_model import J_PER_MOL_PER_CM1

        lv = p.semiclassical["lambda_in12_kJ_per_mol"] * KJ
        lam = lam_kJ * KJ
        ln_sc = np.asarray(ln_act) + ln_quantum_factor(-x * KJ, lam - lv, lv,
                                                        p.semiclassical["hbar_omega_cm1"] * J_PER_MOL_PER_CM1, T)
        sc_top = float(x[int(np.argmax(ln_sc))])
        sc_obs = (ln_k_observed(ln_sc, ln_kD) if ln_kD is not None else ln_sc) / LN10
    return DrivingForceCurve(
        semiclassical_log10_k_obs=sc_obs,
        semiclassical_top_kJ=sc_top,
        minus_dG0_prime_kJ=x,
        log10_k_act=np.asarray(ln_act) / LN10,
        log10_k_obs=np.asarray(ln_obs) / LN10,
        log10_k_diff=p.log10_k_diff if p.conditions.diffusion else None,
        regions=_regions(x, lam_kJ * KJ, T),
        pair_x_kJ=float(x_pair),
        pair_log10_k_act=p.log10_k_act,
        pair_log10_k_obs=p.log10_k_obs,
        lambda_kJ=float(lam_kJ),
    )


def energy_surfaces(prediction: Prediction, points: int = 201) -> EnergySurfaces:
    """The reactant and product parabolas of a pair (Marcus parabolic free-energy surfaces), kJ/mol.

    The coordinate range covers both minima and the crossing point with a margin.
    """
    p = prediction
    lam, dG = p.lambda_kJ_per_mol, p.dG0_prime_kJ_per_mol
    x_star, g_star = surface_crossing(lam, dG)
    lo = min(-0.35, x_star - 0.2)
    hi = max(1.35, x_star + 0.2)
    x = np.linspace(lo, hi, max(int(points), 3))
    g_r, g_p = free_energy_surfaces(x, lam, dG)
    w12 = p.work_kJ_per_mol.w12
    return EnergySurfaces(
        x=x,
        G_react=g_r,
        G_prod=g_p,
        x_cross=float(x_star),
        G_cross=float(g_star),
        lambda_kJ=float(lam),
        dG0_prime_kJ=float(dG),
        dG_act_kJ=float(w12 + g_star),
        w12_kJ=float(w12),
    )
