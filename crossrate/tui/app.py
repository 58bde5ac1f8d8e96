"""The crossrate workbench: a Textual app over the layered couple library. It holds no science."""

from collections.abc import Iterable

from textual.app import App, SystemCommand
from textual.binding import Binding

from .commands import COMMANDS


class CrossrateApp(App):
    """`couple_set` given: use it (tests); else load the layered library plus `library_paths` in a worker."""

    TITLE = "crossrate"
    CSS_PATH = "app.tcss"
    BINDINGS = [Binding("ctrl+q", "quit_safely", "quit", priority=True)]

    def __init__(self, library_paths=(), couple_set=None, layers: dict | None = None, **kwargs):
        """layers: keyword arguments for load_layered (bundled, starter, demo, group, personal)."""
        super().__init__(**kwargs)
        self.library_paths = list(library_paths)
        self.layers = dict(layers or {})
        self._given_set = couple_set
        self.unsaved_edits = False
        #: Library files made in this session with "new library file…" (they join library_paths once written).
        self.created_library_files: list[str] = []
        #: Why the library could not be read ("" when it was): shown in the app, printed and exit 2 on quit.
        self.load_problem = ""

    def on_mount(self) -> None:
        from .screens.workbench import WorkbenchScreen

        self.push_screen(WorkbenchScreen())

    # -- services reached through the app, so tests can inject a couple set --------------------------------
    def load_couple_set(self):
        from . import library_access

        if self._given_set is not None:
            return self._given_set, ""
        return library_access.load_layered_set(self.library_paths, **self.layers)

    def lambda_lines(self, couple_set, couple, conditions=None, unit: str = "kJ/mol"):
        from .library_access import lambda_lines

        return lambda_lines(couple_set, couple, conditions, unit)

    # -- commands -----------------------------------------------------------------------------------------
    def get_system_commands(self, screen) -> Iterable[SystemCommand]:
        from .screens.workbench import WorkbenchScreen

        yield from super().get_system_commands(screen)
        # Only from the workbench itself: "Edit couple" from inside an open form would stack a second form.
        if isinstance(screen, WorkbenchScreen):
            for title, help_text, action in COMMANDS:
                yield SystemCommand(title, help_text, lambda a=action: self.run_workbench_action(a))

    async def run_workbench_action(self, action: str) -> None:
        """Run an action of the workbench screen (from the command palette)."""
        from .screens.workbench import WorkbenchScreen

        if isinstance(self.screen, WorkbenchScreen):
            await self.screen.run_action(action)

    def action_command_palette(self) -> None:
        """The command palette, its search mark a plain '>' (the README promises plain marks)."""
        from textual.command import CommandPalette

        from .plain_palette import PlainPalette

        if self.use_command_palette and not CommandPalette.is_open(self):
            self.push_screen(PlainPalette(id="--command-palette"))

    async def action_quit(self) -> None:
        """The palette's "Quit" asks about unsaved edits too, like ctrl+q."""
        self.action_quit_safely()

    def action_quit_safely(self) -> None:
        if not self.unsaved_edits:
            self.exit(0)
            return
        from .screens.confirm_screen import ConfirmScreen

        def done(yes: bool | None) -> None:
            if yes:
                self.exit(0)

        self.push_screen(
            ConfirmScreen("There are unsaved edits in the couple form. Quit and discard them?", "discard and quit", "keep editing"),
            done,
        )


def run_app(library_paths=(), layers: dict | None = None) -> int:
    """Run the workbench in this terminal; returns the exit code. layers: bundled / starter / demo flags."""
    import sys

    app = CrossrateApp(library_paths=library_paths, layers=layers)
    code = app.run()
    if app.load_problem:
        print(f"crossrate: {app.load_problem}", file=sys.stderr)
        return 2
    return int(code or 0)
