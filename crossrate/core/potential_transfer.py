"""Carrying a formal potential from the conditions it was measured under to target conditions.

Ionic strength: the formal potential of Ox/Red moves with the activity coefficients of the two forms,
E'(I) = E deg + (RT/nF) ln(gamma_ox(I) / gamma_red(I)) (Nernst equation written with activities), so

    E'(I2) = E'(I1) + (RT/nF) [ln gamma_ox(I2) - ln gamma_red(I2) - ln gamma_ox(I1) + ln gamma_red(I1)].

gamma comes from the extended Debye-Hueckel equation, log10 gamma = -A z^2 sqrt(I) / (1 + B a sqrt(I)), with
the couple's radius as the ion-size parameter a (both forms share it); valid for dilute solutions, I up to
about 0.1 M (common practice). The Davies equation, log10 gamma = -A z^2 (sqrt(I)/(1 + sqrt(I)) - 0.3 I),
is offered as the alternative (up to about 0.5 M, common practice). A and B follow from Debye-Hueckel
theory with the solvent's permittivity at the target temperature, on the molar (mol/L) scale.

Temperature: E'(T) = E'(T0) + (dE/dT) (T - T0), dE/dT = Delta S_rc / (nF) (the reaction entropy of the
half reaction) in V/K.

Everything here is pure arithmetic on arrays; which couple is carried how is decided in the services.
"""

import numpy as np

from .constants import (
    AVOGADRO,
    BOLTZMANN,
    ELEMENTARY_CHARGE,
    FARADAY,
    GAS_CONSTANT,
    VACUUM_PERMITTIVITY,
)

LN10 = float(np.log(10.0))
#: Activity-coefficient equations offered.
EXTENDED_DEBYE_HUCKEL = "extended Debye-Hueckel"
DAVIES = "Davies"
ACTIVITY_MODELS = (EXTENDED_DEBYE_HUCKEL, DAVIES)
#: Ionic strength (mol/L) up to which each equation is trusted (common practice).
ACTIVITY_MODEL_RANGE_M = {EXTENDED_DEBYE_HUCKEL: 0.1, DAVIES: 0.5}


def debye_huckel_B(eps_r, T_K):
    """Debye-Hueckel B = kappa / sqrt(I), 1/(m (mol/L)^(1/2)), with kappa^2 = 2000 N_A e^2 I / (eps0 eps_r k_B T).

    Args:
        eps_r: relative permittivity of the solvent; T_K: temperature, K.
    """
    return np.sqrt(
        2000.0 * AVOGADRO * ELEMENTARY_CHARGE**2
        / (VACUUM_PERMITTIVITY * np.asarray(eps_r, dtype=float) * BOLTZMANN * np.asarray(T_K, dtype=float))
    )


def debye_huckel_A(eps_r, T_K):
    """Debye-Hueckel limiting-law constant A in log10 gamma = -A z^2 sqrt(I), (mol/L)^(-1/2).

    A = e^2 B / (8 pi eps0 eps_r k_B T ln 10) (Debye-Hueckel theory, molar scale; about 0.51 in water at 25 degC).

    Args:
        eps_r: relative permittivity of the solvent; T_K: temperature, K.
    """
    eps = np.asarray(eps_r, dtype=float)
    T = np.asarray(T_K, dtype=float)
    return ELEMENTARY_CHARGE**2 * debye_huckel_B(eps, T) / (8.0 * np.pi * VACUUM_PERMITTIVITY * eps * BOLTZMANN * T * LN10)


def log10_activity_coefficient(z, I_M, ion_size_m, eps_r, T_K, model=EXTENDED_DEBYE_HUCKEL):
    """log10 gamma of an ion of charge z at ionic strength I (molar scale); arrays broadcast.

    Extended Debye-Hueckel: log10 gamma = -A z^2 sqrt(I) / (1 + B a sqrt(I)); Davies:
    log10 gamma = -A z^2 (sqrt(I) / (1 + sqrt(I)) - 0.3 I) (ion_size_m unused).

    Args:
        z: charge (units of e); I_M: ionic strength, mol/L; ion_size_m: ion-size parameter a, m;
        eps_r: relative permittivity; T_K: temperature, K; model: EXTENDED_DEBYE_HUCKEL or DAVIES.

    Returns:
        log10 gamma (dimensionless).
    """
    if model not in ACTIVITY_MODELS:
        raise ValueError(f"activity model {model!r}: expected one of {', '.join(ACTIVITY_MODELS)}")
    sI = np.sqrt(np.asarray(I_M, dtype=float))
    z2 = np.asarray(z, dtype=float) ** 2
    A = debye_huckel_A(eps_r, T_K)
    if model == DAVIES:
        return -A * z2 * (sI / (1.0 + sI) - 0.3 * sI * sI)
    return -A * z2 * sI / (1.0 + debye_huckel_B(eps_r, T_K) * np.asarray(ion_size_m, dtype=float) * sI)


def ionic_strength_shift_V(z_ox, z_red, ion_size_m, I_from_M, I_to_M, eps_r, T_K, model=EXTENDED_DEBYE_HUCKEL):
    """Change of a formal potential between two ionic strengths, V (Nernst equation with activity coefficients).

    dE = (RT/nF) ln 10 [log10 gamma_ox - log10 gamma_red]_(I_from)^(I_to), n = z_ox - z_red; arrays broadcast.

    Args:
        z_ox, z_red: charges of the oxidized and reduced forms; ion_size_m: ion-size parameter, m (the couple's
        radius); I_from_M, I_to_M: ionic strengths, mol/L; eps_r: permittivity and T_K: temperature (K) of the
        target; model: EXTENDED_DEBYE_HUCKEL or DAVIES.

    Returns:
        E'(I_to) - E'(I_from), V.
    """
    z_ox = np.asarray(z_ox, dtype=float)
    z_red = np.asarray(z_red, dtype=float)

    def ratio(I):
        return log10_activity_coefficient(z_ox, I, ion_size_m, eps_r, T_K, model) - log10_activity_coefficient(
            z_red, I, ion_size_m, eps_r, T_K, model
        )

    n = z_ox - z_red
    return GAS_CONSTANT * np.asarray(T_K, dtype=float) * LN10 / (n * FARADAY) * (ratio(I_to_M) - ratio(I_from_M))


def temperature_shift_V(dE_dT_V_per_K, T_from_K, T_to_K):
    """Change of a formal potential with temperature, V: dE = (dE/dT) (T_to - T_from), dE/dT = Delta S_rc / nF.

    Args:
        dE_dT_V_per_K: temperature coefficient of E, V/K; T_from_K, T_to_K: temperatures, K.
    """
    return np.asarray(dE_dT_V_per_K, dtype=float) * (np.asarray(T_to_K, dtype=float) - np.asarray(T_from_K, dtype=float))
