"""What changed between two versions of a library file: couples added, removed, and changed field by field.

Couples are matched by id. A field's old and new values are compared as the library reads them (4 and 4.0
are the same number; a [library] default that now fills a field counts as that value), and each change
carries the field's unit from the schema. Custom potential scales that were added, removed or redefined
are listed too (they move every couple on them).
"""

from dataclasses import dataclass

from .couple import Couple
from .schema import FIELD_SPECS


@dataclass(frozen=True)
class FieldChange:
    """One field of one couple: name, old and new value (None: absent), unit ("" when none)."""

    name: str
    old: object
    new: object
    unit: str


@dataclass(frozen=True)
class CoupleChange:
    """A couple present in both versions whose fields differ: id, its lines in the two files, the changes."""

    couple_id: str
    old_line: int | None
    new_line: int | None
    changes: tuple[FieldChange, ...]


@dataclass(frozen=True)
class LibraryDiff:
    """added / removed: couples only in the new / old version (file order); changed: CoupleChange in the new
    file's order; unchanged: number of couples equal in both; scales: one line per custom scale that differs."""

    old_name: str
    new_name: str
    added: tuple[Couple, ...]
    removed: tuple[Couple, ...]
    changed: tuple[CoupleChange, ...]
    unchanged: int
    scales: tuple[str, ...]

    @property
    def empty(self) -> bool:
        return not (self.added or self.removed or self.changed or self.scales)


def _line(c: Couple) -> int | None:
    return c.origin.line if c.origin is not None else None


def _changes(old: Couple, new: Couple) -> tuple[FieldChange, ...]:
    out = []
    for spec in FIELD_SPECS:
        a, b = getattr(old, spec.name), getattr(new, spec.name)
        if a != b:  # values as validated: numbers are floats, lists tuples
            out.append(FieldChange(spec.name, a, b, spec.unit))
    return tuple(out)


def _scale_lines(old_scales: dict, new_scales: dict) -> tuple[str, ...]:
    out = []
    for key in sorted(set(old_scales) | set(new_scales)):
        a, b = old_scales.get(key), new_scales.get(key)
        if a is None:
            out.append(f"scale {key} added (relative_to {b.relative_to or 'none'}, offset_V {b.offset_V:g})")
        elif b is None:
            out.append(f"scale {key} removed (was relative_to {a.relative_to or 'none'}, offset_V {a.offset_V:g})")
        elif (a.relative_to, a.offset_V) != (b.relative_to, b.offset_V):
            out.append(f"scale {key}: relative_to {a.relative_to or 'none'}, offset_V {a.offset_V:g} V -> "
                       f"relative_to {b.relative_to or 'none'}, offset_V {b.offset_V:g} V")
    return tuple(out)


def diff_libraries(old_couples, new_couples, old_scales: dict | None = None, new_scales: dict | None = None,
                   old_name: str = "old", new_name: str = "new") -> LibraryDiff:
    """Compare two versions' couples (and custom potential scales, key -> PotentialScale)."""
    old = {c.id: c for c in old_couples}
    new = {c.id: c for c in new_couples}
    added = tuple(c for cid, c in new.items() if cid not in old)
    removed = tuple(c for cid, c in old.items() if cid not in new)
    changed, unchanged = [], 0
    for cid, c in new.items():
        if cid not in old:
            continue
        ch = _changes(old[cid], c)
        if ch:
            changed.append(CoupleChange(cid, _line(old[cid]), _line(c), ch))
        else:
            unchanged += 1
    return LibraryDiff(old_name, new_name, added, removed, tuple(changed), unchanged,
                       _scale_lines(old_scales or {}, new_scales or {}))
