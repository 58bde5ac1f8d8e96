"""Warnings where a prediction uses a part of the model outside the range it was made for.

- water's permittivity (Malmberg-Maryott) and viscosity (Vogel) correlations outside the temperatures they
  were fitted on (crossrate.core.solvents.WATER_CORRELATION_RANGE_K);
- Debye-Hueckel screening of the work terms far past dilute solution: above DH_FAR_PAST_I_M, or above
  DH_RANGE_I_M with a charge product of DH_LARGE_CHARGE_PRODUCT or more (the screened-Coulomb form
  1/(1 + kappa r) is made for dilute solutions, I up to about 0.1 M, common practice; the error grows with
  the charges);
- a large work-term factor W12 (|ln W12| above LARGE_LN_W12): the answer then rests mostly on the work terms.
"""

import math

import numpy as np

from ..core.solvents import WATER_CORRELATION_RANGE_K

#: Ionic strength (mol/L) up to which Debye-Hueckel screening is trusted (common practice).
DH_RANGE_I_M = 0.1
#: Ionic strength (mol/L) far past that range, warned for any charges (the project's choice).
DH_FAR_PAST_I_M = 0.5
#: |z1 z2| from which screening past DH_RANGE_I_M is warned (the project's choice: 3+ with 2-, 3+ with 3-...).
DH_LARGE_CHARGE_PRODUCT = 6
#: |ln W12| above which the work terms change k12 by more than a factor of 10.
LARGE_LN_W12 = math.log(10.0)


def validity_warnings(ox, red, rc, ln_W12: float) -> tuple[str, ...]:
    """Warnings for couples ox, red (library records) under resolved conditions rc (temperature_K in K,
    ionic_strength_M in mol/L, medium) with the pair's ln W12 (dimensionless)."""
    out = []
    T = rc.temperature_K
    lo, hi = WATER_CORRELATION_RANGE_K
    if rc.medium == "water" and not lo <= T <= hi:
        out.append(
            f"water: the permittivity (Malmberg-Maryott) and viscosity (Vogel) correlations were fitted on "
            f"{lo:g}-{hi:g} K; at T = {T:g} K they are extrapolated"
        )
    I = rc.ionic_strength_M
    products = (
        abs(ox.charge_ox * red.charge_red),
        abs(ox.charge_red * red.charge_ox),
        abs(ox.charge_ox * ox.charge_red),
        abs(red.charge_ox * red.charge_red),
    )
    zz = max(products)
    if I > DH_FAR_PAST_I_M or (I > DH_RANGE_I_M and zz >= DH_LARGE_CHARGE_PRODUCT):
        why = f"I = {I:g} M" + (f" with charge products up to |z1 z2| = {zz}" if zz >= DH_LARGE_CHARGE_PRODUCT else "")
        out.append(
            f"Debye-Hueckel screening of the work terms used far past its range ({why}; it is made for dilute "
            f"solutions, I up to about {DH_RANGE_I_M:g} M): the work terms, W12 and k_D are rough"
        )
    if np.isfinite(ln_W12) and abs(ln_W12) > LARGE_LN_W12:
        out.append(
            f"ln W12 = {ln_W12:.2f}: the work terms change k12 by a factor of {math.exp(abs(ln_W12)):.3g}, so the "
            "answer rests mostly on them (charges, radii, screening)"
        )
    return tuple(out)
