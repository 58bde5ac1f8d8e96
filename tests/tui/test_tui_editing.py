"""Editing the library from the workbench: the write keeps comments, a changed-on-disk file is refused,
nothing is written without confirming, and unsaved edits are not lost on quit."""

from pathlib import Path

from tui_fixtures import ready_workbench as _ready
from tui_fixtures import run_async
from tui_fixtures import set_field as _set_field
from tui_screen_text import screen_text

from crossrate.tui.app import CrossrateApp
from crossrate.tui.screens.confirm_screen import ConfirmScreen
from crossrate.tui.screens.editor_screen import EditorScreen
from crossrate.tui.screens.problems_screen import ProblemsScreen
from crossrate.tui.screens.workbench import WorkbenchScreen

LIBRARY = """\
# Halden Lake group library for the workbench tests (invented values)
[library]
title = "tui test"
format = 1
medium = "water"
temperature = 298.15
E_scale = "SHE"

# the osmium mediator
[couple.hl-osmium]
name = "Halden osmium mediator"
charge_ox = 3
charge_red = 2
E = 0.85  # from the group's own voltammetry
radius = 6.5
ionic_strength = 0.1
k_self = 2.0e5
source = "invented"
verified = true

[couple.hl-iron]
# recalled, to be checked
name = "Halden iron aqua"
charge_ox = 3
charge_red = 2
E = 0.74
radius = 3.4
ionic_strength = 0.1
k_self = 4.0
source = "invented"
verified = false
"""


def _library(tmp_path: Path) -> Path:
    p = tmp_path / "group.toml"
    p.write_text(LIBRARY, encoding="utf-8")
    return p


def _app(path: Path) -> CrossrateApp:
    return CrossrateApp(library_paths=[str(path)], layers={"bundled": False, "group": False, "personal": False})


@run_async
async def test_edit_writes_the_file_and_keeps_its_comments(tmp_path):
    path = _library(tmp_path)
    app = _app(path)
    async with app.run_test(size=(100, 40)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("e")
        await pilot.pause()
        assert isinstance(app.screen, EditorScreen)
        await _set_field(pilot, "radius", "7.25")
        assert app.unsaved_edits
        await pilot.press("ctrl+s")
        await pilot.pause()
        assert isinstance(app.screen, ConfirmScreen)
        assert path.read_text(encoding="utf-8") == LIBRARY  # nothing written before confirming
        await pilot.press("y")
        await pilot.pause()
        text = path.read_text(encoding="utf-8")
        assert "radius = 7.25" in text and "radius = 6.5" not in text
        # every comment and the other couple's table are as they were
        for line in LIBRARY.splitlines():
            if line.startswith("#") or "# from the group's" in line or line.startswith("# recalled"):
                assert line in text
        assert text.split("[couple.hl-iron]")[1] == LIBRARY.split("[couple.hl-iron]")[1]
        await pilot.pause(0.1)
        assert isinstance(app.screen, WorkbenchScreen)
        assert screen.couple_set["hl-osmium"].radius == 7.25
        assert not app.unsaved_edits


@run_async
async def test_bad_field_is_marked_and_nothing_is_written(tmp_path):
    path = _library(tmp_path)
    app = _app(path)
    async with app.run_test(size=(100, 40)) as pilot:
        await _ready(pilot)
        await pilot.press("e")
        await pilot.pause()
        await _set_field(pilot, "radius", "0.2")
        await pilot.pause()
        editor = app.screen
        assert editor.query_one("#f-radius").has_class("-bad")
        assert "expected a finite number from 1 to 30 angstrom" in str(editor.query_one("#m-radius").content)
        await pilot.press("ctrl+s")
        await pilot.pause()
        assert isinstance(app.screen, EditorScreen)
        assert "not saved" in str(editor.query_one("#editor-message").content)
        assert path.read_text(encoding="utf-8") == LIBRARY


@run_async
async def test_changed_on_disk_file_is_refused_and_reload_offered(tmp_path):
    path = _library(tmp_path)
    app = _app(path)
    async with app.run_test(size=(100, 40)) as pilot:
        await _ready(pilot)
        await pilot.press("e")
        await pilot.pause()
        await _set_field(pilot, "radius", "7.25")
        # someone else edits the file meanwhile
        theirs = LIBRARY.replace("k_self = 4.0", "k_self = 5.0  # remeasured by a colleague")
        path.write_text(theirs, encoding="utf-8")
        await pilot.press("ctrl+s")
        await pilot.pause()
        await pilot.press("y")
        await pilot.pause()
        assert path.read_text(encoding="utf-8") == theirs  # refused: their edit is intact
        assert isinstance(app.screen, ConfirmScreen)
        # words joined across lines: the question wraps where the temporary path's length puts it
        assert "changed on disk" in " ".join(screen_text(app).replace("│", " ").split())
        await pilot.press("y")  # reload
        await pilot.pause()
        editor = app.screen
        assert isinstance(editor, EditorScreen)
        assert editor.query_one("#f-radius").value == "7.25"  # the form kept what was typed
        assert "reloaded" in str(editor.query_one("#editor-message").content)
        await pilot.press("ctrl+s")
        await pilot.pause()
        await pilot.press("y")
        await pilot.pause()
        text = path.read_text(encoding="utf-8")
        assert "radius = 7.25" in text and "remeasured by a colleague" in text


@run_async
async def test_quit_with_unsaved_edits_asks_first(tmp_path):
    path = _library(tmp_path)
    app = _app(path)
    async with app.run_test(size=(100, 40)) as pilot:
        await _ready(pilot)
        await pilot.press("a")
        await pilot.pause()
        await _set_field(pilot, "id", "hl-new")
        await pilot.press("ctrl+q")
        await pilot.pause()
        assert isinstance(app.screen, ConfirmScreen) and app.is_running
        await pilot.press("n")
        await pilot.pause()
        assert isinstance(app.screen, EditorScreen)
        assert app.screen.query_one("#f-id").value == "hl-new"
        await pilot.press("escape")
        await pilot.pause()
        assert isinstance(app.screen, ConfirmScreen)  # closing the form asks too
        await pilot.press("n")
        await pilot.pause()
        # the palette's own "Quit" asks as well; the workbench commands are not offered inside the form
        titles = {c.title for c in app.get_system_commands(app.screen)}
        assert "Quit" in titles and "Edit couple" not in titles
        await app.action_quit()
        await pilot.pause()
        assert isinstance(app.screen, ConfirmScreen) and app.is_running
        await pilot.press("n")
    assert path.read_text(encoding="utf-8") == LIBRARY


@run_async
async def test_add_and_delete_a_couple(tmp_path):
    path = _library(tmp_path)
    app = _app(path)
    async with app.run_test(size=(100, 40)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("d")  # duplicate hl-osmium
        await pilot.pause()
        editor = app.screen
        assert editor.query_one("#f-id").value == "hl-osmium-copy"
        await _set_field(pilot, "E", "0.9")
        await pilot.press("ctrl+s")
        await pilot.pause()
        await pilot.press("y")
        await pilot.pause(0.1)
        text = path.read_text(encoding="utf-8")
        assert "[couple.hl-osmium-copy]" in text and text.startswith(LIBRARY.split("[couple.hl-iron]")[0])
        assert screen.couple_set["hl-osmium-copy"].E == 0.9
        assert screen.query_one("#table").current_id == "hl-osmium-copy"
        await pilot.press("delete")
        await pilot.pause()
        await pilot.press("y")
        await pilot.pause(0.1)
        assert "[couple.hl-osmium-copy]" not in path.read_text(encoding="utf-8")
        assert "hl-osmium-copy" not in screen.couple_set


@run_async
async def test_unreadable_library_is_explained_in_the_app(tmp_path):
    bad = tmp_path / "bad.toml"
    bad.write_text('[library]\ntitle = "x"\nformat = 1\n[couple.bad]\nname = "b"\nE = "high"\n', encoding="utf-8")
    app = _app(bad)
    async with app.run_test(size=(80, 24)) as pilot:
        for _ in range(100):
            await pilot.pause(0.02)
            if app.load_problem:
                break
        # file, line, couple, field and what was expected (the library's message, shown without markup)
        assert f"{bad}:6: couple bad: field E:" in app.load_problem
        assert "expected a finite number" in app.load_problem
        await pilot.pause()
        assert isinstance(app.screen, ProblemsScreen)
        text = " ".join(screen_text(app).replace("│", " ").split())
        assert "could not be read and were left out" in text and "couple bad" in text
        await pilot.press("escape")
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, WorkbenchScreen) and len(screen.couple_set) == 0
        assert str(bad) in str(screen.query_one("#detail").content)
        assert "left out" in screen_text(app)


@run_async
async def test_good_layers_load_beside_a_bad_file_which_is_not_writable(tmp_path):
    good = _library(tmp_path)
    bad = tmp_path / "bad.toml"
    bad.write_text('[library]\ntitle = "x"\nformat = 1\n[couple.bad]\nname = "b"\nE = "high"\n', encoding="utf-8")
    before = bad.read_bytes()
    app = CrossrateApp(library_paths=[str(good), str(bad)], layers={"bundled": False, "group": False, "personal": False})
    async with app.run_test(size=(100, 30)) as pilot:
        for _ in range(100):
            await pilot.pause(0.02)
            if isinstance(app.screen, ProblemsScreen):
                break
        assert isinstance(app.screen, ProblemsScreen)
        await pilot.press("escape")
        await pilot.pause()
        screen = app.screen
        assert sorted(screen.couple_set.ids()) == ["hl-iron", "hl-osmium"]
        from crossrate.tui.library_access import writable_files

        assert [p for p, _layer in writable_files(screen.couple_set)] == [str(good)]
        await pilot.press("p")  # the list again
        await pilot.pause()
        assert isinstance(app.screen, ProblemsScreen)
        await pilot.press("escape")
        await pilot.pause()
    assert bad.read_bytes() == before
