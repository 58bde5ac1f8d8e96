"""Potential scales (reference electrodes) and conversion between them.

Each scale is defined by an offset against another scale: E(vs relative_to) = E(vs scale) + offset_V.
Scales that chain back to the same root (SHE for the aqueous references) can be combined; a scale a
library defines without an offset is its own root and is never silently combined with another.
"""

import csv
import io
from functools import lru_cache
from pathlib import Path
from typing import NamedTuple


# A NamedTuple, not a frozen dataclass: a table row on the path of every prediction, and Python 3.11 compiles
# a dataclass's six methods at import (about 1 ms a class of a cold command; see DEVELOPERS.md).
class PotentialScale(NamedTuple):
    """A reference scale: E(vs relative_to) = E(vs key) + offset_V (V)."""

    key: str
    name: str
    relative_to: str
    offset_V: float
    source: str


@lru_cache(maxsize=1)
def builtin_scales() -> dict[str, PotentialScale]:
    """The bundled scales keyed by key: SHE, SCE, AgCl-sat, AgCl-3M."""
    text = (Path(__file__).parent / "data" / "potential_scales.csv").read_text(encoding="utf-8")
    lines = [ln for ln in text.splitlines() if ln.strip() and not ln.startswith("#")]
    out = {}
    for row in csv.DictReader(io.StringIO("\n".join(lines))):
        out[row["key"]] = PotentialScale(
            row["key"], row["name"], row["relative_to"], float(row["offset_V"]), row["source"]
        )
    return out


class ScaleRegistry:
    """Built-in scales plus those defined by libraries; resolves each to (root, offset to root)."""

    def __init__(self, extra: dict[str, PotentialScale] | None = None):
        self._scales = dict(builtin_scales())
        if extra:
            self._scales.update(extra)

    def __contains__(self, key: str) -> bool:
        return key in self._scales

    def keys(self):
        return self._scales.keys()

    def get(self, key: str) -> PotentialScale:
        return self._scales[key]

    def resolve(self, key: str) -> tuple[str, float]:
        """(root scale, offset) such that E(vs root) = E(vs key) + offset, following relative_to links.

        Raises KeyError for an unknown scale, ValueError for a cycle of definitions.
        """
        offset = 0.0
        seen = set()
        cur = key
        while True:
            if cur in seen:
                raise ValueError(f"potential scale {key!r}: its definitions form a cycle through {cur!r}")
            seen.add(cur)
            sc = self._scales[cur]
            if sc.relative_to == cur or sc.relative_to == "":
                return cur, offset
            offset += sc.offset_V
            cur = sc.relative_to

    def convert(self, E_V, from_scale: str, to_scale: str):
        """E in V on from_scale expressed on to_scale; ValueError if the two scales cannot be related."""
        r1, o1 = self.resolve(from_scale)
        r2, o2 = self.resolve(to_scale)
        if r1 != r2:
            raise ValueError(
                f"potential scales {from_scale!r} (root {r1!r}) and {to_scale!r} (root {r2!r}) cannot be related; "
                "define an offset between them in the library"
            )
        return E_V + o1 - o2
