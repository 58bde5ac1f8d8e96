"""Results leave the screen: `w` saves the prediction, the check and the map (text, Markdown, or the JSON of
the command line's --format json), naming the library files with their sha256; an existing file is replaced
only after a yes; `c` copies the result to the clipboard."""

import hashlib
import io
from contextlib import redirect_stdout

from test_tui_editing import _app as _file_app
from test_tui_editing import _library
from tui_fixtures import ready_workbench as _ready
from tui_fixtures import run_async, settle

from crossrate.services.result_export import result_json
from crossrate.tui.screens.confirm_screen import ConfirmScreen
from crossrate.tui.screens.save_screen import SaveScreen


async def _save_as(pilot, path) -> None:
    await pilot.press("w")
    await settle(pilot)
    assert isinstance(pilot.app.screen, SaveScreen)
    box = pilot.app.screen.query_one("#save-path")
    box.value = ""
    await pilot.press(*str(path), "enter")
    await settle(pilot)


def _cli(*args) -> str:
    from crossrate.cli.main import main

    out = io.StringIO()
    with redirect_stdout(out):
        assert main(list(args)) == 0
    return out.getvalue()


@run_async
async def test_prediction_saved_as_json_markdown_and_copied(tmp_path):
    lib = _library(tmp_path)
    app = _file_app(lib)
    async with app.run_test(size=(100, 30)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("o", "down", "r")
        await settle(pilot)
        p = screen.prediction
        assert p.log10_k_obs_95 is not None  # the Monte Carlo interval is in
        await _save_as(pilot, tmp_path / "pair.json")
        saved = (tmp_path / "pair.json").read_text(encoding="utf-8")
        assert saved == result_json(p)
        # the command line, with its default draws and seed, gives the same JSON for the same pair and library
        assert p.samples == 20000
        cli = _cli("predict", "hl-osmium", "hl-iron", "--no-bundled", "--library", str(lib), "--format", "json")
        assert saved == cli
        await _save_as(pilot, tmp_path / "pair.md")
        md = (tmp_path / "pair.md").read_text(encoding="utf-8")
        sha = hashlib.sha256(lib.read_bytes()).hexdigest()
        assert md.startswith("# crossrate prediction: hl-osmium + hl-iron")
        assert "| quantity | value |" in md and f"`{lib}` sha256 `{sha}`" in md
        assert f"| log10_k_obs | {p.log10_k_obs:.6g} |" in md and "not a safety assessment" in md
        assert "saved the prediction" in str(screen.query_one("#status").content)
        await pilot.press("c")
        await settle(pilot)
        assert app.clipboard.startswith("crossrate prediction: hl-osmium + hl-iron") and sha in app.clipboard


@run_async
async def test_an_existing_file_is_replaced_only_after_yes(tmp_path):
    lib = _library(tmp_path)
    app = _file_app(lib)
    target = tmp_path / "keep.txt"
    target.write_text("a colleague's notes\n", encoding="utf-8")
    async with app.run_test(size=(100, 30)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("o", "down", "r")
        await settle(pilot)
        await _save_as(pilot, target)
        assert isinstance(app.screen, ConfirmScreen)
        await pilot.press("n")
        await settle(pilot)
        assert target.read_text(encoding="utf-8") == "a colleague's notes\n"
        assert "kept as it is" in str(screen.query_one("#status").content)
        await _save_as(pilot, target)
        await pilot.press("y")
        await settle(pilot)
        text = target.read_text(encoding="utf-8")
        assert text.startswith("crossrate prediction: hl-osmium + hl-iron") and "library files" in text


@run_async
async def test_check_and_map_saved(tmp_path):
    lib = _library(tmp_path)
    app = _file_app(lib)
    async with app.run_test(size=(100, 30)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("o", "down", "r", "5", "w")
        await settle(pilot)
        assert not isinstance(app.screen, SaveScreen)  # nothing to save before a measured k is entered
        assert "nothing to save" in str(screen.query_one("#status").content)
        await pilot.press("tab", *"3.5e4", "escape")
        await settle(pilot)
        await _save_as(pilot, tmp_path / "check.json")
        import json

        check = json.loads((tmp_path / "check.json").read_text(encoding="utf-8"))
        assert check["k_measured"] == 3.5e4 and check["oxidant"] == "hl-osmium" and "verdict" in check
        await pilot.press("6")
        await settle(pilot)
        await _save_as(pilot, tmp_path / "map.json")
        from crossrate.services.rate_map import rate_map

        expected = rate_map(screen.couple_set, ids=list(screen.map_result.ids), conditions=screen.conditions)
        assert (tmp_path / "map.json").read_text(encoding="utf-8") == result_json(expected, indent=None)
        await _save_as(pilot, tmp_path / "map.txt")
        text = (tmp_path / "map.txt").read_text(encoding="utf-8")
        rows = [ln.split() for ln in text.splitlines() if ln.startswith(("hl-osmium ", "hl-iron "))]
        assert len(rows) == 2 and all(len(r) == 3 for r in rows) and "sha256" in text  # a 2 x 2 matrix
