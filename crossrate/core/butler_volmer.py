"""Butler-Volmer rate constants of a one-electron electrode reaction against overpotential."""

import numpy as np

from .constants import FARADAY, GAS_CONSTANT


def butler_volmer_ln_rates(eta_V, ln_k0, alpha, T_K):
    """ln k_red and ln k_ox at overpotential eta (Butler-Volmer kinetics).

    k_red = k0 exp(-alpha f eta), k_ox = k0 exp((1 - alpha) f eta), f = F/RT, eta = E - E0'.

    Args:
        eta_V: overpotential E - E0', V (array).
        ln_k0: ln of the standard rate constant (any length/time unit; the returns share it).
        alpha: transfer coefficient of the reduction, dimensionless (0 < alpha < 1).
        T_K: temperature, K.

    Returns:
        (ln k_red, ln k_ox), arrays shaped like eta_V, in the unit of k0.
    """
    f_eta = FARADAY / (GAS_CONSTANT * float(T_K)) * np.asarray(eta_V, dtype=float)
    return ln_k0 - alpha * f_eta, ln_k0 + (1.0 - alpha) * f_eta
