"""Propagating the uncertainty of E and k_self of both couples into log10 k_obs.

Two methods: a seeded, vectorized Monte Carlo (normal draws of E1, E2, ln k11, ln k22, independent), and
first-order (linear) propagation with central-difference derivatives. The model is smooth, so the two
agree where it is near-linear over the spread of the inputs.
"""

from collections.abc import Callable
from dataclasses import dataclass

import numpy as np

#: Default SD of a formal potential when a couple states none, V (common practice for tabulated E deg').
DEFAULT_E_SD_V = 0.010
LN10 = float(np.log(10.0))


@dataclass(frozen=True)
class InputSpread:
    """Standard deviations of the four uncertain inputs: E1_V, E2_V (V), ln_k11, ln_k22 (natural log)."""

    E1_V: float
    E2_V: float
    ln_k11: float
    ln_k22: float

    def as_array(self) -> np.ndarray:
        return np.array([self.E1_V, self.E2_V, self.ln_k11, self.ln_k22], dtype=float)


# model(dE1, dE2, dlnk11, dlnk22) -> ln k_obs; shifts broadcast.
Model = Callable[[np.ndarray, np.ndarray, np.ndarray, np.ndarray], np.ndarray]


def linear_sd(model: Model, spread: InputSpread, steps=(1e-4, 1e-4, 1e-3, 1e-3)) -> float:
    """First-order SD of log10 k_obs: sqrt(sum_i (d log10 k / d x_i * sd_i)^2), central differences."""
    h = np.asarray(steps, dtype=float)
    shifts = np.zeros((8, 4))
    for i in range(4):
        shifts[2 * i, i] = h[i]
        shifts[2 * i + 1, i] = -h[i]
    out = np.asarray(model(shifts[:, 0], shifts[:, 1], shifts[:, 2], shifts[:, 3]), dtype=float)
    grad = (out[0::2] - out[1::2]) / (2.0 * h) / LN10
    return float(np.sqrt(np.sum((grad * spread.as_array()) ** 2)))


def monte_carlo(model: Model, spread: InputSpread, samples: int, seed: int | None = None):
    """(2.5 %, 97.5 %) percentiles and SD of log10 k_obs over `samples` normal draws of the inputs.

    Returns (low, high, sd) in log10(M^-1 s^-1). Reproducible for a given seed. samples must be >= 2 (one
    draw has no spread).
    """
    if samples < 2:
        raise ValueError(f"samples = {samples}: a Monte Carlo interval needs at least 2 draws")
    rng = np.random.default_rng(seed)
    draws = rng.standard_normal((4, samples)) * spread.as_array()[:, None]
    log10_k = np.asarray(model(draws[0], draws[1], draws[2], draws[3]), dtype=float) / LN10
    lo, hi = np.percentile(log10_k, [2.5, 97.5])
    return float(lo), float(hi), float(np.std(log10_k, ddof=1))
