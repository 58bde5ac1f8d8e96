"""The couple editor: add, edit or duplicate a couple in a chosen library file, through the safe writer.

Nothing is written before the user confirms; a file changed on disk is refused (nothing written) and the
user is offered a reload, with the form kept as typed. Leaving with unsaved edits asks first.
"""

from textual.app import ComposeResult
from textual.binding import Binding
from textual.screen import Screen
from textual.widgets import Footer, Input, Label, OptionList, Select, Static

from ...errors import ConflictError, CrossrateError
from ..widgets.couple_form import CoupleForm, field_help
from ..widgets.field_select import FieldSelect
from ..widgets.text_fit import display_path
from .confirm_screen import ConfirmScreen

#: Value of the file choice's last entry, which opens the "new library file…" dialog.
NEW_FILE = "\x00new library file"


class EditorScreen(Screen[str | None]):
    """mode: 'add', 'edit' or 'duplicate'. Dismisses with the id written (None when nothing was)."""

    CSS_PATH = "editor.tcss"
    BINDINGS = [
        Binding("ctrl+s", "save", "save", priority=True),
        Binding("escape", "cancel", "close", priority=True),
        # Moving between fields acts before the next key is handed to a field (widgets/field_input.py), so
        # text typed right after tab or down lands in the new field.
        Binding("tab", "move_focus(1)", show=False, priority=True),
        Binding("shift+tab", "move_focus(-1)", show=False, priority=True),
        Binding("down", "field_step(1)", "next field", show=False, priority=True),
        Binding("up", "field_step(-1)", "previous field", show=False, priority=True),
    ]

    def check_action(self, action: str, parameters) -> bool | None:
        # The file's drop-down list uses esc, tab and the arrows itself while open; up and down move between
        # fields only from a text field (on the file choice they are the list's own keys).
        if action in ("cancel", "move_focus") and isinstance(self.focused, OptionList):
            return False
        if action == "field_step" and not isinstance(self.focused, Input):
            return False
        return True

    def action_move_focus(self, step: int) -> None:
        self.focus_next() if step > 0 else self.focus_previous()

    def action_field_step(self, step: int) -> None:
        self.action_move_focus(step)

    def __init__(self, mode: str, couple, files: list[tuple[str, str]], get_set, reload_library):
        """get_set() -> the current CoupleSet (its file hashes are what writes are checked against);
        reload_library() reads the files again."""
        super().__init__()
        self.mode, self.couple, self.files = mode, couple, files
        self.get_set, self.reload_library = get_set, reload_library
        self._written = False

    def compose(self) -> ComposeResult:
        c = self.couple
        title = {"add": "new couple", "edit": f"edit {c.id if c else ''}", "duplicate": f"copy of {c.id if c else ''}"}
        yield Static(f"{title[self.mode]}   ctrl+s save (asks first)  esc close   * required", id="editor-title")
        options = [(f"{layer}: {display_path(path, 70)}", path) for path, layer in self.files]
        start = c.origin.path if c is not None and c.origin is not None and c.origin.path in dict(self.files) else None
        yield Label("write to file")
        yield FieldSelect([*options, ("new library file…", NEW_FILE)],
                          value=start if start else (options[0][1] if options else Select.NULL),
                          allow_blank=not options, id="editor-file", compact=True, disabled=self.mode == "edit")
        new_id = c.id if (c and self.mode == "edit") else (f"{c.id}-copy" if c else "")
        yield CoupleForm(c if self.mode != "add" else None, new_id, id="form")
        yield Static("", id="field-help", markup=False)
        yield Static("", id="editor-message", markup=False)
        yield Footer()

    def on_mount(self) -> None:
        self.query_one("#f-id", Input).focus()

    def on_descendant_focus(self, event) -> None:
        """The focused field's whole help under the form (it wraps there instead of being cut)."""
        wid = getattr(event.widget, "id", None) or ""
        text = field_help(wid[2:]) if wid.startswith("f-") else ""
        if wid == "editor-file":
            text = "the library file the couple is written to (only this couple's table changes)"
        self.query_one("#field-help", Static).update(text)

    @property
    def dirty(self) -> bool:
        """Unsaved edits: the form differs from what it opened with and was not written."""
        return not self._written and self.query_one(CoupleForm).is_dirty()

    def on_couple_form_dirty(self) -> None:
        self.app.unsaved_edits = self.dirty

    def _message(self, text: str) -> None:
        self.query_one("#editor-message", Static).update(text)

    @property
    def target(self) -> str | None:
        v = self.query_one("#editor-file", Select).value
        return None if v is Select.NULL or v == NEW_FILE else str(v)

    def on_select_changed(self, event: Select.Changed) -> None:
        """"new library file…" asks for a path, creates the file and makes it the file to write to."""
        if event.select.id != "editor-file" or event.value != NEW_FILE:
            return
        from .new_library_screen import NewLibraryScreen

        select = event.select

        def created(path: str | None) -> None:
            if not path:
                select.value = self._last_file if self._last_file else Select.NULL
                return
            self.app.created_library_files.append(path)
            self.files = [*self.files, (path, "new")]
            select.set_options([*((f"{layer}: {display_path(p, 70)}", p) for p, layer in self.files), ("new library file…", NEW_FILE)])
            select.value = path
            self._message(f"created {path}; the couple is written there on ctrl+s")

        self.app.push_screen(NewLibraryScreen(), created)

    @property
    def _last_file(self) -> str | None:
        return self.files[0][0] if self.files else None

    def action_save(self) -> None:
        form = self.query_one(CoupleForm)
        problems = form.problems()
        path = self.target
        if path is None:
            problems.append("file: choose the library file to write to")
        if problems:
            self._message("! not saved; fix first:\n" + "\n".join(problems))
            return
        cid = form.couple_id
        kind = "update" if self.mode == "edit" else "add"
        old = self.couple.id if (self.couple is not None and kind == "update") else None
        if old is not None and old != cid:
            question = f"Rename couple {old} to {cid} and write its fields in {display_path(path)}?"
        else:
            question = f"{'Replace' if old else 'Add'} couple {cid} in {display_path(path)}?"
        question += " Only this couple's table changes; comments and other couples stay as they are."

        def answered(yes: bool | None) -> None:
            if yes:
                self._write(kind, path, cid, form.values())

        self.app.push_screen(ConfirmScreen(question, "write", "not now"), answered)

    def _write(self, kind: str, path: str, cid: str, values: dict) -> None:
        from ..library_access import file_sha256, write_couple

        old = self.couple.id if (self.couple is not None and self.mode == "edit") else None
        cs = self.get_set()
        try:
            write_couple(kind, cs, path, cid, values, file_sha256(cs, path), old_id=old)
        except ConflictError as exc:
            self._conflict(path, str(exc))
            return
        except CrossrateError as exc:
            self._message(f"! not saved: {exc}")
            return
        self._written = True
        self.app.unsaved_edits = False
        self.dismiss(cid)

    def _conflict(self, path: str, detail: str) -> None:
        self._message(f"! refused: {display_path(path)} changed on disk since it was read; nothing was written.\n{detail}")

        def answered(yes: bool | None) -> None:
            if yes:
                self.reload_library()
                self._message(f"{display_path(path)} reloaded; your form is as you left it. ctrl+s to write again.")

        self.app.push_screen(
            ConfirmScreen(f"{display_path(path)} changed on disk. Reload it (your form stays as typed)?", "reload", "not now"),
            answered,
        )

    def action_cancel(self) -> None:
        if not self.dirty:
            self.dismiss(None)
            return

        def answered(yes: bool | None) -> None:
            if yes:
                self.app.unsaved_edits = False
                self.dismiss(None)

        self.app.push_screen(ConfirmScreen("Discard the unsaved edits in this form?", "discard", "keep editing"), answered)
