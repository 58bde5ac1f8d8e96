"""Saying when a prediction's interval is narrow because the model is flat, not because the inputs are known.

The interval propagates the SDs of E and k_self through the slopes of ln k_obs. Two places make those slopes
small whatever the data: the diffusion plateau (d ln k_obs / d ln k_act = 1 - k_obs/k_D -> 0) and the
activationless top of the Marcus curve (d ln k_act / d ln K12 = (1 + Delta G deg'/lambda)/2 and
d ln k_act / d ln k_ii = (1 - (Delta G deg'/lambda)^2)/2, both 0 at -Delta G deg' = lambda). There a narrow
interval says nothing about how well E or k_self are known.

Rule (documented in the README): the note is given when the first-order spread that E and k_self produce
is below FLAT_RATIO of what the same SDs give at the reference slopes of the cross relation at
Delta G deg' = 0 without a cap (1/2 for ln K12, so F/2RT per volt of E, and 1/2 for each ln k_ii).
"""

import numpy as np

from ..core.constants import FARADAY, GAS_CONSTANT

#: Below this fraction of the reference spread the model is called flat (the interval is then at most a
#: third as wide as the same input SDs would give in the normal region near Delta G deg' = 0).
FLAT_RATIO = 1.0 / 3.0
#: A cause is named when its own factor on the slopes is below this: 1 - k_obs/k_D for the plateau,
#: |1 + Delta G deg'/lambda| for the activationless top (the factor on the slope in ln K12).
CAUSE_FACTOR = 0.5


def flatness(grad, sds, T_K: float) -> float:
    """Spread from E and k_self as a fraction of the reference spread (see module docstring).

    Args:
        grad: d ln k_obs / d (E1 V, E2 V, ln k11, ln k22, ...) (only the first four are read).
        sds: SDs of the same inputs (V, V, ln units, ln units).
        T_K: temperature, K.

    Returns:
        the ratio (dimensionless; NaN when every SD is zero).
    """
    g = np.asarray(grad, dtype=float)[:4]
    s = np.asarray(sds, dtype=float)[:4]
    reference = np.array([0.5 * FARADAY / (GAS_CONSTANT * T_K)] * 2 + [0.5, 0.5]) * s
    ref = float(np.sqrt(np.sum(reference**2)))
    if ref == 0.0:
        return float("nan")
    return float(np.sqrt(np.sum((g * s) ** 2))) / ref


def flat_model_note(ratio: float, k_obs_over_k_diff: float | None, dG0_prime_over_lambda: float,
                    k_diff_log10_sd: float) -> str | None:
    """One line when ratio < FLAT_RATIO, naming the cause(s), else None.

    Args:
        ratio: from flatness().
        k_obs_over_k_diff: k_obs / k_D (None when the cap is off).
        dG0_prime_over_lambda: Delta G deg' / lambda12 (-1 at the activationless top).
        k_diff_log10_sd: the SD of log10 k_D propagated (0 when the cap is off).
    """
    if not (np.isfinite(ratio) and ratio < FLAT_RATIO):
        return None
    plateau = k_obs_over_k_diff is not None and 1.0 - k_obs_over_k_diff < CAUSE_FACTOR
    causes = [f"on the diffusion plateau (k_obs = {k_obs_over_k_diff:.2f} k_D)"] if plateau else []
    if abs(1.0 + dG0_prime_over_lambda) < CAUSE_FACTOR:
        causes.append("near the activationless top (-ΔG°' ≈ λ)")
    where = " and ".join(causes) if causes else "here"
    tail = (f"; the interval is mostly the k_D uncertainty (SD {k_diff_log10_sd:g} in log10 k_D)" if plateau
            else "; it is narrow because the model is flat, not because E and k_self are well known")
    return f"flat model {where}: k_obs moves with E and k_self only {ratio:.0%} as much as in the normal region" + tail
