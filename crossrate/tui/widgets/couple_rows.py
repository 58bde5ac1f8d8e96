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
    title: str
    width: int  # 0: takes the remaining width
    right: bool = False


COLUMNS = (
    Column("", 1),
    Column("id", 15),
    Column("name", 0),
    Column("ox/red", 6),
    Column("E/V", 7, right=True),
    Column("lg k11", 6, right=True),
    Column("medium", 8),
    Column("I/M", 5, right=True),
    Column("layer", 7),
)



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
