"""CoupleSet: the resolved, layered set of couples the program works on, and its numpy view."""

from __future__ import annotations

from functools import cached_property
from typing import TYPE_CHECKING, NamedTuple

if TYPE_CHECKING:
    import numpy as np

    from .shadowing import Shadowing

from ..core.constants import ANGSTROM, KJ
from ..core.potential_scales import ScaleRegistry
from ..errors import ArgumentError, UnknownCoupleError
from .couple import Couple


# A NamedTuple, not a frozen dataclass: an internal record on the path of every prediction, and Python 3.11
# compiles a dataclass's six methods at import (about 1 ms a class of a cold command; see DEVELOPERS.md).
class CoupleArrays(NamedTuple):
    """Column arrays over the couples of a set, in set order, SI units.

    E_root_V: effective potential (excited state applied) on the couple's root scale, V.
    scale_root: root scale key per couple (couples compare only when their roots are equal).
    ln_k_self: ln of k_self in M^-1 s^-1 (NaN where absent); ln_k_self_sd: natural-log SD (NaN where absent).
    E_sd_V: V (NaN where absent). E_I0_M: ionic strength E was measured at, mol/L. dE_dT_V_per_K: temperature
    coefficient of E, V/K (NaN where absent). dH_self_J: J/mol (NaN where absent). radius_m: m.
    I0_M, T0_K: conditions of the measurement. medium: solvent key per couple.
    lambda_in_J, lambda_total_J: J/mol (NaN where absent).
    """

    ids: tuple[str, ...]
    E_root_V: np.ndarray
    scale_root: np.ndarray
    z_ox: np.ndarray
    z_red: np.ndarray
    radius_m: np.ndarray
    ln_k_self: np.ndarray
    ln_k_self_sd: np.ndarray
    E_sd_V: np.ndarray
    E_I0_M: np.ndarray
    dE_dT_V_per_K: np.ndarray
    dH_self_J: np.ndarray
    I0_M: np.ndarray
    T0_K: np.ndarray
    medium: np.ndarray
    lambda_in_J: np.ndarray
    lambda_total_J: np.ndarray
    verified: np.ndarray


def _opt(values):
    import numpy as np  # here, not at import: loading a library (the workbench's start) needs no numpy

    return np.array([np.nan if v is None else float(v) for v in values], dtype=float)


class CoupleSet:
    """An ordered mapping id -> Couple with provenance, the shadowed entries and the potential scales."""

    def __init__(
        self,
        couples: list[Couple],
        scales: ScaleRegistry | None = None,
        shadowed: list[Shadowing] | None = None,
        files: list[str] | None = None,
        file_sha256: dict[str, str] | None = None,
        file_layers: dict[str, str] | None = None,
        searched: tuple[tuple[str, str, bool], ...] | None = None,
    ):
        self._couples: dict[str, Couple] = {}
        for c in couples:
            self._couples[c.id] = c
        self.scales = scales or ScaleRegistry()
        self.shadowed = list(shadowed or [])
        self.files = list(files or [])
        # sha256 of each file as it was read and its layer: an edit made on this view passes the sha to the
        # safe writer, which refuses when the file changed on disk since (see library/couple_edits.py)
        self.file_sha256: dict[str, str] = dict(file_sha256 or {})
        self.file_layers: dict[str, str] = dict(file_layers or {})
        self._index = {cid: i for i, cid in enumerate(self._couples)}
        #: (layer, path, read) of every file the layered loader looked for, to say why a set is empty.
        self.searched = tuple(searched) if searched is not None else None

    def empty_reason(self) -> str:
        """'no couples loaded: ...' naming the layers and files that were searched (for an empty set)."""
        if self.searched is None:
            return "no couples loaded: the set was built empty"
        if not self.searched:
            return ("no couples loaded: every layer was left out (no bundled, group or personal library and no "
                    "library file given)")
        parts = [f"the {layer} layer ({path}: {'no couple in it' if read else 'no such file'})"
                 for layer, path, read in self.searched]
        return "no couples loaded: searched " + ", ".join(parts)

    def __len__(self) -> int:
        return len(self._couples)

    def __iter__(self):
        return iter(self._couples.values())

    def __contains__(self, couple_id: str) -> bool:
        return couple_id in self._couples

    def ids(self) -> list[str]:
        return list(self._couples)

    def suggest(self, couple_id: str, n: int = 3) -> list[str]:
        """Closest known ids to a mistyped one."""
        import difflib  # here, not at import: only a mistyped id needs it (a cold start saves ~1.5 ms)

        return difflib.get_close_matches(couple_id, list(self._couples), n=n, cutoff=0.5)

    def __getitem__(self, couple_id: str) -> Couple:
        try:
            return self._couples[couple_id]
        except TypeError:  # an unhashable key (a list...)
            raise ArgumentError(f"couple id: got {type(couple_id).__name__}; expected a couple id (text)") from None
        except KeyError:
            if not isinstance(couple_id, str):
                raise ArgumentError(f"couple id: got {type(couple_id).__name__} {couple_id!r:.40}; expected a "
                                    "couple id (text)") from None
            raise UnknownCoupleError(couple_id, self.suggest(couple_id), self._empty_note()) from None

    def _empty_note(self) -> str:
        return self.empty_reason() if not self._couples else ""

    def index_of(self, ids) -> np.ndarray:
        """Integer positions of ids in set order (UnknownCoupleError for the first unknown one)."""
        import numpy as np

        if isinstance(ids, str):
            ids = [ids]
        try:
            # map() over the dict's own __getitem__ keeps the loop in C: ~4x faster for 100,000 ids.
            return np.fromiter(map(self._index.__getitem__, ids), dtype=np.intp, count=len(ids))
        except KeyError as exc:
            cid = exc.args[0]
            if not isinstance(cid, str):
                raise ArgumentError(f"couple id: got {type(cid).__name__} {cid!r:.40}; expected a couple id (text)") from None
            raise UnknownCoupleError(cid, self.suggest(cid), self._empty_note()) from None
        except TypeError:
            raise ArgumentError("couple ids: expected a list of couple ids (text)") from None

    def E_on_root(self, couple: Couple) -> tuple[float, str]:
        """(effective potential in V on the root scale, root scale key) for one couple."""
        root, offset = self.scales.resolve(couple.E_scale)
        return couple.effective_E + offset, root

    @cached_property
    def arrays(self) -> CoupleArrays:
        """Numpy columns over all couples (computed once per set)."""
        import numpy as np

        cs = list(self._couples.values())
        roots = [self.E_on_root(c) for c in cs]
        ln10 = np.log(10.0)
        return CoupleArrays(
            ids=tuple(c.id for c in cs),
            E_root_V=np.array([r[0] for r in roots], dtype=float),
            scale_root=np.array([r[1] for r in roots], dtype=object),
            z_ox=np.array([c.charge_ox for c in cs], dtype=float),
            z_red=np.array([c.charge_red for c in cs], dtype=float),
            radius_m=np.array([c.radius for c in cs], dtype=float) * ANGSTROM,
            ln_k_self=np.log(_opt(c.k_self for c in cs)),
            ln_k_self_sd=_opt(c.k_self_log10_sd for c in cs) * ln10,
            E_sd_V=_opt(c.E_sd for c in cs),
            E_I0_M=np.array([c.ionic_strength if c.E_ionic_strength is None else c.E_ionic_strength for c in cs],
                            dtype=float),
            dE_dT_V_per_K=_opt(c.dE_dT for c in cs) * 1e-3,
            dH_self_J=_opt(c.dH_self for c in cs) * KJ,
            I0_M=np.array([c.ionic_strength for c in cs], dtype=float),
            T0_K=np.array([c.temperature for c in cs], dtype=float),
            medium=np.array([c.medium for c in cs], dtype=object),
            lambda_in_J=_opt(c.lambda_in for c in cs) * KJ,
            lambda_total_J=_opt(c.lambda_total for c in cs) * KJ,
            verified=np.array([c.verified for c in cs], dtype=bool),
        )
