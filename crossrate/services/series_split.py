"""The split of a semiclassical fit's lambda into its solvent (lambda_s) and quantized-mode (lambda_v) parts,
with 95 % intervals, and whether the series determines them separately.

The fit's parameters are lambda = lambda_s + lambda_v and phi = lambda_v / lambda; the split's standard errors
come from their Jacobian covariance by the delta method. The 95 % intervals are profile-likelihood intervals
(the fit redone with lambda_s, or lambda_v, held at each trial value) when the semiclassical model is the one
the data favour and the fit's intervals are profile ones; otherwise they are taken from the SEs on a log scale
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


def lambda_split(lam: float, phi: float, cov2, favoured: bool, intervals=None) -> LambdaSplit:
    """The split of a semiclassical fit: lam (kJ/mol) and phi (lambda_v / lambda) with their 2 x 2 covariance
    cov2; favoured: whether the semiclassical model is the one the data favour (the split counts only then);
    intervals: (lambda_s 95 %, lambda_v 95 %) to use instead of the log-scale ones from the SEs.

    Determined: the model is favoured, phi lies inside its range (not pinned at 0, no quantized part, or at
    its upper bound) and both intervals lie within SPLIT_TOLERANCE of their values.
    """
    ls, lv = lam * (1.0 - phi), lam * phi
    # Delta method: d(lambda_s) = (1 - phi) d lambda - lambda d phi; d(lambda_v) = phi d lambda + lambda d phi.
    g_s, g_v = np.array([1.0 - phi, -lam]), np.array([phi, lam])
    ls_se = float(np.sqrt(max(g_s @ cov2 @ g_s, 0.0)))
    lv_se = float(np.sqrt(max(g_v @ cov2 @ g_v, 0.0)))
    s95, v95 = intervals if intervals is not None else (_log_interval(ls, ls_se), _log_interval(lv, lv_se))
    inside = PHI_BOUNDS[0] + 1e-3 < phi < PHI_BOUNDS[1] - 1e-6

    def tight(v, iv):
        return iv[0] is not None and iv[1] is not None and iv[1] <= v * (1.0 + SPLIT_TOLERANCE) \
            and iv[0] >= v * (1.0 - SPLIT_TOLERANCE)

    determined = bool(favoured and inside and tight(ls, s95) and tight(lv, v95))
    return LambdaSplit(ls, ls_se, s95, lv, lv_se, v95, determined)


class _SplitProblem:
    """A semiclassical Problem seen with lambda_s and lambda_v as its first two parameters (kJ/mol; the one
    to profile first: lambda_s when first == 0, lambda_v when first == 1), so that the profile likelihood of
    crossrate.services.series_intervals applies to either part."""

    def __init__(self, prob, first):
        self.prob, self.first = prob, first
        lo, hi = prob.bounds()
        self._lo, self._hi = np.concatenate(([1.0, 0.0], lo[2:])), np.concatenate(([2000.0, 2000.0], hi[2:]))
        if first == 1:
            self._lo[:2], self._hi[:2] = [0.0, 1.0], [2000.0, 2000.0]

    def _parts(self, q):
        return (q[0], q[1]) if self.first == 0 else (q[1], q[0])

    def theta(self, q):
        ls, lv = self._parts(q)
        return np.concatenate(([ls + lv, lv / (ls + lv)], q[2:]))

    def from_theta(self, theta):
        ls, lv = theta[0] * (1.0 - theta[1]), theta[0] * theta[1]
        return np.concatenate(([ls, lv] if self.first == 0 else [lv, ls], theta[2:]))

    def bounds(self):
        return self._lo, self._hi

    def residuals(self, q):
        return self.prob.residuals(self.theta(q))

    def jacobian(self, q):
        ls, lv = self._parts(q)
        lam = ls + lv
        j = self.prob.jacobian(self.theta(q))
        # lambda = ls + lv, phi = lv / lambda: d phi / d ls = -lv / lambda^2, d phi / d lv = ls / lambda^2
        d_ls, d_lv = j[:, 0] - j[:, 1] * lv / lam**2, j[:, 0] + j[:, 1] * ls / lam**2
        j[:, 0], j[:, 1] = (d_ls, d_lv) if self.first == 0 else (d_lv, d_ls)
        return j


def semiclassical_split(prob, result, s2, favoured: bool, profile: bool) -> LambdaSplit:
    """The split of a semiclassical fit (prob: its Problem, result: its least-squares solution, s2: the
    scatter scale), with profile-likelihood intervals when profile and favoured and the fit has a quantized
    part (phi inside its range), log-scale SE intervals otherwise."""
    from .series_intervals import covariance, profile_interval

    lam, phi = float(result.x[0]), float(result.x[1])
    cov2 = covariance(result, s2)[:2, :2]
    split = lambda_split(lam, phi, cov2, favoured)
    if not (profile and favoured and PHI_BOUNDS[0] + 1e-3 < phi < PHI_BOUNDS[1] - 1e-6):
        return split
    chi2_min = 2.0 * result.cost / s2
    ivs = []
    for first, se in ((0, split.lambda_s_se), (1, split.lambda_v_se)):
        sp = _SplitProblem(prob, first)
        ivs.append(profile_interval(sp, sp.from_theta(np.asarray(result.x, dtype=float)), s2, chi2_min, se))
    return lambda_split(lam, phi, cov2, favoured, intervals=tuple(ivs))


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
