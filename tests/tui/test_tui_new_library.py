"""Starting a library from the workbench: "new library file…" in the editor's file choice, and the offer to
create a --library file that does not exist yet. Driven by real keys; the files are checked on disk."""

from pathlib import Path

from tui_fixtures import ready_workbench as _ready
from tui_fixtures import run_async
from tui_fixtures import set_field as _type

from crossrate.library.toml_reader import read_library_file
from crossrate.tui.app import CrossrateApp
from crossrate.tui.screens.confirm_screen import ConfirmScreen
from crossrate.tui.screens.editor_screen import EditorScreen
from crossrate.tui.screens.new_library_screen import NewLibraryScreen
from crossrate.tui.screens.workbench import WorkbenchScreen

NO_LAYERS = {"bundled": False, "group": False, "personal": False}


async def _wait_for(pilot, kind):
    for _ in range(100):
        await pilot.pause(0.02)
        if isinstance(pilot.app.screen, kind):
            return pilot.app.screen
    raise AssertionError(f"{kind.__name__} never shown (now {type(pilot.app.screen).__name__})")


@run_async
async def test_missing_library_file_is_offered_and_created(tmp_path):
    path = tmp_path / "ours.toml"
    app = CrossrateApp(library_paths=[str(path)], layers=NO_LAYERS)
    async with app.run_test(size=(100, 34)) as pilot:
        confirm = await _wait_for(pilot, ConfirmScreen)
        assert f"{path} does not exist. Create it" in str(confirm.question)
        assert not path.exists()  # nothing before the answer
        await pilot.press("y")
        screen = await _ready(pilot)
        assert path.exists() and read_library_file(path).couples == []
        assert not app.load_problem  # the file now loads (empty), nothing is reported missing
        assert str(path) in screen.couple_set.files


@run_async
async def test_declined_offer_leaves_the_file_missing(tmp_path):
    path = tmp_path / "ours.toml"
    app = CrossrateApp(library_paths=[str(path)], layers=NO_LAYERS)
    async with app.run_test(size=(100, 34)) as pilot:
        await _wait_for(pilot, ConfirmScreen)
        await pilot.press("n")
        for _ in range(100):  # the loader reports the file as before (its problems pop up)
            await pilot.pause(0.02)
            if app.load_problem:
                break
        assert not path.exists() and "no such file" in app.load_problem


@run_async
async def test_new_library_file_from_the_editor_then_a_first_couple(tmp_path, monkeypatch):
    monkeypatch.chdir(tmp_path)  # the dialog suggests my-couples.toml in the working folder
    app = CrossrateApp(layers=NO_LAYERS)
    async with app.run_test(size=(100, 40)) as pilot:
        await _ready(pilot)
        await pilot.press("a")
        editor = await _wait_for(pilot, EditorScreen)
        assert editor.target is None  # no file loaded: nothing to write to yet
        editor.query_one("#editor-file").focus()
        await pilot.press("enter")  # open the file choice
        await pilot.pause()
        await pilot.press("end", "enter")  # its last entry: "new library file…"
        dialog = await _wait_for(pilot, NewLibraryScreen)
        assert dialog.query_one("#new-path").value == "my-couples.toml"
        await pilot.press("enter")
        editor = await _wait_for(pilot, EditorScreen)
        new = Path(tmp_path / "my-couples.toml")
        assert new.exists() and editor.target == "my-couples.toml"
        for field, text in (("id", "my-med"), ("name", "invented mediator"), ("charge_ox", "1"),
                            ("charge_red", "0"), ("E", "0.45"), ("radius", "4.0"), ("ionic_strength", "0.1"),
                            ("k_self", "2e6"), ("source", "invented example")):
            await _type(pilot, field, text)
        await pilot.press("ctrl+s")
        await _wait_for(pilot, ConfirmScreen)
        await pilot.press("y")
        screen = await _wait_for(pilot, WorkbenchScreen)
        await pilot.pause(0.2)
        assert [c.id for c in read_library_file(new).couples] == ["my-med"]
        assert "# [couple.my-couple]" in new.read_text(encoding="utf-8")  # the commented example is kept
        assert "my-med" in screen.couple_set and "my-couples.toml" in app.library_paths
