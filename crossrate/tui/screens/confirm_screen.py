"""A yes/no question in a small modal box; dismisses with True (yes) or False."""

from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical
from textual.screen import ModalScreen
from textual.widgets import Button, Static


class ConfirmScreen(ModalScreen[bool]):
    CSS_PATH = "dialogs.tcss"
    BINDINGS = [Binding("escape", "no", "cancel"), Binding("y", "yes", "yes", show=False), Binding("n", "no", show=False)]

    def __init__(self, question: str, yes: str = "yes", no: str = "no"):
        super().__init__()
        self.question, self.yes_label, self.no_label = question, yes, no

    def compose(self) -> ComposeResult:
        with Vertical(classes="dialog"):
            yield Static(self.question, classes="question", markup=False)
            with Horizontal(classes="buttons"):
                yield Button(f"{self.yes_label} (y)", id="yes", compact=True)
                yield Button(f"{self.no_label} (n)", id="no", compact=True)

    def on_mount(self) -> None:
        self.query_one("#no", Button).focus()

    def on_button_pressed(self, event: Button.Pressed) -> None:
        self.dismiss(event.button.id == "yes")

    def action_yes(self) -> None:
        self.dismiss(True)

    def action_no(self) -> None:
        self.dismiss(False)
