"""The split of a semiclassical fit's lambda into its solvent (lambda_s) and quantized-mode (lambda_v) parts,
with 95 % intervals, and whether the series determines them separately.

The fit's parameters are lambda = lambda_s + lambda_v and phi = lambda_v / lambda; the split's standard errors
come from their Jacobian covariance by the delta method, and each 95 % interval is taken on a log scale
(lambda_x exp(+-1.96 SE / lambda_x); both parts are positive). A series pins the sum far better than the split
when it has few points past the maximum, a narrow range of driving force or much scatter; the split is then
said not to be determined rather than given as if it were.
"""

import math
from dataclasses import dataclass

import numpy as np

from .series_models import PHI_BOUNDS

#: The split is called determined when each 95 % interval lies within this fraction of its value.
SPLIT_TOLERANCE = 0.10


@dataclass(frozen=True)
class LambdaSplit:
    """lambda_s and lambda_v (kJ/mol) with SEs and 95 % intervals (a side None when open), and the verdict."""

    lambda_s: float
    lambda_s_se: float
    lambda_s_95: tuple[float | None, float | None]
    lambda_v: float
    lambda_v_se: float
    lambda_v_95: tuple[float | None, float | None]
    determined: bool


def _log_interval(value, se):
    if not (value > 0 and np.isfinite(se)):
        return None, None
    r = 1.96 * se / value
    return (value * math.exp(-r), value * math.exp(r)) if r < 5.0 else (None, None)


def lambda_split(lam: float, phi: float, cov2, favoured: bool) -> LambdaSplit:
    """The split of a semiclassical fit: lam (kJ/mol) and phi (lambda_v / lambda) with their 2 x 2 covariance
    cov2; favoured: whether the semiclassical model is the one the data favour (the split counts only then).

    Determined: the model is favoured, phi lies inside its range (not pinned at 0, no quantized part, or at
    its upper bound) and both intervals lie within SPLIT_TOLERANCE of their values.
    """
    ls, lv = lam * (1.0 - phi), lam * phi
    # Delta method: d(lambda_s) = (1 - phi) d lambda - lambda d phi; d(lambda_v) = phi d lambda + lambda d phi.
    g_s, g_v = np.array([1.0 - phi, -lam]), np.array([phi, lam])
    ls_se = float(np.sqrt(max(g_s @ cov2 @ g_s, 0.0)))
    lv_se = float(np.sqrt(max(g_v @ cov2 @ g_v, 0.0)))
    s95, v95 = _log_interval(ls, ls_se), _log_interval(lv, lv_se)
    inside = PHI_BOUNDS[0] + 1e-3 < phi < PHI_BOUNDS[1] - 1e-6

    def tight(v, iv):
        return iv[0] is not None and iv[1] is not None and iv[1] <= v * (1.0 + SPLIT_TOLERANCE) \
            and iv[0] >= v * (1.0 - SPLIT_TOLERANCE)

    determined = bool(favoured and inside and tight(ls, s95) and tight(lv, v95))
    return LambdaSplit(ls, ls_se, s95, lv, lv_se, v95, determined)


def split_statement(split: LambdaSplit, favoured: bool) -> str:
    """One sentence on the split (kJ/mol)."""
    def iv(v):
        return f"[{'open' if v[0] is None else f'{v[0]:.1f}'}, {'open' if v[1] is None else f'{v[1]:.1f}'}]"

    no_mode = split.lambda_v <= 1e-3 * (split.lambda_s + split.lambda_v)
    values = (f"lambda_s = {split.lambda_s:.1f}, lambda_v = 0 kJ/mol" if no_mode else
              f"lambda_s = {split.lambda_s:.1f} kJ/mol, 95 % {iv(split.lambda_s_95)}; lambda_v = "
              f"{split.lambda_v:.1f} kJ/mol, 95 % {iv(split.lambda_v_95)}")
    if split.determined:
        return (f"lambda_s and lambda_v are separately determined (each to within {SPLIT_TOLERANCE * 100:.0f} %): "
                f"{values}")
    if not favoured:
        why = "the semiclassical model is not the one the data favour"
    elif no_mode:
        why = "the fit puts no reorganization in the quantized mode"
    else:
        why = (f"their 95 % intervals are wider than +-{SPLIT_TOLERANCE * 100:.0f} %; the series fixes their sum "
               "better than the split (more points far past the maximum, or less scatter, would separate them)")
    return f"lambda_s and lambda_v are not separately determined: {why}; {values}"
