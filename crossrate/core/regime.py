"""Regions of the Marcus driving-force curve and the diffusion-control flag.

Rules (documented in the README):
* endergonic: Delta G deg' > 0;
* activationless: the intrinsic Marcus barrier (lambda/4)(1 + Delta G deg'/lambda)^2 is at most
  ACTIVATIONLESS_BAND_RT x RT, i.e. |Delta G deg' + lambda| <= 2 sqrt(lambda RT) for a band of 1 RT;
* normal: 0 < -Delta G deg' < lambda outside that band;
* inverted: -Delta G deg' > lambda outside that band;
* diffusion-controlled: k_act > DIFFUSION_CONTROL_RATIO x k_D.
"""

import numpy as np

from .constants import GAS_CONSTANT

ENDERGONIC, NORMAL, ACTIVATIONLESS, INVERTED = 0, 1, 2, 3
REGIME_NAMES = ("endergonic", "normal", "activationless", "inverted")
#: Width of the activationless band, as the largest intrinsic barrier counted as "no barrier", in units of RT.
ACTIVATIONLESS_BAND_RT = 1.0
#: k_act / k_D above which the observed rate is called diffusion-controlled.
DIFFUSION_CONTROL_RATIO = 10.0


def classify_regime(dG0_prime, lambda12, T_K, band_RT=ACTIVATIONLESS_BAND_RT):
    """Regime code (ENDERGONIC, NORMAL, ACTIVATIONLESS, INVERTED) for each pair.

    Args:
        dG0_prime: work-corrected driving force Delta G deg', J/mol.
        lambda12: reorganization energy of the cross reaction, J/mol.
        T_K: temperature, K.
        band_RT: half-width of the activationless band as an intrinsic barrier, in RT.

    Returns:
        int8 array of regime codes.
    """
    x = np.asarray(dG0_prime, dtype=float)
    lam = np.asarray(lambda12, dtype=float)
    RT = GAS_CONSTANT * np.asarray(T_K, dtype=float)
    intrinsic = 0.25 * lam * (1.0 + x / lam) ** 2
    code = np.where(-x < lam, NORMAL, INVERTED)
    code = np.where(intrinsic <= band_RT * RT, ACTIVATIONLESS, code)
    code = np.where(x > 0, ENDERGONIC, code)
    return code.astype(np.int8)


def diffusion_controlled(ln_k_act, ln_k_diff, ratio=DIFFUSION_CONTROL_RATIO):
    """True where k_act > ratio x k_D (the measured rate then says little about k_act or the inverted region)."""
    return np.asarray(ln_k_act) > np.asarray(ln_k_diff) + np.log(ratio)


def regime_name(code):
    """Name of a regime code: 'endergonic', 'normal', 'activationless' or 'inverted'."""
    return REGIME_NAMES[int(code)]
