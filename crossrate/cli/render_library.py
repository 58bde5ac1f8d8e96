"""Table form of `crossrate library list`: one line per couple when it fits, else the name on a line of its own.

Nothing is cut: when the width is too narrow for every column (80 columns cannot hold id, name, E, scale,
k_self, medium, I and layer side by side), each couple takes two lines, the second giving its full name.
The width is the terminal's; piped output uses $COLUMNS, else 80, so `| less` reads like the terminal
(`--format csv` gives one line per couple for scripts).
"""

import os
import shutil
import sys
import textwrap

from ..library.provenance import legend_lines, provenance_mark
from .render_common import use_rich

HEADERS = ("id", "name", "E", "scale", "k_self", "medium", "I", "layer")
RIGHT = {"E", "k_self", "I"}
GAP = "  "
NAME_INDENT = "    "


def _fmt_k(k) -> str:
    return "-" if k is None else f"{k:.2g}"


def couple_rows(couples) -> list[tuple[str, ...]]:
    """Cells (text) of each couple in HEADERS order; '!' marks invented values, '?' unverified ones, '*'
    excited states."""
    rows = []
    for c in couples:
        star = "*" if c.E00 is not None else ""
        q = provenance_mark(c)
        rows.append((c.id, c.name, f"{c.effective_E:+.3f}{star}{q}", c.E_scale,
                     _fmt_k(c.k_self) + (q if c.k_self is not None else ""), c.medium,
                     f"{c.ionic_strength:g}", c.origin.layer if c.origin else ""))
    return rows


def _line(cells, widths, headers) -> str:
    parts = [cell.rjust(w) if h in RIGHT else cell.ljust(w) for cell, w, h in zip(cells, widths, headers, strict=True)]
    return GAP.join(parts).rstrip()


def list_lines(rows, width: int | None) -> list[str]:
    """Lines of the table (header, rule, rows). width None: no limit (one line per couple)."""
    widths = [max([len(h)] + [len(r[k]) for r in rows]) for k, h in enumerate(HEADERS)]
    single = sum(widths) + len(GAP) * (len(HEADERS) - 1)
    if width is None or single <= width:
        out = [_line(HEADERS, widths, HEADERS), "-" * single]
        out.extend(_line(r, widths, HEADERS) for r in rows)
        return out
    keep = [k for k, h in enumerate(HEADERS) if h != "name"]
    heads = [HEADERS[k] for k in keep]
    ws = [widths[k] for k in keep]
    out = [_line(heads, ws, heads), NAME_INDENT + "name", "-" * min(width, sum(ws) + len(GAP) * (len(ws) - 1))]
    for r in rows:
        out.append(_line([r[k] for k in keep], ws, heads))
        out.extend(textwrap.wrap(r[1], width=max(20, width), initial_indent=NAME_INDENT,
                                 subsequent_indent=NAME_INDENT + "  ", break_on_hyphens=False) or [NAME_INDENT])
    return out


def terminal_width(stream) -> int:
    """The terminal's width when stream is a terminal, else $COLUMNS, else 80."""
    isatty = getattr(stream, "isatty", None)
    if isatty and isatty():
        return shutil.get_terminal_size((80, 24)).columns
    try:
        return max(40, int(os.environ.get("COLUMNS", "80")))
    except ValueError:
        return 80


def print_couple_list(couples, n_total: int, shadowed, stream=None) -> None:
    """The table and its notes: units, '*', '!' and '?' marks, shadowed couples."""
    stream = stream or sys.stdout
    width = terminal_width(stream)
    rows = couple_rows(couples)
    lines = list_lines(rows, width) if rows else ["(no couple matches --tag / --medium)"]
    notes = [f"{len(couples)} of {n_total} couples; E in V on the scale shown, k_self in M^-1 s^-1, "
             "I = ionic strength in M (the conditions E and k_self were measured at)"]
    if any(c.E00 is not None for c in couples):
        notes.append("* excited-state potential (E with E00 applied)")
    notes += legend_lines(couples)
    if shadowed:
        shown = ", ".join(f"{s.couple_id} ({s.hidden.layer} -> {s.winner.layer})" for s in shadowed[:8])
        more = f" and {len(shadowed) - 8} more" if len(shadowed) > 8 else ""
        notes.append(f"{len(shadowed)} shadowed by a later layer: {shown}{more}; see `crossrate library show ID`")
    note_lines = [ln for n in notes for ln in textwrap.wrap(n, width=width, break_on_hyphens=False)]
    if use_rich(stream):
        from rich.text import Text

        from .terminal_output import console_for

        console = console_for(stream, highlight=False, soft_wrap=True)
        console.print(Text(lines[0], style="bold"))
        for ln in lines[1:]:
            console.print(Text(ln, style="dim" if ln.startswith(NAME_INDENT) else ""))
        console.print()
        for ln in note_lines:
            console.print(Text(ln, style="dim"))
        return
    stream.write("\n".join(lines) + "\n\n" + "\n".join(note_lines) + "\n")
