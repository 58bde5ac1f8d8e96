"""The rate models a driving-force series is fitted with, and the weighted least-squares problem.

Models of the activation-controlled rate k_act (crossrate.core.driving_force_series, crossrate.core.semiclassical):
* classical: Marcus quadratic free-energy relationship; parameters lambda (kJ/mol), log10 A;
* semiclassical: Marcus–Levich–Jortner, one quantized mode of energy hbar omega (given, not fitted);
  parameters lambda = lambda_s + lambda_v (kJ/mol), phi = lambda_v / lambda, log10 A;
* no_inverted: the classical curve held at its top past -Delta G deg = lambda (the comparison model of the
  inverted-region test); parameters lambda, log10 A.
Each may carry the diffusion limit k_D (a fitted log10 k_D, a fixed one, or none), 1/k_obs = 1/k_act + 1/k_D.
"""

import math

import numpy as np

from ..core.constants import KJ
from ..core.driving_force_series import marcus_ln_k_act, plateau_ln_k_act, series_ln_k_obs

LN10 = math.log(10.0)
LAMBDA_BOUNDS_KJ = (1.0, 2000.0)
PHI_BOUNDS = (0.0, 0.95)
LOG10_A_BOUNDS = (-10.0, 20.0)
LOG10_KD_BOUNDS = (-5.0, 14.0)
MODEL_KEYS = ("classical", "semiclassical", "no_inverted")
MODEL_TITLES = {"classical": "classical Marcus", "semiclassical": "semiclassical (Marcus–Levich–Jortner)",
                "no_inverted": "no inverted region"}


class SeriesModel:
    """One model of ln k_act(Delta G deg): its parameter names, bounds and the function itself.

    theta (without k_D): classical and no_inverted (lambda kJ/mol, log10 A); semiclassical (lambda kJ/mol,
    phi, log10 A). hbar_omega_J: the quantized mode's energy, J/mol (semiclassical only); T in K.
    """

    def __init__(self, key: str, T: float, hbar_omega_J: float | None = None):
        self.key, self.T, self.hw = key, float(T), hbar_omega_J
        self.names = ("lambda", "phi", "log10 A") if key == "semiclassical" else ("lambda", "log10 A")

    def bounds(self):
        lo = [LAMBDA_BOUNDS_KJ[0]] + ([PHI_BOUNDS[0]] if self.key == "semiclassical" else []) + [LOG10_A_BOUNDS[0]]
        hi = [LAMBDA_BOUNDS_KJ[1]] + ([PHI_BOUNDS[1]] if self.key == "semiclassical" else []) + [LOG10_A_BOUNDS[1]]
        return lo, hi

    def ln_k_act(self, theta, x):
        """ln k_act at Delta G deg x (J/mol) for parameters theta."""
        lam = theta[0] * KJ
        lnA = theta[-1] * LN10
        if self.key == "classical":
            return marcus_ln_k_act(x, lam, lnA, self.T)
        if self.key == "no_inverted":
            return plateau_ln_k_act(x, lam, lnA, self.T)
        from ..core.semiclassical import mlj_ln_k

        phi = theta[1]
        return mlj_ln_k(x, lam * (1.0 - phi), lam * phi, self.hw, self.T, lnA)

    def minus_dG0_at_maximum_J(self, theta):
        """-Delta G deg (J/mol) of the fastest activation-controlled rate."""
        if self.key != "semiclassical" or theta[1] == 0.0:
            return theta[0] * KJ
        from ..core.semiclassical import mlj_minus_dG0_at_maximum

        lam = theta[0] * KJ
        return mlj_minus_dG0_at_maximum(lam * (1.0 - theta[1]), lam * theta[1], self.hw, self.T)

    def starts(self, y, seeds=()):
        """Starting points: a spread of lambda (or the seeds given, e.g. other models' solutions)."""
        top = float(np.max(y)) + 0.5
        lams = list(seeds) if seeds else list(np.geomspace(10.0, 400.0, 7))
        if self.key == "semiclassical":
            return [[lam, phi, top] for lam in lams for phi in (0.25, 0.6)]
        return [[lam, top] for lam in lams]


class Problem:
    """Weighted least squares on log10 k_obs: data x (J/mol), y (log10), sigma (log10), a model, and the
    diffusion treatment ('fitted': log10 k_D is the last parameter; 'fixed' at log10_kd_fixed; 'off')."""

    def __init__(self, model: SeriesModel, x, y, sigma, diffusion, log10_kd_fixed):
        self.model, self.x, self.y, self.sigma = model, x, y, sigma
        self.diffusion, self.kd_fixed = diffusion, log10_kd_fixed

    @property
    def n_params(self):
        return len(self.model.names) + (1 if self.diffusion == "fitted" else 0)

    def split(self, theta):
        """(model parameters, log10 k_D or None)."""
        if self.diffusion == "fitted":
            return theta[:-1], theta[-1]
        return theta, self.kd_fixed

    def predict(self, theta, x=None):
        core, lkd = self.split(theta)
        ln_act = self.model.ln_k_act(core, self.x if x is None else x)
        return series_ln_k_obs(ln_act, None if lkd is None else lkd * LN10) / LN10

    def residuals(self, theta):
        return (self.y - self.predict(theta)) / self.sigma

    def bounds(self):
        lo, hi = self.model.bounds()
        if self.diffusion == "fitted":
            lo, hi = lo + [LOG10_KD_BOUNDS[0]], hi + [LOG10_KD_BOUNDS[1]]
        return np.array(lo), np.array(hi)

    def starts(self, seeds=()):
        out = self.model.starts(self.y, seeds)
        if self.diffusion == "fitted":
            out = [th + [float(np.max(self.y)) + 0.3] for th in out]
        return out
