"""A drop-down field that opens with enter or space only: up and down move to the previous / next field, as
the hints say ("↑↓ scroll" in the views, up/down between fields in the editor), instead of opening the list."""

from textual.binding import Binding
from textual.widgets import Select


class FieldSelect(Select):
    BINDINGS = [
        Binding("enter,space", "show_overlay", "open the list", show=False),
        Binding("down", "app.focus_next", "next field", show=False),
        Binding("up", "app.focus_previous", "previous field", show=False),
    ]
