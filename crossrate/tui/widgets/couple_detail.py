"""The couple detail panel: every field of the highlighted couple, where it came from, and what it shadows."""

from __future__ import annotations

from typing import TYPE_CHECKING

from rich.console import Group
from rich.padding import Padding
from rich.style import Style
from rich.table import Table
from rich.text import Text
from textual.widgets import Static

from ...errors import printable
from ...library.couple import COUPLE_FIELDS, Couple

if TYPE_CHECKING:
    from ...library.couple_set import CoupleSet
from ...library.schema import FIELDS_BY_NAME
from .text_fit import display_path


def detail_text(cs: CoupleSet, c: Couple, lambda_lines: list[str] | None = None) -> Group:
    """The couple in full: a head (id, name, E, where it was read), then one row per field (long values wrap
    inside their column), then the reorganization-energy breakdown."""
    t = Text()
    t.append(f"{c.id}", style="bold")
    t.append(f"  {printable(c.name, keep_newlines=False)}\n")
    if c.invented:
        t.append("! invented: made-up values (demo, teaching), not measurements; never use them for real "
                 "predictions\n",
                 style="bold")
    elif not c.verified:
        t.append("? not verified against the primary source (recalled or estimated)\n", style="bold")
    E_root, root = cs.E_on_root(c)
    t.append(f"E = {c.E:+.3f} V vs {c.E_scale}")
    if c.E_scale != root or c.effective_E != c.E:
        t.append(f"  (reacting form {E_root:+.3f} V on {root})")
    if c.origin is not None:
        # the path shortened (one unbreakable word in a narrow panel), the line number kept
        t.append(printable(f"\nfrom {display_path(c.origin.path, 36)}:{c.origin.line}  (layer {c.origin.layer})"),
                 style="dim")
    for sh in cs.shadowed:
        if sh.couple_id == c.id:
            t.append(f"\nshadows {display_path(sh.hidden.path, 36)}:{sh.hidden.line}", style="dim")
    fields = Table.grid(padding=(0, 1))
    fields.add_column(style="bold", no_wrap=True, min_width=15)
    fields.add_column()
    for name in COUPLE_FIELDS:
        if name in ("name", "E", "E_scale") or (name == "invented" and not c.invented):
            continue
        v = getattr(c, name)
        if v is None or v == () or v == "":
            continue
        if name == "bonds":
            v = "; ".join(f"{b.count} × Δd {b.delta_d:g} Å, f {b.f_ox:g}/{b.f_red:g} N/m" for b in v)
        elif name == "tags":
            v = ", ".join(v)
        elif isinstance(v, bool):
            v = "true" if v else "false"
        spec = FIELDS_BY_NAME.get(name)
        unit = f" {spec.unit}" if spec is not None and spec.unit and name != "bonds" else ""
        # text from the file: never terminal controls; a DOI (checked: no spaces or controls) is a link to the source
        fields.add_row(name, Text(v, style=Style(link=f"https://doi.org/{v}")) if name == "doi"
                       else printable(f"{v}{unit}"))
    parts = [t, fields]
    if lambda_lines:
        parts.append(Text("reorganization energy", style="bold"))
        lam = Table.grid()
        lam.add_column()
        for ln in lambda_lines:
            lam.add_row(ln)
        parts.append(Padding(lam, (0, 0, 0, 2)))  # indented, and wrapped lines keep the indent
    return Group(*parts)


class CoupleDetail(Static):
    def show(self, cs: CoupleSet | None, c: Couple | None, lambda_lines: list[str] | None = None) -> None:
        if cs is None or c is None:
            self.update("No couple highlighted.")
        else:
            self.update(detail_text(cs, c, lambda_lines))
