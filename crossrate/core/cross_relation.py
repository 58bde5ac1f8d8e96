"""The Marcus cross relation with work terms, in ln space.

k12 = (k11 k22 K12 f12)^(1/2) W12, with
ln f12 = [ln K12 + (w12 - w21)/RT]^2 / (4 [ln(k11 k22 / Z^2) + (w11 + w22)/RT]),
W12 = exp[-(w12 + w21 - w11 - w22) / 2RT].
"""

import numpy as np

from .constants import GAS_CONSTANT


def ln_f12(ln_K12, ln_k11, ln_k22, w11, w22, w12, w21, T_K, ln_Z):
    """ln f12 of the Marcus cross relation (general form with work terms).

    Args:
        ln_K12: ln of the equilibrium constant of the cross reaction.
        ln_k11, ln_k22: ln of the self-exchange rate constants at the target conditions, ln(M^-1 s^-1).
        w11, w22: self-exchange work terms, J/mol.
        w12: work to bring Ox1 and Red2 together, J/mol; w21: work for Red1 and Ox2, J/mol.
        T_K: temperature, K.
        ln_Z: ln of the collision factor Z, ln(M^-1 s^-1).

    Returns:
        ln f12 (dimensionless, <= 0 for any physical input).
    """
    RT = GAS_CONSTANT * np.asarray(T_K, dtype=float)
    num = ln_K12 + (w12 - w21) / RT
    den = 4.0 * (ln_k11 + ln_k22 - 2.0 * ln_Z + (w11 + w22) / RT)
    return num * num / den


def ln_W12(w11, w22, w12, w21, T_K):
    """ln W12 = -(w12 + w21 - w11 - w22) / 2RT, the work-term factor of the Marcus cross relation.

    Args: work terms in J/mol; T_K in K.  Returns: ln W12 (dimensionless).
    """
    return -(w12 + w21 - w11 - w22) / (2.0 * GAS_CONSTANT * np.asarray(T_K, dtype=float))


def ln_k12_cross(ln_k11, ln_k22, ln_K12, lnf12, lnW12):
    """ln k12 = [ln k11 + ln k22 + ln K12 + ln f12]/2 + ln W12 (Marcus cross relation).

    All logs of quantities in M^-1 s^-1 (rates) or dimensionless (K12, f12, W12). Returns ln(M^-1 s^-1).
    """
    return 0.5 * (ln_k11 + ln_k22 + ln_K12 + lnf12) + lnW12
