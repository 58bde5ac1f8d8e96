"""Hostile library files in the workbench: an integer too large for a float (start-up and ctrl+r, with a
typed form kept) and control characters in library text (escaped on screen)."""

import io

from rich.console import Console
from test_tui_editing import LIBRARY, _app, _library, _ready, _set_field
from tui_fixtures import run_async
from tui_screen_text import screen_text

from crossrate.tui.screens.editor_screen import EditorScreen
from crossrate.tui.screens.problems_screen import ProblemsScreen
from crossrate.tui.screens.workbench import WorkbenchScreen
from crossrate.tui.widgets.couple_detail import detail_text

HUGE = "1" + "0" * 400


async def _problem(pilot) -> str:
    """The load problem, once the problems screen shows it (then closed)."""
    for _ in range(200):
        await pilot.pause(0.02)
        if pilot.app.load_problem and isinstance(pilot.app.screen, ProblemsScreen):
            problem = pilot.app.load_problem
            await pilot.press("escape")
            await pilot.pause()
            return problem
    raise AssertionError("no load problem shown")


@run_async
async def test_huge_integer_at_start_up_is_a_load_problem(tmp_path):
    path = tmp_path / "huge.toml"
    path.write_text(LIBRARY.replace("k_self = 4.0", f"k_self = {HUGE}"), encoding="utf-8")
    app = _app(path)
    async with app.run_test(size=(100, 40)) as pilot:
        problem = await _problem(pilot)
        assert f"{path}:" in problem and "couple hl-iron: field k_self: got 1e+400" in problem
        assert app.is_running


@run_async
async def test_huge_integer_on_reload_keeps_the_workbench_and_the_typed_form(tmp_path):
    path = _library(tmp_path)
    app = _app(path)
    async with app.run_test(size=(100, 40)) as pilot:
        await _ready(pilot)
        await pilot.press("e")
        await pilot.pause()
        await _set_field(pilot, "radius", "7.25")
        # another program writes a huge integer into the file: the save is refused with the file's message
        path.write_text(LIBRARY.replace("radius = 3.4", f"radius = {HUGE}"), encoding="utf-8")
        await pilot.press("ctrl+s")
        await pilot.pause()
        await pilot.press("y")
        await pilot.pause()
        assert app.is_running
        editor = app.screen
        assert isinstance(editor, EditorScreen)
        message = str(editor.query_one("#editor-message").content)
        assert "not saved" in message and "couple hl-iron: field radius: got 1e+400" in message
        assert editor.query_one("#f-radius").value == "7.25"  # what was typed is still there
        await pilot.press("escape")
        await pilot.pause()
        if not isinstance(app.screen, WorkbenchScreen):
            await pilot.press("y")  # discard the unsaved form
            await pilot.pause()
        await pilot.press("ctrl+r")
        problem = await _problem(pilot)
        assert "field radius: got 1e+400" in problem and app.is_running


HOSTILE = LIBRARY.replace('name = "Halden iron aqua"', 'name = "iron \\u001b]0;owned\\u0007\\u001b[2J aqua"').replace(
    'source = "invented"\nverified = false', 'source = "invented \\u001b[31m"\nverified = false')


@run_async
async def test_control_characters_in_library_text_are_escaped_on_screen(tmp_path):
    path = tmp_path / "hostile.toml"
    path.write_text(HOSTILE, encoding="utf-8")
    app = _app(path)
    async with app.run_test(size=(120, 40)) as pilot:
        screen = await _ready(pilot)
        screen.query_one("#table").select_id("hl-iron")
        await pilot.pause(0.1)
        text = screen_text(app)
        assert "\x1b" not in text and "\x07" not in text
        assert "iron \\x1b]0;owned\\x07\\x1b[2J aqua" in text  # in the table row and the detail panel
        # the detail panel's every field (scrolled out of view here), rendered as the panel renders it
        console = Console(width=120, record=True, file=io.StringIO())
        console.print(detail_text(screen.couple_set, screen.couple_set["hl-iron"]))
        detail = console.export_text()
        assert "invented \\x1b[31m" in detail and "\x1b" not in detail
