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

from .couple_rows import COLUMNS, CoupleRow

MEDIUM = next(k for k, c in enumerate(COLUMNS) if c.title == "medium")
MEDIUM_MAX = 15  # columns


def fit(text: str, width: int) -> str:
    """text cut to width, a cut shown by a final '…' (so a long id is not taken for a shorter one)."""
    return text if len(text) <= width else text[: max(0, width - 1)] + "…"


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

    # -- data -------------------------------------------------------------------------------------------
    def set_rows(self, rows: list[CoupleRow], shown: list[int] | None = None) -> None:
        """Replace all rows (shown: indices to display, default all)."""
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
        return max(1, self.size.height - 1)

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
        self.sort = SortKey((self.sort.column + 1) % len(COLUMNS), False)

    def action_reverse_sort(self) -> None:
        self.sort = SortKey(self.sort.column, not self.sort.reverse)

    def on_click(self, event) -> None:
        y = event.get_content_offset(self)
        if y is not None and y.y >= 1:
            self.cursor = self._top + y.y - 1

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
        fixed = [c.width for c in COLUMNS]
        flex = max(8, total - sum(w for w in fixed if w) - len(COLUMNS))
        # On a wide terminal long solvent names (dichloromethane) are shown whole; the name keeps 30 or more.
        grow = min(MEDIUM_MAX - fixed[MEDIUM], max(0, flex - 30))
        fixed[MEDIUM] += grow
        return [w or flex - grow for w in fixed]

    def render(self) -> Text:
        width = self.size.width
        widths = self._widths(width)
        out = Text(no_wrap=True, overflow="crop")
        head = []
        for k, (col, w) in enumerate(zip(COLUMNS, widths, strict=True)):
            label = col.title
            if k == self.sort.column:
                label += "▼" if self.sort.reverse else "▲"
            head.append(label[:w].ljust(w) if not col.right else label[:w].rjust(w))
        out.append(" ".join(head)[:width].ljust(width), style="bold underline")
        if not self._shown:
            empty = "no couple matches the filter" if self._rows else "no couples loaded"
            out.append(f"\n  {empty}", style="italic")
            return out
        end = min(len(self._shown), self._top + self._body_height)
        for pos in range(self._top, end):
            row = self._rows[self._shown[pos]]
            cells = [
                (fit(v, w).rjust(w) if col.right else fit(v, w).ljust(w))
                for v, col, w in zip(row.cells, COLUMNS, widths, strict=True)
            ]
            line = " ".join(cells)[:width].ljust(width)
            style = "reverse" if pos == self.cursor else ("italic" if not row.verified else "")
            out.append("\n")
            out.append(line, style=style)
        return out
