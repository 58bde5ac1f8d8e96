"""The couple detail panel: every field of the highlighted couple, where it came from, and what it shadows."""

from __future__ import annotations

from typing import TYPE_CHECKING

from rich.text import Text
from textual.widgets import Static

from ...library.couple import COUPLE_FIELDS, Couple

if TYPE_CHECKING:
    from ...library.couple_set import CoupleSet
from ...library.schema import FIELDS_BY_NAME


def detail_text(cs: CoupleSet, c: Couple, lambda_lines: list[str] | None = None) -> Text:
    t = Text()
    t.append(f"{c.id}", style="bold")
    t.append(f"  {c.name}\n")
    if not c.verified:
        t.append("? not verified against the primary source (recalled or estimated)\n", style="bold")
    E_root, root = cs.E_on_root(c)
    t.append(f"E = {c.E:+.3f} V vs {c.E_scale}")
    if c.E_scale != root or c.effective_E != c.E:
        t.append(f"  (reacting form {E_root:+.3f} V on {root})")
    t.append("\n")
    if c.origin is not None:
        t.append(f"from {c.origin.path}:{c.origin.line}  (layer {c.origin.layer})\n", style="dim")
    for sh in cs.shadowed:
        if sh.couple_id == c.id:
            t.append(f"shadows {sh.hidden.path}:{sh.hidden.line}\n", style="dim")
    for name in COUPLE_FIELDS:
        if name in ("name", "E", "E_scale"):
            continue
        v = getattr(c, name)
        if v is None or v == () or v == "":
            continue
        if name == "bonds":
            v = "; ".join(f"{b.count} x dd {b.delta_d:g} A, f {b.f_ox:g}/{b.f_red:g} N/m" for b in v)
        elif name == "tags":
            v = ", ".join(v)
        elif isinstance(v, bool):
            v = "true" if v else "false"
        t.append(f"{name:<16}", style="bold")
        spec = FIELDS_BY_NAME.get(name)
        unit = f" {spec.unit}" if spec is not None and spec.unit and name != "bonds" else ""
        t.append(f"{v}{unit}\n")
    if lambda_lines:
        t.append("reorganization energy\n", style="bold")
        for ln in lambda_lines:
            t.append(f"  {ln}\n")
    return t


class CoupleDetail(Static):
    def show(self, cs: CoupleSet | None, c: Couple | None, lambda_lines: list[str] | None = None) -> None:
        if cs is None or c is None:
            self.update("No couple highlighted.")
        else:
            self.update(detail_text(cs, c, lambda_lines))
