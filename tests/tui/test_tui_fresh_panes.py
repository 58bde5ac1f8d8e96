"""Every pane that shows a couple shows what the library file now holds, after an edit, an add, a duplicate,
a delete and a reload, without moving the cursor."""

import io

from rich.console import Console
from test_tui_editing import LIBRARY, _app, _library, _ready, _set_field
from tui_fixtures import run_async

from crossrate.tui.screens.workbench import WorkbenchScreen


def _detail(screen) -> str:
    """The detail panel's text, rendered wide enough that nothing wraps."""
    console = Console(width=200, file=io.StringIO(), color_system=None)
    with console.capture() as cap:
        console.print(screen.query_one("#detail").content)
    return cap.get()


async def _save(pilot) -> None:
    await pilot.press("ctrl+s")
    await pilot.pause()
    await pilot.press("y")
    for _ in range(50):
        await pilot.pause(0.02)
        if isinstance(pilot.app.screen, WorkbenchScreen):
            break


@run_async
async def test_edit_shows_the_new_value_in_the_detail_without_moving(tmp_path):
    path = _library(tmp_path)
    app = _app(path)
    async with app.run_test(size=(140, 40)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("o", "down", "r", "up")  # pair osmium + iron, cursor back on osmium
        await pilot.pause()
        assert "200000.0" in _detail(screen)
        before_k = screen.prediction.log10_k_obs
        await pilot.press("e")
        await pilot.pause()
        await _set_field(pilot, "k_self", "4.0e5")
        await _save(pilot)
        assert "k_self = 400000.0" in path.read_text(encoding="utf-8")
        assert screen.query_one("#table").current_id == "hl-osmium"
        text = _detail(screen)
        assert "400000.0" in text and "200000.0" not in text
        # the pair bar and the prediction use the new k_self too (k_obs moves with sqrt(k11))
        assert screen.prediction.log10_k_obs != before_k
        assert screen.couple_set["hl-osmium"].k_self == 4.0e5


@run_async
async def test_reload_after_a_change_on_disk_refreshes_the_detail(tmp_path):
    path = _library(tmp_path)
    app = _app(path)
    async with app.run_test(size=(140, 40)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("down")  # hl-iron
        await pilot.pause()
        assert "3.4" in _detail(screen)
        path.write_text(LIBRARY.replace("radius = 3.4", "radius = 3.9"), encoding="utf-8")
        await pilot.press("ctrl+r")
        await pilot.pause()
        assert screen.query_one("#table").current_id == "hl-iron"
        assert "3.9" in _detail(screen) and "3.4 " not in _detail(screen)


@run_async
async def test_delete_shows_the_couple_now_under_the_cursor(tmp_path):
    path = _library(tmp_path)
    app = _app(path)
    async with app.run_test(size=(140, 40)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("delete")
        await pilot.pause()
        await pilot.press("y")
        await pilot.pause(0.1)
        assert "[couple.hl-osmium]" not in path.read_text(encoding="utf-8")
        cur = screen.query_one("#table").current_id
        assert cur == "hl-iron" and _detail(screen).startswith("hl-iron")


@run_async
async def test_duplicate_shows_the_copy_in_the_detail(tmp_path):
    path = _library(tmp_path)
    app = _app(path)
    async with app.run_test(size=(140, 40)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("d")
        await pilot.pause()
        await _set_field(pilot, "radius", "8.5")
        await _save(pilot)
        assert screen.query_one("#table").current_id == "hl-osmium-copy"
        assert _detail(screen).startswith("hl-osmium-copy") and "8.5" in _detail(screen)
