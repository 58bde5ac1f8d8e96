"""The rate map drawn as a heat map: one character per pair (the decade of k_obs), shaded, with a cursor.

Rows are oxidants, columns reductants. Enter makes the cell under the cursor the current pair.
"""

import math

from rich.text import Text
from textual.binding import Binding
from textual.message import Message
from textual.widget import Widget

from .text_fit import fit_middle

LABEL = 17  # row label width: index + id
CELL = 2
#: One symbol per decade of k_obs (log10 rounded down), clamped at the ends: digits 0-9 for 10^0..10^9,
#: A B C for 10^10..10^12, lower-case a..i for 10^-1..10^-9 (distinct without colour).
DECADE_SYMBOLS = dict(zip(range(-9, 13), "ihgfedcba" + "0123456789" + "ABC", strict=True))


#: Head of the row labels, and how to make the cell under the cursor the pair.
CORNER = "ox \\ red"
CHOOSE_HINT = "(enter: set as pair)"
#: What the symbols mean; the end symbols also hold every decade beyond them.
LEGEND = ("decade of k_obs / M⁻¹ s⁻¹: 0-9 = 10⁰-10⁹, A B = 10¹⁰ 10¹¹, C = 10¹² and faster, "
          "a-h = 10⁻¹-10⁻⁸, i = 10⁻⁹ and slower, · not computable.")


def decade_symbol(log10_k: float) -> str:
    """The symbol of a value's decade (DECADE_SYMBOLS); '·' for a pair that cannot be computed."""
    if not math.isfinite(log10_k):
        return "·"
    d = max(-9, min(12, math.floor(log10_k)))
    return DECADE_SYMBOLS[d]


def _shade(log10_k: float) -> str:
    if not math.isfinite(log10_k):
        return ""
    level = max(0, min(1, (log10_k + 4) / 16))
    return f"on color({233 + int(level * 10)})"


class HeatMap(Widget, can_focus=True):
    BINDINGS = [
        Binding("up", "move(-1, 0)", show=False),
        Binding("down", "move(1, 0)", show=False),
        Binding("left", "move(0, -1)", show=False),
        Binding("right", "move(0, 1)", show=False),
        Binding("pageup", "move(-10, 0)", show=False),
        Binding("pagedown", "move(10, 0)", show=False),
        # Not in the footer: the line under the map says it, and the footer must fit 80 columns.
        Binding("enter", "choose", "set pair", show=False),
    ]

    class Chosen(Message):
        def __init__(self, oxidant: str, reductant: str):
            self.oxidant, self.reductant = oxidant, reductant
            super().__init__()

    def __init__(self, **kwargs):
        super().__init__(**kwargs)
        self._ids: tuple[str, ...] = ()
        self._values = None
        self._note = "The map of the couples in view appears here."
        self.row = self.col = 0
        self._top = self._left = 0
        #: explain(oxidant, reductant) -> why a pair gives no value (set by the screen; asked once per cell).
        self.explain = None
        self._why: dict[tuple[str, str], str] = {}

    def show(self, ids, values, note: str = "") -> None:
        self._ids, self._values, self._note = tuple(ids), values, note
        self._why = {}
        self.row = min(self.row, max(0, len(self._ids) - 1))
        self.col = min(self.col, max(0, len(self._ids) - 1))
        self.refresh()

    def message(self, note: str) -> None:
        self._ids, self._values, self._note = (), None, note
        self.refresh()

    def _view(self) -> tuple[int, int]:
        # Two header rows, then the value line (may take two lines) and the legend (up to three).
        return max(1, self.size.height - 7), max(1, (self.size.width - LABEL) // CELL)

    def action_move(self, dr: int, dc: int) -> None:
        n = len(self._ids)
        if not n:
            return
        self.row = max(0, min(n - 1, self.row + dr))
        self.col = max(0, min(n - 1, self.col + dc))
        self.refresh()

    def action_choose(self) -> None:
        if self._ids:
            self.post_message(self.Chosen(self._ids[self.row], self._ids[self.col]))

    def on_click(self, event) -> None:
        """A click moves the cursor to the cell; a click on the cell under the cursor makes it the pair."""
        off = event.get_content_offset(self)
        if off is None or not self._ids:
            return
        head = 2 if len(self._ids) > 10 else 1
        i, j = self._top + off.y - head, self._left + (off.x - LABEL) // CELL
        if 0 <= i < len(self._ids) and 0 <= j < len(self._ids) and off.x >= LABEL:
            if (i, j) == (self.row, self.col):
                self.action_choose()
            self.row, self.col = i, j
            self.refresh()

    def _reason(self, ox: str, red: str) -> str:
        if self.explain is None:
            return ""
        if (ox, red) not in self._why:
            why = self.explain(ox, red)
            # The first clause says what is wrong; the pair bar gives the whole message once it is the pair.
            self._why[(ox, red)] = f": {why.split(';')[0]}" if why else ""
        return self._why[(ox, red)]

    @property
    def cell(self) -> tuple[str, str] | None:
        return (self._ids[self.row], self._ids[self.col]) if self._ids else None

    def render(self) -> Text:
        out = Text(no_wrap=True, overflow="crop")
        if not self._ids or self._values is None:
            out.append(self._note)
            return out
        rows, cols = self._view()
        if self.row < self._top:
            self._top = self.row
        elif self.row >= self._top + rows:
            self._top = self.row - rows + 1
        if self.col < self._left:
            self._left = self.col
        elif self.col >= self._left + cols:
            self._left = self.col - cols + 1
        n = len(self._ids)
        c_end, r_end = min(n, self._left + cols), min(n, self._top + rows)
        # Column numbers in two rows (tens above units), so every column keeps its own two cells.
        if n > 10:
            out.append(" " * LABEL)
            for j in range(self._left, c_end):
                out.append(f" {(j // 10) % 10 if j >= 10 else ' '}", style="bold reverse" if j == self.col else "dim")
            out.append("\n")
        out.append(CORNER.ljust(LABEL), style="dim")
        for j in range(self._left, c_end):
            out.append(f" {j % 10}", style="bold reverse" if j == self.col else "dim")
        out.append("\n")
        for i in range(self._top, r_end):
            # the id keeps its distinguishing end: hl-ferr…ne-mecn
            label = f"{i:>2} {fit_middle(self._ids[i], LABEL - 4)}".ljust(LABEL)
            out.append(label, style="bold reverse" if i == self.row else "")
            for j in range(self._left, c_end):
                v = float(self._values[i, j])
                sym = decade_symbol(v)
                style = "bold reverse" if (i, j) == (self.row, self.col) else _shade(v)
                out.append(f" {sym}", style=style)
            out.append("\n")
        ox, red = self._ids[self.row], self._ids[self.col]
        v = float(self._values[self.row, self.col])
        value = f"k_obs 10^{v:.2f} M⁻¹ s⁻¹" if math.isfinite(v) else f"not computable{self._reason(ox, red)}"
        out.append(f"{ox} + {red}: {value}   {CHOOSE_HINT}\n", style="bold")
        out.append(f"{LEGEND} {self._note}", style="dim")
        return out
