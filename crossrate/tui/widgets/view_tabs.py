"""The row of view names under the pair bar; the current one is bracketed (readable without colour)."""

from rich.text import Text
from textual.widgets import Static

#: (view id, key, title) in display order.
VIEWS = (
    ("couples", "1", "couples"),
    ("predict", "2", "prediction"),
    ("curve", "3", "rate curve"),
    ("energy", "4", "energy"),
    ("check", "5", "check"),
    ("map", "6", "map"),
    ("electrode", "7", "k0"),
)


class ViewTabs(Static):
    def show(self, current: str, unit: str) -> None:
        t = Text(no_wrap=True, overflow="crop")
        # Narrow terminals: one space between the views instead of two, so the unit still fits at 80 columns.
        full = sum(len(key) + len(title) + 3 for _vid, key, title in VIEWS) + len(unit) + 2
        pad = " " if full <= (self.size.width or 80) - 2 else ""
        for vid, key, title in VIEWS:
            if not pad:
                t.append(" ")
            if vid == current:
                t.append(f"[{key} {title}]", style="bold reverse")
            else:
                t.append(f"{pad}{key} {title}{pad}", style="dim")
        # The energy unit stays on this line even at 80 columns (nothing else says which one is in use).
        t.append(f"  {unit}", style="dim")
        self.update(t)
