"""Hostile library files in the workbench: an integer too large for a float (start-up and ctrl+r, with a
typed form kept) and control characters in library text (escaped on screen)."""

from test_tui_editing import LIBRARY, _app, _library, _ready, _set_field
from tui_fixtures import run_async

from crossrate.tui.screens.editor_screen import EditorScreen
from crossrate.tui.screens.workbench import WorkbenchScreen

HUGE = "1" + "0" * 400


async def _problem(pilot) -> str:
    for _ in range(100):
        await pilot.pause(0.02)
        if pilot.app.load_problem:
            return pilot.app.load_problem
    raise AssertionError("no load problem reported")


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
