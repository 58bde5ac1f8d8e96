"""Where to save a result and in which form: a file name (its extension picks the form) and the form itself
(text, Markdown, or the JSON of the command line's --format json). Dismisses with (path, format) or None."""

from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical
from textual.screen import ModalScreen
from textual.widgets import Button, Input, Label, Select, Static

from ..widgets.field_input import FieldInput
from ..widgets.field_select import FieldSelect

FORM_LABELS = (("text", "text"), ("Markdown", "markdown"), ("JSON (as crossrate --format json)", "json"))


class SaveScreen(ModalScreen[tuple[str, str] | None]):
    CSS_PATH = "dialogs.tcss"
    BINDINGS = [Binding("escape", "cancel", "cancel")]

    def __init__(self, what: str, default_path: str):
        super().__init__()
        self.what, self.default_path = what, default_path

    def compose(self) -> ComposeResult:
        from ...services.result_export import format_for_path

        with Vertical(classes="dialog"):
            yield Static(f"Save {self.what} to a file. An existing file is replaced only after you say yes.",
                         classes="question", markup=False)
            yield Label("file")
            yield FieldInput(self.default_path, id="save-path", compact=True)
            yield Label("form (follows the file's extension: .txt, .md, .json)")
            yield FieldSelect(FORM_LABELS, value=format_for_path(self.default_path), allow_blank=False,
                              id="save-format", compact=True)
            yield Static("Text and Markdown name the library files and their sha256.", classes="hint",
                         markup=False)
            with Horizontal(classes="buttons"):
                yield Button("save (enter)", id="save", compact=True)
                yield Button("cancel (esc)", id="cancel", compact=True)

    def on_mount(self) -> None:
        self.query_one("#save-path", Input).focus()

    def on_input_changed(self, event: Input.Changed) -> None:
        from ...services.result_export import format_for_path

        self.query_one("#save-format", Select).value = format_for_path(event.value)

    def on_input_submitted(self, event: Input.Submitted) -> None:
        event.stop()
        self._done()

    def on_button_pressed(self, event: Button.Pressed) -> None:
        self._done() if event.button.id == "save" else self.dismiss(None)

    def _done(self) -> None:
        path = self.query_one("#save-path", Input).value.strip()
        if path:
            self.dismiss((path, str(self.query_one("#save-format", Select).value)))

    def action_cancel(self) -> None:
        self.dismiss(None)
