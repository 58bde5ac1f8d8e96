"""Marcus parabolic free-energy surfaces: reactant and product free energy along the reaction coordinate.

With the reaction coordinate x running from 0 (reactant, i.e. precursor complex, minimum) to 1 (product, i.e.
successor complex, minimum), the two surfaces of the same curvature are (Marcus, harmonic approximation)

    G_R(x) = lambda x^2
    G_P(x) = lambda (x - 1)^2 + Delta G deg'

They cross at x* = (lambda + Delta G deg') / (2 lambda), at the height
G_R(x*) = (lambda + Delta G deg')^2 / (4 lambda), the intrinsic Marcus barrier (Delta G double-dagger minus w12).
x* < 0 means the crossing lies behind the reactant minimum: the inverted region.
"""

import numpy as np


def free_energy_surfaces(x, lambda_, dG0_prime):
    """Reactant and product surfaces G_R(x), G_P(x) (Marcus parabolic free-energy surfaces).

    Args:
        x: reaction coordinate, dimensionless (0 at the reactant minimum, 1 at the product minimum), array.
        lambda_: reorganization energy, any energy unit (J/mol in the core), > 0.
        dG0_prime: work-corrected driving force Delta G deg', same unit as lambda_.

    Returns:
        (G_R, G_P) arrays in the unit of lambda_, relative to the reactant minimum.
    """
    xa = np.asarray(x, dtype=float)
    lam = float(lambda_)
    return lam * xa**2, lam * (xa - 1.0) ** 2 + float(dG0_prime)


def surface_crossing(lambda_, dG0_prime):
    """Crossing point (x*, G*) of the two Marcus parabolas.

    Args:
        lambda_: reorganization energy (> 0); dG0_prime: Delta G deg', same unit.

    Returns:
        (x* dimensionless, G* in the unit of lambda_): G* = (lambda + Delta G deg')^2 / (4 lambda).
    """
    lam = float(lambda_)
    if not lam > 0.0:
        raise ValueError(f"reorganization energy must be positive, got {lambda_!r}")
    x_star = (lam + float(dG0_prime)) / (2.0 * lam)
    return x_star, lam * x_star**2
