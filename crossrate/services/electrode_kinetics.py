"""Electrode rate constants against overpotential, k_red(eta) and k_ox(eta), under Butler-Volmer and
Marcus-Hush-Chidsey kinetics, for a given k0 or for a library couple's predicted k0.

Butler-Volmer: k_red = k0 exp(-alpha f eta), k_ox = k0 exp((1-alpha) f eta) (crossrate.core.butler_volmer).
Marcus-Hush-Chidsey: the Marcus rate integrated over the metal's Fermi distribution with the electrode's
reorganization energy lambda_el (half the self-exchange one for a library couple;
crossrate.core.marcus_hush_chidsey), normalized to k0 at eta = 0.
"""

from dataclasses import dataclass

import numpy as np

from ..core.butler_volmer import butler_volmer_ln_rates
from ..core.constants import KJ
from ..core.marcus_hush_chidsey import mhc_ln_rates, mhc_plateau_ln_ratio
from ..errors import ConditionsError

_LN10 = float(np.log(10.0))
#: Largest overpotential a curve may span, V, and the largest number of points.
ETA_MAX_LIMIT_V = 3.0
POINTS_LIMIT = 2001

INVERTED_REGION_TEXT = (
    "Marcus-Hush-Chidsey rates level off at large overpotential instead of falling again: the metal offers a "
    "continuum of occupied and empty levels, and some of them always make the transfer activationless, so "
    "the electrode hides the inverted region a reaction in solution shows; Butler-Volmer rates keep rising "
    "exponentially"
)


def check_kinetics(alpha: float, lambda_el_kJ_per_mol: float | None) -> None:
    """ConditionsError unless 0 < alpha < 1 and lambda_el (kJ/mol) is None or positive and finite."""
    if not (np.isfinite(alpha) and 0.0 < alpha < 1.0):
        raise ConditionsError(f"transfer coefficient alpha {alpha!r}: expected a number between 0 and 1")
    if lambda_el_kJ_per_mol is not None and not (
        np.isfinite(lambda_el_kJ_per_mol) and 0.0 < lambda_el_kJ_per_mol <= 1000.0
    ):
        raise ConditionsError(
            f"electrode reorganization energy {lambda_el_kJ_per_mol!r} kJ/mol: expected a number above 0, at most 1000"
        )


@dataclass(frozen=True)
class RateCurves:
    """k_red and k_ox against overpotential. eta_V: E - E0' in V; log10_* in log10(cm/s) (or the unit of k0);
    mhc arrays are None when no lambda_el was available; log10_plateau_mhc: log10 of the MHC limit."""

    eta_V: np.ndarray
    log10_k_red_bv: np.ndarray
    log10_k_ox_bv: np.ndarray
    log10_k_red_mhc: np.ndarray | None
    log10_k_ox_mhc: np.ndarray | None
    log10_k0: float
    alpha: float
    lambda_el_kJ_per_mol: float | None
    temperature_K: float
    log10_plateau_mhc: float | None

    def records(self) -> list[dict]:
        """One dict per overpotential (for pandas.DataFrame.from_records)."""
        out = []
        for k, eta in enumerate(self.eta_V.tolist()):
            row = {"eta_V": eta, "log10_k_red_bv": float(self.log10_k_red_bv[k]),
                   "log10_k_ox_bv": float(self.log10_k_ox_bv[k])}
            if self.log10_k_red_mhc is not None:
                row["log10_k_red_mhc"] = float(self.log10_k_red_mhc[k])
                row["log10_k_ox_mhc"] = float(self.log10_k_ox_mhc[k])
            out.append(row)
        return out

    def to_dict(self) -> dict:
        """JSON-ready dict."""
        return {
            "log10_k0": self.log10_k0,
            "alpha": self.alpha,
            "lambda_el_kJ_per_mol": self.lambda_el_kJ_per_mol,
            "temperature_K": self.temperature_K,
            "log10_plateau_mhc": self.log10_plateau_mhc,
            "note": INVERTED_REGION_TEXT if self.log10_k_red_mhc is not None else None,
            "points": self.records(),
        }


def rate_curves(
    log10_k0: float,
    lambda_el_kJ_per_mol: float | None,
    alpha: float = 0.5,
    T_K: float = 298.15,
    eta_max_V: float = 0.5,
    points: int = 41,
) -> RateCurves:
    """k_red(eta) and k_ox(eta) from -eta_max to +eta_max (V), Butler-Volmer and, when lambda_el is given,
    Marcus-Hush-Chidsey.

    Args:
        log10_k0: log10 of the standard rate constant (cm/s by convention; the curves share its unit).
        lambda_el_kJ_per_mol: electrode reorganization energy, kJ/mol (None: Butler-Volmer only).
        alpha: transfer coefficient of Butler-Volmer (0 < alpha < 1).
        T_K: temperature, K. eta_max_V: half-width of the overpotential range, V. points: number of points.
    """
    check_kinetics(alpha, lambda_el_kJ_per_mol)
    if not (np.isfinite(eta_max_V) and 0.0 < eta_max_V <= ETA_MAX_LIMIT_V):
        raise ConditionsError(f"overpotential range {eta_max_V!r} V: expected above 0, at most {ETA_MAX_LIMIT_V:g} V")
    if not (3 <= int(points) <= POINTS_LIMIT):
        raise ConditionsError(f"points {points!r}: expected a whole number from 3 to {POINTS_LIMIT}")
    eta = np.linspace(-eta_max_V, eta_max_V, int(points))
    ln_k0 = log10_k0 * _LN10
    r_bv, o_bv = butler_volmer_ln_rates(eta, ln_k0, alpha, T_K)
    r_m = o_m = plateau = None
    if lambda_el_kJ_per_mol is not None:
        lam = lambda_el_kJ_per_mol * KJ
        r_m, o_m = (x / _LN10 for x in mhc_ln_rates(eta, ln_k0, lam, T_K))
        plateau = log10_k0 + mhc_plateau_ln_ratio(lam, T_K) / _LN10
    return RateCurves(
        eta_V=eta,
        log10_k_red_bv=r_bv / _LN10,
        log10_k_ox_bv=o_bv / _LN10,
        log10_k_red_mhc=r_m,
        log10_k_ox_mhc=o_m,
        log10_k0=float(log10_k0),
        alpha=float(alpha),
        lambda_el_kJ_per_mol=None if lambda_el_kJ_per_mol is None else float(lambda_el_kJ_per_mol),
        temperature_K=float(T_K),
        log10_plateau_mhc=plateau,
    )
