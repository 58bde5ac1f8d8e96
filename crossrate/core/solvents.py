"""Solvent table: permittivity, refractive index and viscosity, each row with its source.

The numbers live in ``data/solvents.csv``; this module reads them once, on first use.
Water's permittivity and viscosity follow published temperature correlations; the other solvents
are held at their 25 degC values (callers warn when the temperature is far from 298.15 K).
"""

import csv
import io
from functools import lru_cache
from pathlib import Path
from typing import NamedTuple

import numpy as np

# Malmberg & Maryott, J. Res. Natl. Bur. Stand. 56, 1 (1956): eps(t) = 87.740 - 0.40008 t + 9.398e-4 t^2
# - 1.410e-6 t^3, t in degC, 0-100 degC (coefficients from memory; checked against IAPWS in the tests).
_WATER_EPS = (87.740, -0.40008, 9.398e-4, -1.410e-6)
# Vogel equation for water, eta = A exp(B / (T - C)), A in mPa s, B and C in K (fit as tabulated by
# Viswanath & Natarajan, Data Book on the Viscosity of Liquids, 1989; from memory; checked against IAPWS 2008).
_WATER_VOGEL = (0.02939, 507.88, 149.3)
#: Temperatures (K) outside which the water correlations are not trusted.
WATER_CORRELATION_RANGE_K = (273.15, 373.15)


# A NamedTuple, not a frozen dataclass: a table row on the path of every prediction, and Python 3.11 compiles
# a dataclass's six methods at import (about 1 ms a class of a cold command; see DEVELOPERS.md).
class Solvent(NamedTuple):
    """One solvent row. eps_s and n_D dimensionless, viscosity in mPa s, all at 25 degC."""

    key: str
    name: str
    eps_s: float
    n_D: float
    viscosity_mPa_s: float
    source: str

    @property
    def temperature_dependent(self) -> bool:
        """True when permittivity and viscosity follow a temperature correlation (water only)."""
        return self.key == "water"

    def permittivity(self, T_K):
        """Static relative permittivity at T (K); water by Malmberg-Maryott, others the 25 degC value."""
        if not self.temperature_dependent:
            return np.broadcast_to(self.eps_s, np.shape(T_K)).astype(float) if np.ndim(T_K) else self.eps_s
        t = np.asarray(T_K, dtype=float) - 273.15
        a0, a1, a2, a3 = _WATER_EPS
        return a0 + t * (a1 + t * (a2 + t * a3))

    def viscosity_Pa_s(self, T_K):
        """Shear viscosity at T (K) in Pa s; water by the Vogel equation, others the 25 degC value."""
        if not self.temperature_dependent:
            v = self.viscosity_mPa_s * 1e-3
            return np.broadcast_to(v, np.shape(T_K)).astype(float) if np.ndim(T_K) else v
        A, B, C = _WATER_VOGEL
        return A * np.exp(B / (np.asarray(T_K, dtype=float) - C)) * 1e-3

    def pekar_factor(self, T_K=298.15):
        """Pekar factor 1/n^2 - 1/eps_s (dimensionless), refractive index held at its 25 degC value."""
        return 1.0 / self.n_D**2 - 1.0 / self.permittivity(T_K)


def _read_rows(text: str):
    lines = [ln for ln in text.splitlines() if ln.strip() and not ln.startswith("#")]
    return list(csv.DictReader(io.StringIO("\n".join(lines))))


@lru_cache(maxsize=1)
def solvent_table() -> dict[str, Solvent]:
    """All solvents keyed by their key (e.g. 'water', 'acetonitrile')."""
    text = (Path(__file__).parent / "data" / "solvents.csv").read_text(encoding="utf-8")
    table = {}
    for row in _read_rows(text):
        table[row["key"]] = Solvent(
            key=row["key"],
            name=row["name"],
            eps_s=float(row["eps_s"]),
            n_D=float(row["n_D"]),
            viscosity_mPa_s=float(row["viscosity_mPa_s"]),
            source=row["source"],
        )
    return table


def get_solvent(key: str) -> Solvent:
    """The solvent with this key; KeyError naming the known keys otherwise."""
    table = solvent_table()
    try:
        return table[key]
    except KeyError:
        raise KeyError(f"unknown medium {key!r}; known media: {', '.join(sorted(table))}") from None


def per_medium(media, T_K, quantity: str) -> np.ndarray:
    """One solvent quantity for each entry of `media` (solvent keys) at T_K (K, broadcast), as an array.

    quantity: a Solvent method taking T_K, 'permittivity' (dimensionless), 'viscosity_Pa_s' (Pa s) or
    'pekar_factor' (dimensionless). One table look-up per distinct medium, so long arrays stay cheap.
    """
    media = np.asarray(media, dtype=object)
    T = np.broadcast_to(np.asarray(T_K, dtype=float), media.shape)
    out = np.empty(media.shape, dtype=float)
    for m in set(media.tolist()):
        sel = media == m
        out[sel] = getattr(get_solvent(m), quantity)(T[sel])
    return out
