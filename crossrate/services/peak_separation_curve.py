"""The working curve Delta Ep against Nicholson's psi, computed with crossrate's own CV simulation, and its
inversion: the psi (and so the k0) a measured peak separation implies.

The curve is simulated (Butler-Volmer, the given alpha, D_R/D_O and temperature, no resistance) at
PSI_GRID and interpolated linearly in log psi; Delta Ep falls monotonically as psi grows, towards the
reversible value (about 58-59 mV with the +-0.2 V window). Reading it is the common way to get k0 from
peak separations (Nicholson, Anal. Chem. 1965), here with the curve matched to the user's conditions.
"""

import math
from dataclasses import dataclass
from functools import lru_cache

import numpy as np

from ..core.butler_volmer import butler_volmer_ln_rates
from ..core.constants import FARADAY, GAS_CONSTANT
from ..core.voltammetry import find_peaks, simulate_cv

#: psi values of the curve (log-spaced, 5e-3 .. 30; Delta Ep about 500 mV down to 59 mV).
PSI_GRID = np.logspace(math.log10(5e-3), math.log10(30.0), 18)
#: Above this psi the separation is within about 2 mV of the reversible value: a measured Delta Ep there
#: gives only a lower bound of k0.
PSI_REVERSIBLE = 20.0


@dataclass(frozen=True)
class WorkingCurve:
    """Delta Ep (mV) at PSI_GRID for one alpha, D_R/D_O and temperature (K)."""

    psi: np.ndarray
    dEp_mV: np.ndarray
    alpha: float
    d_ratio: float
    temperature_K: float

    @property
    def reversible_mV(self) -> float:
        """Delta Ep at PSI_REVERSIBLE, mV (below it, a separation implies only a lower bound of k0)."""
        return float(np.interp(math.log(PSI_REVERSIBLE), np.log(self.psi), self.dEp_mV))

    def psi_of(self, dEp_mV):
        """psi implied by Delta Ep (mV, array); NaN outside the curve (at or below the reversible value, or
        beyond the slowest psi)."""
        x = np.asarray(dEp_mV, dtype=float)
        # dEp falls with psi: interpolate log psi against dEp on the reversed (increasing) arrays.
        lp = np.interp(x, self.dEp_mV[::-1], np.log(self.psi)[::-1], left=np.nan, right=np.nan)
        lp = np.where(x <= self.reversible_mV, np.nan, lp)
        return np.exp(lp)


def _separation_mV(psi: float, alpha: float, d_ratio: float, T_K: float) -> float:
    f = FARADAY / (GAS_CONSTANT * T_K)
    # Dimensionless k0 / (D_O f v)^1/2 from psi = k0 (D_O/D_R)^(alpha/2) / (pi D_O f v)^1/2.
    ln_lam = math.log(psi * math.sqrt(math.pi)) + 0.5 * alpha * math.log(d_ratio)
    window = 0.2
    while True:
        sim = simulate_cv(window * f, -window * f,
                          lambda th: butler_volmer_ln_rates(np.asarray(th) / f, ln_lam, alpha, T_K), d_ratio)
        pk = find_peaks(sim)
        if pk.theta_cathodic / f > -window + 0.1 or window >= 1.5:
            return pk.separation / f * 1e3
        window = min(1.5, window + 0.15)


@lru_cache(maxsize=16)
def working_curve(alpha: float = 0.5, d_ratio: float = 1.0, T_K: float = 298.15) -> WorkingCurve:
    """The simulated working curve for these conditions (cached: about a second to compute)."""
    dEp = np.array([_separation_mV(float(p), alpha, d_ratio, T_K) for p in PSI_GRID])
    # Guard the inversion: the simulated curve must fall monotonically with psi.
    dEp = np.minimum.accumulate(dEp)
    return WorkingCurve(PSI_GRID.copy(), dEp, alpha, d_ratio, T_K)
