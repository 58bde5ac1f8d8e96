"""The library problems: files that could not be read were left out; this lists what is wrong in them."""

from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Vertical, VerticalScroll
from textual.screen import ModalScreen
from textual.widgets import Static


class ProblemsScreen(ModalScreen[None]):
    """problems: one line per problem (file:line: couple: field: what was expected)."""

    CSS_PATH = "dialogs.tcss"
    BINDINGS = [Binding("escape,q,enter,p", "close", "close")]

    def __init__(self, problems: str, loaded: int):
        super().__init__()
        self.problems, self.loaded = problems, loaded

    def compose(self) -> ComposeResult:
        lines = self.problems.splitlines()
        files = sorted({ln.split(":", 1)[0] for ln in lines if ln})
        head = (f"{len(files)} library file(s) could not be read and were left out; "
                f"the workbench shows the {self.loaded} couples of the other files. Nothing is written to a "
                "file left out. Fix it, then ctrl+r reads the files again (p shows this list again).")
        with Vertical(classes="dialog"):
            yield Static(head, classes="question", markup=False)
            with VerticalScroll(id="problems-scroll"):
                yield Static(self.problems, id="problems-text", markup=False)
            yield Static("esc closes", classes="hint")

    def on_mount(self) -> None:
        self.query_one("#problems-scroll").focus()

    def action_close(self) -> None:
        self.dismiss(None)
