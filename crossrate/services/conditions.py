"""Reaction conditions chosen by the user for a prediction."""

from dataclasses import dataclass, replace

import numpy as np

from ..core.constants import DEFAULT_Z, STANDARD_TEMPERATURE
from ..errors import ConditionsError

TEMPERATURE_RANGE_K = (200.0, 400.0)
IONIC_STRENGTH_MAX_M = 5.0
#: Collision factor Z accepted, M^-1 s^-1: about 1e11 for two small ions in solution (common practice); two
#: decades either side cover every choice in use, and beyond them k_self would no longer mean a barrier.
Z_RANGE = (1e9, 1e13)


@dataclass(frozen=True)
class Conditions:
    """Target conditions. temperature_K in K, ionic_strength_M in mol/L (None: the couples' own when they
    agree), medium a solvent key (None: the couples' own), Z in M^-1 s^-1, diffusion: apply the cap.
    allow_mixed_media: couples measured in different media may react (k_self carried to the medium);
    allow_E_other_medium: a potential measured in another medium than the target's is used as given (not
    carried; the outputs say so) instead of refusing the pair.
    rate_model: 'classical' or 'semiclassical' with hbar_omega_cm1 (cm^-1, None = default).
    activity_model: the activity-coefficient equation that carries formal potentials in ionic strength,
    'extended Debye-Hueckel' (the default; I up to about 0.1 M) or 'Davies' (up to about 0.5 M)."""

    temperature_K: float = STANDARD_TEMPERATURE
    ionic_strength_M: float | None = None
    medium: str | None = None
    Z: float = DEFAULT_Z
    diffusion: bool = True
    allow_mixed_media: bool = False
    allow_E_other_medium: bool = False
    #: 'classical' (Marcus cross relation) or 'semiclassical' (with a quantized mode; services.rate_model).
    rate_model: str = "classical"
    #: Energy of the semiclassical model's quantized mode, cm^-1 (None: the default, 1500 cm^-1).
    hbar_omega_cm1: float | None = None
    #: crossrate.core.potential_transfer.EXTENDED_DEBYE_HUCKEL or DAVIES.
    activity_model: str = "extended Debye-Hueckel"

    def __post_init__(self):
        if self.rate_model != "classical" or self.hbar_omega_cm1 is not None:
            from .rate_model import check_rate_model

            check_rate_model(self.rate_model, self.hbar_omega_cm1)
        if self.activity_model != "extended Debye-Hueckel":
            from ..core.potential_transfer import ACTIVITY_MODELS

            if self.activity_model not in ACTIVITY_MODELS:
                raise ConditionsError(f"activity model {self.activity_model!r}: expected one of "
                                      f"{', '.join(repr(m) for m in ACTIVITY_MODELS)}")
        T = self.temperature_K
        if isinstance(T, bool) or not (isinstance(T, int | float) and np.isfinite(T)) or not (
            TEMPERATURE_RANGE_K[0] <= T <= TEMPERATURE_RANGE_K[1]
        ):
            raise ConditionsError(
                f"temperature {T!r} K: expected a finite number from {TEMPERATURE_RANGE_K[0]:g} to {TEMPERATURE_RANGE_K[1]:g} K"
            )
        I = self.ionic_strength_M
        if I is not None and (isinstance(I, bool) or not isinstance(I, int | float) or not np.isfinite(I)
                              or I < 0 or I > IONIC_STRENGTH_MAX_M):
            raise ConditionsError(f"ionic strength {I!r} M: expected a finite number from 0 to {IONIC_STRENGTH_MAX_M:g} M")
        Z = self.Z
        if isinstance(Z, bool) or not isinstance(Z, int | float) or not Z_RANGE[0] <= Z <= Z_RANGE[1]:
            raise ConditionsError(f"Z {Z!r}: expected a collision factor from {Z_RANGE[0]:g} to {Z_RANGE[1]:g} "
                                  "M^-1 s^-1 (about 1e11 usually)")
        m = self.medium
        if m is not None:
            from ..core.solvents import solvent_table

            known = solvent_table()
            if not isinstance(m, str) or m not in known:
                raise ConditionsError(f"unknown medium {m!r}; known media: {', '.join(sorted(known))} (or leave it "
                                      "out for the couples' own)")

    def with_(self, **changes) -> "Conditions":
        """A copy with some fields changed (validated again)."""
        return replace(self, **changes)


def row_conditions(base: Conditions, row) -> Conditions:
    """`base` with a CSV row's own temperature (K), ionic strength (mol/L) and medium put in, where it has them.

    row: any record with optional attributes temperature, ionic_strength and medium (None when the cell is empty).
    """
    changes = {}
    if row.temperature is not None:
        changes["temperature_K"] = row.temperature
    if row.ionic_strength is not None:
        changes["ionic_strength_M"] = row.ionic_strength
    if row.medium is not None:
        changes["medium"] = row.medium
    return base.with_(**changes) if changes else base
