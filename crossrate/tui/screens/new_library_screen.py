"""Starting a library file from the workbench: the "new library file…" dialog of the editor's file choice,
and the offer to create a --library file that does not exist yet when the workbench starts.

Both create the file through crossrate.library.new_library (via library_access): a header with format,
title, default medium, temperature and scale, and a commented example couple; an existing file is never
overwritten.
"""

from pathlib import Path

from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical
from textual.screen import ModalScreen
from textual.widgets import Button, Input, Static

from ...errors import CrossrateError


class NewLibraryScreen(ModalScreen[str | None]):
    """Asks for the path of a new library file and creates it; dismisses with the path (None: cancelled)."""

    CSS_PATH = "dialogs.tcss"
    BINDINGS = [Binding("escape", "cancel", "cancel")]

    def __init__(self, suggestion: str = "my-couples.toml"):
        super().__init__()
        self.suggestion = suggestion

    def compose(self) -> ComposeResult:
        with Vertical(classes="dialog"):
            yield Static("New library file: a header (format, title, medium water, 298.15 K, E vs SHE) and a "
                         "commented example couple. An existing file is never overwritten.", classes="question",
                         markup=False)
            yield Input(value=self.suggestion, placeholder="path of the new file, ending in .toml", id="new-path")
            yield Static("", id="new-message", classes="question", markup=False)
            with Horizontal(classes="buttons"):
                yield Button("create (enter)", id="create", compact=True)
                yield Button("cancel (esc)", id="cancel", compact=True)

    def on_mount(self) -> None:
        self.query_one("#new-path", Input).focus()

    def on_input_submitted(self, event: Input.Submitted) -> None:
        event.stop()
        self._create()

    def on_button_pressed(self, event: Button.Pressed) -> None:
        if event.button.id == "create":
            self._create()
        else:
            self.dismiss(None)

    def _create(self) -> None:
        from ..library_access import create_library_file

        path = self.query_one("#new-path", Input).value.strip()
        if not path:
            self.query_one("#new-message", Static).update("! expected the path of the new file")
            return
        try:
            create_library_file(path)
        except CrossrateError as exc:
            self.query_one("#new-message", Static).update(f"! {exc}")
            return
        self.dismiss(path)

    def action_cancel(self) -> None:
        self.dismiss(None)


def missing_files(paths) -> list[str]:
    """The paths of `paths` that name nothing (not even a dangling link)."""
    return [p for p in paths if not Path(p).exists() and not Path(p).is_symlink()]


def offer_missing_files(screen, then) -> None:
    """Ask, one file at a time, whether to create each --library file that does not exist yet; then call
    then() (the files declined stay missing and are reported by the loader as before)."""
    from .confirm_screen import ConfirmScreen

    missing = missing_files(screen.app.library_paths)

    def ask(rest: list[str]) -> None:
        if not rest:
            then()
            return
        path = rest[0]

        def answered(yes: bool | None) -> None:
            if yes:
                from ..library_access import create_library_file

                try:
                    create_library_file(path)
                    screen.status(f"created {path}: a library with no couple yet (a adds one)")
                except CrossrateError as exc:
                    screen.status(f"! {exc}")
            ask(rest[1:])

        screen.app.push_screen(ConfirmScreen(f"{path} does not exist. Create it as a new library file (a header "
                                             "and a commented example couple)?", "create", "not now"), answered)

    ask(missing)
