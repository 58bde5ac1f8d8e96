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

from ..core.constants import GAS_CONSTANT, KJ
from ..core.driving_force_series import marcus_ln_k_act, plateau_ln_k_act, series_ln_k_obs

LN10 = math.log(10.0)
LAMBDA_BOUNDS_KJ = (1.0, 2000.0)
PHI_BOUNDS = (0.0, 0.95)
LOG10_A_BOUNDS = (-10.0, 20.0)
LOG10_KD_BOUNDS = (-5.0, 14.0)
#: phi = lambda_v / lambda values of the starting grid of the semiclassical fit.
GRID_PHI = (0.0, 0.25, 0.5, 0.75)
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
        from ..core.semiclassical_gradient import mlj_ln_k_curve

        phi = theta[1]
        x = np.asarray(x, dtype=float)
        return lnA + mlj_ln_k_curve(x, lam * (1.0 - phi), lam * phi, self.hw, self.T).reshape(x.shape)

    def ln_k_act_jac(self, theta, x):
        """(ln k_act, d ln k_act / d theta (len(x), len(theta))) at Delta G deg x (J/mol): the analytic
        derivatives (crossrate.core.semiclassical_gradient for the semiclassical sum)."""
        lam = theta[0] * KJ
        lnA = theta[-1] * LN10
        x = np.asarray(x, dtype=float)
        jac = np.empty((x.size, len(theta)))
        jac[:, -1] = LN10
        if self.key == "semiclassical":
            from ..core.semiclassical_gradient import mlj_ln_k_gradient

            phi = theta[1]
            ln_k, d_ls, d_lv = mlj_ln_k_gradient(x, lam * (1.0 - phi), lam * phi, self.hw, self.T)
            jac[:, 0] = KJ * ((1.0 - phi) * d_ls + phi * d_lv)
            jac[:, 1] = lam * (d_lv - d_ls)
            return lnA + ln_k, jac
        RT = GAS_CONSTANT * self.T
        ln_k = marcus_ln_k_act(x, lam, lnA, self.T)
        # d/d lambda of -(lambda + x)^2 / (4 lambda RT) = (x^2 - lambda^2) / (4 lambda^2 RT)
        d_lam = KJ * (x * x - lam * lam) / (4.0 * lam * lam * RT)
        if self.key == "no_inverted":
            top = -x >= lam
            ln_k, d_lam = np.where(top, lnA, ln_k), np.where(top, 0.0, d_lam)
        jac[:, 0] = d_lam
        return ln_k, jac

    def minus_dG0_at_maximum_J(self, theta):
        """-Delta G deg (J/mol) of the fastest activation-controlled rate."""
        if self.key != "semiclassical" or theta[1] == 0.0:
            return theta[0] * KJ
        from ..core.semiclassical import mlj_minus_dG0_at_maximum

        lam = theta[0] * KJ
        return mlj_minus_dG0_at_maximum(lam * (1.0 - theta[1]), lam * theta[1], self.hw, self.T)


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

    def grid_starts(self, count=2):
        """Starting points for the least-squares fit from a coarse grid: lambda 3-1500 kJ/mol (36 steps of
        19 %; semiclassical 24 of 30 % with phi in GRID_PHI), log10 A in steps of 1 and log10 k_D of 0.5
        (from 0.5 below the fastest point to 2.5 above it); chi2 minimized over A and k_D at each
        (lambda, phi), and its `count` lowest local minima returned (a start in every basin the data allow)."""
        semi = self.model.key == "semiclassical"
        lams = np.geomspace(3.0, 1500.0, 24 if semi else 36)
        phis = GRID_PHI if semi else (0.0,)
        shape = np.array([self.model.ln_k_act([lam, phi, 0.0] if semi else [lam, 0.0], self.x)
                          for phi in phis for lam in lams]) / LN10  # log10 k_act at A = 1, (phi, lambda) rows
        w = 1.0 / self.sigma**2
        if self.diffusion == "off":
            a = np.clip((w * (self.y - shape)).sum(axis=1) / w.sum(), *LOG10_A_BOUNDS)
            chi2 = (w * (self.y - shape - a[:, None]) ** 2).sum(axis=1)
            rest = [[v] for v in a]
        else:
            a_grid = np.arange(LOG10_A_BOUNDS[0], LOG10_A_BOUNDS[1] + 1e-9, 1.0)
            top = float(np.max(self.y))
            d_grid = (np.clip(np.arange(top - 0.5, top + 2.51, 0.5), *LOG10_KD_BOUNDS)
                      if self.diffusion == "fitted" else np.array([self.kd_fixed]))
            fitted = self.diffusion == "fitted"
            d = np.broadcast_to(d_grid, (len(shape), d_grid.size)).copy()

            def chi2_of(a, d):  # a, d: (shapes, k_D starts); also the residuals and k_obs / k_act
                act, d_ln = (shape[:, None, :] + a[..., None]) * LN10, d[..., None] * LN10
                r = self.y - (-np.logaddexp(-act, -d_ln) / LN10)
                return (w * r * r).sum(axis=-1), r, 1.0 / (1.0 + np.exp(np.clip(act - d_ln, -700.0, 700.0)))

            coarse = [chi2_of(np.full(d.shape, v), d)[0] for v in a_grid]
            a = a_grid[np.argmin(np.array(coarse), axis=0)]
            for _ in range(6):  # damped Gauss-Newton in log10 A (and log10 k_D) at each shape: the grid is coarse
                _, r, sa = chi2_of(a, d)
                sd = 1.0 - sa
                gaa, ga = (w * sa * sa).sum(axis=-1) + 1e-9, (w * sa * r).sum(axis=-1)
                if fitted:
                    gdd, gad, gd = (w * sd * sd).sum(axis=-1) + 1e-9, (w * sa * sd).sum(axis=-1), (w * sd * r).sum(axis=-1)
                    det = gaa * gdd - gad * gad
                    da, dd = (gdd * ga - gad * gd) / det, (gaa * gd - gad * ga) / det
                else:
                    da, dd = ga / gaa, 0.0
                a = np.clip(a + np.clip(da, -2.0, 2.0), *LOG10_A_BOUNDS)
                d = np.clip(d + np.clip(dd, -2.0, 2.0), *LOG10_KD_BOUNDS)
            full = chi2_of(a, d)[0]
            pick = np.argmin(full, axis=1)
            rows = np.arange(len(shape))
            chi2 = full[rows, pick]
            rest = [[a[g, j]] + ([d[g, j]] if fitted else []) for g, j in zip(rows, pick, strict=True)]
        grid = np.pad(chi2.reshape(len(phis), lams.size), 1, constant_values=np.inf)
        inner = grid[1:-1, 1:-1]
        lowest = ((inner <= grid[:-2, 1:-1]) & (inner <= grid[2:, 1:-1]) & (inner <= grid[1:-1, :-2])
                  & (inner <= grid[1:-1, 2:]))
        minima = sorted(np.flatnonzero(lowest.ravel()), key=lambda row: chi2[row])
        out = []
        for row in minima[:count]:
            j, i = divmod(int(row), lams.size)
            out.append([float(lams[i])] + ([float(phis[j])] if semi else []) + [float(v) for v in rest[row]])
        return out

    def jacobian(self, theta):
        """d residuals / d theta, analytic: d ln k_obs / d ln k_act = k_obs / k_act and d ln k_obs / d ln k_D
        = k_obs / k_D for 1/k_obs = 1/k_act + 1/k_D."""
        core, lkd = self.split(theta)
        ln_act, d_act = self.model.ln_k_act_jac(core, self.x)
        jac = np.empty((self.x.size, len(theta)))
        if lkd is None:
            jac[:, :len(core)] = d_act / LN10
        else:
            share = 1.0 / (1.0 + np.exp(np.clip(ln_act - lkd * LN10, -700.0, 700.0)))  # k_obs / k_act
            jac[:, :len(core)] = share[:, None] * d_act / LN10
            if self.diffusion == "fitted":
                jac[:, -1] = 1.0 - share
        return -jac / self.sigma[:, None]

    def bounds(self):
        lo, hi = self.model.bounds()
        if self.diffusion == "fitted":
            lo, hi = lo + [LOG10_KD_BOUNDS[0]], hi + [LOG10_KD_BOUNDS[1]]
        return np.array(lo), np.array(hi)
