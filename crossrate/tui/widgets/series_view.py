"""A whole measured series in the check view: every row of a measured-rates CSV with its verdict (a table
with a cursor; enter makes the row's pair the current pair), and log10 k measured against predicted with the
1:1 line and the factor-of-10 band, drawn on the braille canvas. Numbers come from
services.measured_check.check_measured (through library_access.check_series)."""

from __future__ import annotations

import math

from rich.text import Text
from textual.binding import Binding
from textual.message import Message
from textual.widget import Widget

from ..units import power_of_ten, rate_text
from .braille_canvas import BrailleCanvas
from .text_fit import fit_middle

#: Short verdict words and their plot marks (plain characters, readable without colour).
VERDICT_MARK = {"within_interval": ("ok", "o"), "within_10x": ("10x", "+"), "beyond_10x": ("far", "x")}
TABLE_HEAD = "line  pair                      measured   predicted  log10 m/p verdict"
PLOT_TITLE = "k measured (up) against k predicted (across), M⁻¹ s⁻¹"
PLOT_LEGEND = ["── 1:1", "··· factor of 10", "o inside 95 %", "+ within 10x", "x beyond", "◉ cursor"]


def series_table_lines(rows, cursor: int, top: int, width: int, height: int) -> Text:
    """The table text: a header, then rows top..top+height-2 (the one at `cursor` highlighted)."""
    out = Text(no_wrap=True, overflow="crop")
    out.append(TABLE_HEAD[:width].ljust(width), style="bold underline")
    for k in range(top, min(len(rows), top + max(1, height - 1))):
        r = rows[k]
        word = VERDICT_MARK.get(r.verdict, (r.verdict, "?"))[0]
        pair = fit_middle(f"{r.oxidant} + {r.reductant}", 25)
        line = (f"{r.line if r.line is not None else '':>4}  {pair:<25} {rate_text(r.log10_k_measured):>9}  "
                f"{rate_text(r.log10_k_pred):>9}  {r.log10_ratio:>+9.2f} {word}")
        out.append("\n")
        out.append(line[:width].ljust(width), style="reverse" if k == cursor else "")
    return out


def series_plot_lines(rows, cursor: int, width: int, height: int) -> Text:
    """log10 k measured (y) against log10 k predicted (x), both in M^-1 s^-1, the 1:1 line, the band of a
    factor of 10 either side, one mark per row by verdict, the cursor's row as ◉."""
    xs = [r.log10_k_pred for r in rows]
    ys = [r.log10_k_measured for r in rows]
    lo = math.floor(min(xs + ys)) - 1
    hi = math.ceil(max(xs + ys)) + 1
    axis = 6
    cols, nrows = max(10, width - axis - 1), max(4, height - 3)
    cv = BrailleCanvas(cols, nrows, lo, hi, lo, hi, y_bands=True)
    cv.line((lo, hi), (lo, hi), "dim")
    cv.line((lo, hi - 1), (lo + 1, hi), "dim", every=3)
    cv.line((lo + 1, hi), (lo, hi - 1), "dim", every=3)
    for k, r in enumerate(rows):
        if k != cursor:
            cv.mark(r.log10_k_pred, r.log10_k_measured, VERDICT_MARK.get(r.verdict, ("", "?"))[1], "bold")
    if 0 <= cursor < len(rows):
        cv.mark(rows[cursor].log10_k_pred, rows[cursor].log10_k_measured, "◉", "bold reverse")
    out = Text(no_wrap=True, overflow="crop")
    out.append(PLOT_TITLE + "\n", style="bold")
    body = cv.to_lines()
    step = max(1, math.ceil((hi - lo) / max(1, nrows // 2)))
    labels = {}
    for v in range(hi, lo - 1, -step):
        r = cv.cell_of(lo, v)[1]
        labels.setdefault(r, v)
    for r, line in enumerate(body):
        lab = power_of_ten(labels[r]) if r in labels else ""
        out.append(f"{lab:>{axis - 1}} ┤" if lab else " " * (axis - 1) + " │", style="dim")
        out.append_text(line)
        out.append("\n")
    ticks = [" "] * cols
    for v in range(lo, hi + 1, step):
        c, _ = cv.cell_of(v, lo)
        s = power_of_ten(v)
        start = max(0, min(cols - len(s), c - len(s) // 2))
        if all(ch == " " for ch in ticks[max(0, start - 1): start + len(s) + 1]):
            ticks[start: start + len(s)] = list(s)
    out.append(" " * (axis + 1))
    out.append("".join(ticks) + "\n", style="dim")
    from .rate_curve_plot import wrap_items

    out.append(wrap_items(PLOT_LEGEND, width, 1)[0])
    return out


class SeriesTable(Widget, can_focus=True):
    """The rows of a series check with a cursor; enter posts Chosen for the row's pair."""

    BINDINGS = [
        Binding("up", "move(-1)", show=False),
        Binding("down", "move(1)", show=False),
        Binding("pageup", "move(-10)", show=False),
        Binding("pagedown", "move(10)", show=False),
        Binding("enter", "choose", "set pair", show=False),
    ]

    class Chosen(Message):
        def __init__(self, row):
            self.row = row
            super().__init__()

    class Moved(Message):
        """The cursor moved (the plot marks the row)."""

    def __init__(self, **kwargs):
        super().__init__(**kwargs)
        self.rows: tuple = ()
        self.cursor = 0
        self._top = 0

    def show(self, rows) -> None:
        self.rows, self.cursor, self._top = tuple(rows), 0, 0
        self.refresh()

    def action_move(self, step: int) -> None:
        if self.rows:
            self.cursor = max(0, min(len(self.rows) - 1, self.cursor + step))
            self.refresh()
            self.post_message(self.Moved())

    def action_choose(self) -> None:
        if self.rows:
            self.post_message(self.Chosen(self.rows[self.cursor]))

    def render(self) -> Text:
        h = max(1, self.size.height - 1)
        if self.cursor < self._top:
            self._top = self.cursor
        elif self.cursor >= self._top + h:
            self._top = self.cursor - h + 1
        return series_table_lines(self.rows, self.cursor, self._top, self.size.width, self.size.height)


class SeriesPlot(Widget):
    def __init__(self, **kwargs):
        super().__init__(**kwargs)
        self.rows: tuple = ()
        self.cursor = 0

    def show(self, rows, cursor: int) -> None:
        self.rows, self.cursor = tuple(rows), cursor
        self.refresh()

    def render(self) -> Text:
        if not self.rows:
            return Text("")
        return series_plot_lines(self.rows, self.cursor, self.size.width, self.size.height)
