"""The analytic Jacobian of the series fit's residuals against scipy's finite differences, and the grid of
starting points against a spread of starts (the fit must not settle in a worse basin)."""

import numpy as np
import pytest
from scipy.optimize import least_squares
from scipy.optimize._numdiff import approx_derivative

from crossrate.services.series_intervals import best_fit
from crossrate.services.series_models import Problem, SeriesModel

T = 298.15
HW = 1500.0 * 11.962656  # J/mol: 1500 cm^-1 times h c N_A (100 cm/m)


@pytest.mark.parametrize("key", ["classical", "no_inverted", "semiclassical"])
@pytest.mark.parametrize("diffusion", ["fitted", "fixed", "off"])
def test_jacobian_matches_finite_differences(key, diffusion):
    x = -np.linspace(-20e3, 220e3, 14)
    y = 9.0 + np.random.default_rng(0).standard_normal(14)
    prob = Problem(SeriesModel(key, T, HW), x, y, np.full(14, 0.1), diffusion, 9.7 if diffusion == "fixed" else None)
    for lam in (20.0, 77.0, 300.0):
        theta = np.array([lam] + ([0.4] if key == "semiclassical" else []) + [11.0]
                         + ([9.5] if diffusion == "fitted" else []))
        ref = approx_derivative(prob.residuals, theta, method="3-point")
        # central differences are good to ~1e-8 of the largest entry (common practice)
        np.testing.assert_allclose(prob.jacobian(theta), ref, rtol=0, atol=1e-7 * np.max(np.abs(ref)))


def test_grid_starts_reach_the_best_basin():
    # Six points, k_D fitted, four semiclassical parameters: several local minima in phi. The fit from the
    # grid's starts (plus the classical solution) must be at least as good as the best of a spread of 20
    # starts (lambda 10-200 kJ/mol, phi 0.1-0.8).
    rng = np.random.default_rng(1003)
    dG = -np.array([-0.2, 0.2, 0.5, 0.8, 1.1, 1.4]) * 96485.33212
    lam = 77.2e3
    y = -np.log10(10.0 ** -(11.0 - (lam + dG) ** 2 / (4 * lam * 8.314462618 * T) / np.log(10)) + 10.0 ** -9.7)
    y = y + 0.15 * rng.standard_normal(6)
    prob = Problem(SeriesModel("semiclassical", T, HW), dG, y, np.full(6, 0.15), "fitted", None)
    ours = best_fit(prob, prob.grid_starts(3), tol=1e-8, max_nfev=150)
    lo, hi = prob.bounds()
    spread = min(least_squares(prob.residuals, [lv, ph, 11.0, 10.0], bounds=(lo, hi)).cost
                 for lv in (10.0, 30.0, 77.0, 120.0, 200.0) for ph in (0.1, 0.3, 0.6, 0.8))
    assert ours.cost <= spread * (1 + 1e-6) + 1e-9
