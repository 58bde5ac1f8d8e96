"""Propagating the uncertainty of E and k_self of both couples, and of the diffusion limit, into log10 k_obs.

Two methods: a seeded, vectorized Monte Carlo (normal draws of E1, E2, ln k11, ln k22 and ln k_D,
independent), and first-order (linear) propagation with central-difference derivatives. The model is smooth,
so the two agree where it is near-linear over the spread of the inputs.

k_D (Stokes-Einstein diffusion coefficients from the couples' radii and the solvent viscosity, Debye's
encounter integral) is uncertain through the radii, the viscosity and the hydrodynamic model itself (stick
or slip, a sphere for a molecule, continuum screening): such a k_D is good to about a factor of 2 (common
practice). The project's choice is a default SD of 0.3 in log10 k_D (a factor of 2 at one SD).
"""

from collections.abc import Callable
from typing import NamedTuple

import numpy as np

#: Default SD of a formal potential when a couple states none, V (common practice for tabulated E deg').
DEFAULT_E_SD_V = 0.010
#: Default SD of log10 k_D (the project's choice: a Stokes-Einstein, Debye k_D is good to about a factor of 2).
DEFAULT_K_DIFF_LOG10_SD = 0.3
LN10 = float(np.log(10.0))


def percentiles_linear(x, percents) -> np.ndarray:
    """np.percentile(x, percents) of a 1-D float array with numpy's default "linear" method (Hyndman and Fan
    definition 7), computed step for step as numpy computes it, so the numbers are the same to the last bit.

    Why not np.percentile itself: it calls np.unique, which imports numpy.ma, about 7 ms of a cold
    `crossrate predict` that otherwise never needs it. percents in [0, 100]; returns the same units as x.
    """
    s = np.sort(np.asarray(x, dtype=float))
    n = s.shape[0]
    q = np.true_divide(np.asarray(percents, dtype=float), 100)
    virtual = (n - 1) * q
    previous = np.floor(virtual)
    following = previous + 1
    above = virtual >= n - 1
    previous[above] = -1
    following[above] = -1
    below = virtual < 0
    previous[below] = 0
    following[below] = 0
    nan = np.isnan(virtual)
    previous[nan] = -1
    following[nan] = -1
    previous = previous.astype(np.intp)
    following = following.astype(np.intp)
    a, b = s[previous], s[following]
    gamma = virtual - previous
    diff = b - a
    out = a + diff * gamma
    np.subtract(b, diff * (1 - gamma), out=out, where=gamma >= 0.5)
    if np.isnan(s[-1]):  # a NaN sorts last; numpy then gives NaN for every percentile
        out[...] = np.nan
    return out


# A NamedTuple, not a frozen dataclass: an internal record on the path of every prediction, and Python 3.11
# compiles a dataclass's six methods at import (about 1 ms a class of a cold command; see DEVELOPERS.md).
class InputSpread(NamedTuple):
    """Standard deviations of the uncertain inputs: E1_V, E2_V (V), ln_k11, ln_k22 and ln_k_diff (natural
    log; 0 when the diffusion cap is off)."""

    E1_V: float
    E2_V: float
    ln_k11: float
    ln_k22: float
    ln_k_diff: float = 0.0

    def as_array(self) -> np.ndarray:
        return np.array([self.E1_V, self.E2_V, self.ln_k11, self.ln_k22, self.ln_k_diff], dtype=float)


# model(dE1, dE2, dlnk11, dlnk22, dlnkD) -> ln k_obs; shifts broadcast.
Model = Callable[[np.ndarray, np.ndarray, np.ndarray, np.ndarray, np.ndarray], np.ndarray]
#: Central-difference steps: V for the potentials, natural-log units for the rates.
STEPS = (1e-4, 1e-4, 1e-3, 1e-3, 1e-3)


def gradient(model: Model, steps=STEPS) -> np.ndarray:
    """d ln k_obs / d x_i for the five inputs (per V for E, dimensionless for the ln k), central differences."""
    h = np.asarray(steps, dtype=float)
    n = h.shape[0]
    shifts = np.zeros((2 * n, n))
    for i in range(n):
        shifts[2 * i, i] = h[i]
        shifts[2 * i + 1, i] = -h[i]
    out = np.asarray(model(*(shifts[:, i] for i in range(n))), dtype=float)
    return (out[0::2] - out[1::2]) / (2.0 * h)


def linear_sd(model: Model, spread: InputSpread, steps=STEPS, grad=None) -> float:
    """First-order SD of log10 k_obs: sqrt(sum_i (d log10 k / d x_i * sd_i)^2), central differences (or the
    gradient from gradient(), natural-log units, when given)."""
    g = gradient(model, steps) if grad is None else np.asarray(grad, dtype=float)
    return float(np.sqrt(np.sum((g / LN10 * spread.as_array()) ** 2)))


def monte_carlo(model: Model, spread: InputSpread, samples: int, seed: int | None = None):
    """(2.5 %, 97.5 %) percentiles and SD of log10 k_obs over `samples` normal draws of the inputs.

    Returns (low, high, sd) in log10(M^-1 s^-1). Reproducible for a given seed. samples must be >= 2 (one
    draw has no spread).
    """
    if samples < 2:
        raise ValueError(f"samples = {samples}: a Monte Carlo interval needs at least 2 draws")
    rng = np.random.default_rng(seed)
    draws = rng.standard_normal((5, samples)) * spread.as_array()[:, None]
    log10_k = np.asarray(model(*draws), dtype=float) / LN10
    lo, hi = percentiles_linear(log10_k, (2.5, 97.5))
    return float(lo), float(hi), float(np.std(log10_k, ddof=1))
