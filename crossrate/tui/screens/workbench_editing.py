"""Library editing from the workbench: open the couple editor (add, edit, duplicate), delete, reload.

Mixed into WorkbenchScreen beside WorkbenchLogic; writes go through crossrate.library.couple_edits via
crossrate.tui.library_access, always after the user confirmed.
"""

from ...errors import CrossrateError
from ..widgets.couple_table import CoupleTable
from ..widgets.text_fit import display_path


class WorkbenchEditing:
    """Actions e, a, d, delete and ctrl+r of the workbench (uses couple_set, status(), _current())."""

    def action_reload(self) -> None:
        """Read the library files again (kept: pair, conditions, filter)."""
        self.status("reloading the library...")
        self.library_loaded(*self.app.load_couple_set())

    def _open_editor(self, mode: str) -> None:
        from ..library_access import writable_files
        from .editor_screen import EditorScreen

        cs = self.couple_set
        if cs is None:
            return
        cid = self._current()
        couple = cs[cid] if (cid and mode != "add") else None
        if mode != "add" and couple is None:
            self.status("no couple highlighted")
            return
        files = writable_files(cs)  # may be empty: the editor's file choice offers "new library file…"

        def done(written: str | None) -> None:
            self.app.unsaved_edits = False
            if written:
                # a file made with "new library file…" joins the set (as if given with --library)
                for path in self.app.created_library_files:
                    if path not in self.app.library_paths:
                        self.app.library_paths.append(path)
                self.action_reload()
                self.query_one(CoupleTable).select_id(written)
                self.status(f"wrote couple {written}")

        self.app.push_screen(EditorScreen(mode, couple, files, lambda: self.couple_set, self.action_reload), done)

    def action_edit(self) -> None:
        self._open_editor("edit")

    def action_add(self) -> None:
        self._open_editor("add")

    def action_duplicate(self) -> None:
        self._open_editor("duplicate")

    def action_delete(self) -> None:
        from ..library_access import file_sha256, write_couple
        from .confirm_screen import ConfirmScreen

        cs, cid = self.couple_set, self._current()
        if cs is None or cid is None or cs[cid].origin is None:
            return
        path = cs[cid].origin.path
        try:
            sha = file_sha256(cs, path)
        except CrossrateError as exc:
            self.status(f"! {exc}")
            return

        def answered(yes: bool | None) -> None:
            if not yes:
                return
            try:
                write_couple("remove", cs, path, cid, None, sha)
            except CrossrateError as exc:
                self.status(f"! not deleted: {exc}")
                return
            self.action_reload()
            self.status(f"removed couple {cid} from {display_path(path)}")

        self.app.push_screen(ConfirmScreen(f"Remove couple {cid} from {display_path(path)}? Other tables stay as they are.", "remove", "keep"), answered)
