"""The couples table: a windowed list that renders only the rows on screen, so 2,000+ couples stay fast.

Rows are plain display tuples built once per couple set (crossrate.tui.widgets.couple_rows); filtering and
sorting only reorder indices into them.
"""

from dataclasses import dataclass

from rich.text import Text
from textual.binding import Binding
from textual.message import Message
from textual.reactive import reactive
from textual.widget import Widget

from .couple_rows import COLUMNS, E_COLUMN, CoupleRow
from .text_fit import fit_end, fit_middle

MEDIUM = next(k for k, c in enumerate(COLUMNS) if c.title == "medium")
ID = next(k for k, c in enumerate(COLUMNS) if c.title == "id")
LAYER = next(k for k, c in enumerate(COLUMNS) if c.title == "layer")
MEDIUM_MAX = 15  # columns
#: Below this width (columns) the layer column is left out, so names keep a readable width at 80 columns.
LAYER_FROM = 100
#: Header lines above the rows: the column names (with the sort arrow), then their units.
HEAD = 2


@dataclass(frozen=True)
class SortKey:
    column: int
    reverse: bool


class CoupleTable(Widget, can_focus=True):
    """Couples as rows: mark, id, name, charges, E, log10 k_self, medium, I, layer."""

    BINDINGS = [
        Binding("up", "move(-1)", "up", show=False),
        Binding("down", "move(1)", "down", show=False),
        Binding("pageup", "page(-1)", "page up", show=False),
        Binding("pagedown", "page(1)", "page down", show=False),
        Binding("home", "jump(0)", "first", show=False),
        Binding("end", "jump(-1)", "last", show=False),
        Binding("s", "cycle_sort", "sort", show=False),
        Binding("S", "reverse_sort", "reverse", show=False),
    ]

    cursor = reactive(0, always_update=True)
    sort = reactive(SortKey(0, False))

    class Highlighted(Message):
        """The highlighted couple changed (couple_id is None when the table is empty)."""

        def __init__(self, couple_id: str | None):
            self.couple_id = couple_id
            super().__init__()

    def __init__(self, **kwargs):
        super().__init__(**kwargs)
        self._rows: list[CoupleRow] = []
        self._shown: list[int] = []
        self._top = 0
        self._last_sent: str | None = "\0"
        self.units = [c.unit for c in COLUMNS]

    # -- data -------------------------------------------------------------------------------------------
    def set_rows(self, rows: list[CoupleRow], shown: list[int] | None = None, e_unit: str | None = None) -> None:
        """Replace all rows (shown: indices to display, default all; e_unit: the E column's unit line)."""
        if e_unit is not None:
            self.units[E_COLUMN] = e_unit
        keep = self.current_id
        self._rows = rows
        self._shown = []
        # After a reload without the highlighted couple (deleted), the cursor stays where it was.
        self.show_indices(list(range(len(rows))) if shown is None else shown, keep=keep, fallback=self.cursor)

    def show_indices(self, shown: list[int], keep: str | None = None, fallback: int = 0) -> None:
        """Show these row indices (sorted by the current sort), keeping couple `keep` highlighted if shown,
        else the row at `fallback` (the first match of a filter by default)."""
        keep = keep if keep is not None else self.current_id
        self._shown = self._sorted(shown)
        pos = fallback
        if keep is not None:
            for k, i in enumerate(self._shown):
                if self._rows[i].couple_id == keep:
                    pos = k
                    break
        self._top = 0
        self.cursor = pos

    def _sorted(self, shown: list[int]) -> list[int]:
        col, rev = self.sort.column, self.sort.reverse
        rows = self._rows
        return sorted(shown, key=lambda i: rows[i].sort_keys[col], reverse=rev)

    @property
    def shown_ids(self) -> list[str]:
        return [self._rows[i].couple_id for i in self._shown]

    @property
    def current_id(self) -> str | None:
        if not self._shown or not (0 <= self.cursor < len(self._shown)):
            return None
        return self._rows[self._shown[self.cursor]].couple_id

    def select_id(self, couple_id: str) -> bool:
        """Highlight a couple when it is shown; True when found."""
        for k, i in enumerate(self._shown):
            if self._rows[i].couple_id == couple_id:
                self.cursor = k
                return True
        return False

    # -- cursor -----------------------------------------------------------------------------------------
    @property
    def _body_height(self) -> int:
        return max(1, self.size.height - HEAD)

    def validate_cursor(self, value: int) -> int:
        return max(0, min(value, len(self._shown) - 1)) if self._shown else 0

    def watch_cursor(self, value: int) -> None:
        h = self._body_height
        if value < self._top:
            self._top = value
        elif value >= self._top + h:
            self._top = value - h + 1
        self.refresh()
        cid = self.current_id
        if cid != self._last_sent:
            self._last_sent = cid
            self.post_message(self.Highlighted(cid))

    def watch_sort(self) -> None:
        self.show_indices(self._shown)

    def action_move(self, step: int) -> None:
        self.cursor += step

    def action_page(self, step: int) -> None:
        self.cursor += step * self._body_height

    def action_jump(self, where: int) -> None:
        self.cursor = len(self._shown) - 1 if where < 0 else 0

    def action_cycle_sort(self) -> None:
        """Sort by the next column shown (a column left out at this width is skipped)."""
        widths = self._widths(self.size.width)
        col = (self.sort.column + 1) % len(COLUMNS)
        while not widths[col] and col != self.sort.column:
            col = (col + 1) % len(COLUMNS)
        self.sort = SortKey(col, False)

    def action_reverse_sort(self) -> None:
        self.sort = SortKey(self.sort.column, not self.sort.reverse)

    def on_click(self, event) -> None:
        y = event.get_content_offset(self)
        if y is not None and y.y >= HEAD:
            self.cursor = self._top + y.y - HEAD

    def on_mouse_scroll_down(self, event) -> None:
        self.cursor += 3
        event.stop()

    def on_mouse_scroll_up(self, event) -> None:
        self.cursor -= 3
        event.stop()

    def on_resize(self) -> None:
        self.watch_cursor(self.cursor)

    # -- drawing ----------------------------------------------------------------------------------------
    def _widths(self, total: int) -> list[int]:
        """Column widths (0: the column is left out, the layer below LAYER_FROM columns; the detail has it)."""
        fixed = [max(c.width, len(c.title) + 1) if c.width else 0 for c in COLUMNS]
        if total < LAYER_FROM:
            fixed[LAYER] = -1
        shown = sum(1 for w in fixed if w >= 0)
        flex = max(8, total - sum(w for w in fixed if w > 0) - (shown - 1))
        # On a wide terminal long solvent names (dichloromethane) are shown whole; the name keeps 30 or more.
        grow = min(MEDIUM_MAX - fixed[MEDIUM], max(0, flex - 30))
        fixed[MEDIUM] += grow
        return [max(0, w) if w else flex - grow for w in fixed]

    def render(self) -> Text:
        width = self.size.width
        widths = self._widths(width)
        out = Text(no_wrap=True, overflow="crop")
        head, units = [], []
        for k, (col, w) in enumerate(zip(COLUMNS, widths, strict=True)):
            if not w:
                continue
            # Every column is wide enough for its title and the arrow, so the sorted one always shows it.
            label = col.title + (("▼" if self.sort.reverse else "▲") if k == self.sort.column else "")
            unit = fit_end(self.units[k], w)
            head.append(label.rjust(w) if col.right else label.ljust(w))
            units.append(unit.rjust(w) if col.right else unit.ljust(w))
        out.append(" ".join(head)[:width].ljust(width), style="bold")
        out.append("\n")
        out.append(" ".join(units)[:width].ljust(width), style="dim underline")
        if not self._shown:
            empty = "no couple matches the filter" if self._rows else "no couples loaded"
            out.append(f"\n  {empty}", style="italic")
            return out
        end = min(len(self._shown), self._top + self._body_height)
        for pos in range(self._top, end):
            row = self._rows[self._shown[pos]]
            cells = []
            for k, (v, col, w) in enumerate(zip(row.cells, COLUMNS, widths, strict=True)):
                if not w:
                    continue
                # ids keep their distinguishing end (hl-ferr…ne-mecn); other cells lose their end
                v = fit_middle(v, w) if k == ID else fit_end(v, w)
                cells.append(v.rjust(w) if col.right else v.ljust(w))
            line = " ".join(cells)[:width].ljust(width)
            style = "reverse" if pos == self.cursor else ("italic" if not row.verified else "")
            out.append("\n")
            out.append(line, style=style)
        return out
