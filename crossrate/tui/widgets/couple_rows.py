"""Display rows of the couples table and the filter over them (text only: no science here)."""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import TYPE_CHECKING

from ...errors import printable
from ...library.provenance import provenance_mark

if TYPE_CHECKING:
    from ...library.couple_set import CoupleSet


@dataclass(frozen=True)
class Column:
    """title: first header line; unit: second header line (the E column's is set from the couple set)."""

    title: str
    width: int  # 0: takes the remaining width
    right: bool = False
    unit: str = ""


#: Every column is sortable (s cycles, S reverses); the first one is the order of the library files.
COLUMNS = (
    Column("", 1),
    Column("id", 14),
    Column("name", 0),
    Column("ox/red", 6, unit="charges"),
    Column("E", 8, right=True, unit="V vs SHE"),
    Column("log k_self", 10, right=True, unit="M⁻¹ s⁻¹"),
    Column("medium", 8),
    Column("I", 5, right=True, unit="M"),
    Column("layer", 7),
)
E_COLUMN = 4


def e_unit(cs: CoupleSet) -> str:
    """The E column's unit line: the scale every shown potential is on ('V vs SHE'), or, when the couples'
    scales have different roots, 'V, own root' (each E on its couple's root scale, named in the detail)."""
    roots = {cs.E_on_root(c)[1] for c in cs}
    return f"V vs {roots.pop()}" if len(roots) == 1 else "V own root"



@dataclass(frozen=True)
class CoupleRow:
    couple_id: str
    cells: tuple[str, ...]
    sort_keys: tuple
    haystack: str
    verified: bool
    medium: str


def charge_text(z: int) -> str:
    if z == 0:
        return "0"
    return f"{abs(z)}{'+' if z > 0 else '-'}"


def build_rows(cs: CoupleSet) -> list[CoupleRow]:
    """One CoupleRow per couple in set order; E is the effective potential on the couple's root scale."""
    rows = []
    for n, c in enumerate(cs):
        E_root, _root = cs.E_on_root(c)
        lgk = math.log10(c.k_self) if c.k_self else None
        layer = c.origin.layer if c.origin else ""
        cells = (
            provenance_mark(c) or " ",
            c.id,
            printable(c.name, keep_newlines=False),  # text from the file: never terminal controls
            f"{charge_text(c.charge_ox)}/{charge_text(c.charge_red)}",
            f"{E_root:+.3f}",
            f"{lgk:.1f}" if lgk is not None else "-",
            c.medium,
            f"{c.ionic_strength:g}",
            layer,
        )
        keys = (
            n,  # set order (the file order of the layers)
            c.id,
            c.name.lower(),
            (c.charge_ox, c.charge_red),
            E_root,
            lgk if lgk is not None else -math.inf,
            c.medium,
            c.ionic_strength,
            layer,
        )
        hay = " ".join((c.id, c.name, " ".join(c.tags), c.medium)).lower()
        rows.append(CoupleRow(c.id, cells, keys, hay, c.verified, c.medium))
    return rows


def filter_rows(rows: list[CoupleRow], query: str) -> list[int]:
    """Indices of rows whose id, name, tags or medium contain every word of the query (case-insensitive)."""
    words = query.lower().split()
    if not words:
        return list(range(len(rows)))
    return [i for i, r in enumerate(rows) if all(w in r.haystack for w in words)]
