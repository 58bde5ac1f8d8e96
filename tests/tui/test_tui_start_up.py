"""What start-up leaves for later still works. Views 2 to 7 are built the first time they are opened (the first
frame holds the couples view alone), and a view key works on its first press: alone, in a burst with other
keys, or before the library has loaded. The footer, rebuilt once per refresh, shows the keys of where the
focus is now."""

from tui_fixtures import burst, run_async, settle, small_couples
from tui_fixtures import ready_workbench as _ready
from tui_screen_text import screen_text

from crossrate.library.couple_set import CoupleSet
from crossrate.tui.app import CrossrateApp
from crossrate.tui.screens.workbench import WorkbenchScreen
from crossrate.tui.widgets.view_tabs import VIEWS

LATER_VIEWS = [vid for vid, _key, _title in VIEWS if vid != "couples"]


def _built(screen) -> list[str]:
    return [vid for vid in LATER_VIEWS if screen.query(f"#{vid}")]


@run_async
async def test_only_the_couples_view_is_built_at_start_and_a_view_is_filled_when_first_opened():
    app = CrossrateApp(couple_set=CoupleSet(small_couples()))
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        assert _built(screen) == []
        await pilot.press("o", "down", "r")  # the pair is set while view 2 does not exist yet
        await settle(pilot)
        assert _built(screen) == []
        await pilot.press("2")
        await settle(pilot)
        assert _built(screen) == ["predict"] and screen.view == "predict"
        text = screen_text(app)
        # the panel shows the pair set before the view existed, the form the media of the solvent table
        assert "hl-osmium + hl-iron" in text and "temperature (K)" in text
        assert app.focused is screen.query_one("#prediction-scroll")
        assert len(screen.query_one("#cond-medium")._options) > 1


@run_async
async def test_view_keys_in_a_burst_build_each_view_once_and_keep_their_order():
    app = CrossrateApp(couple_set=CoupleSet(small_couples()))
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("o", "down", "r")
        burst(app, ["6", "2", "7", "3", "4", "5", "1", "6", "2", "3"])
        await settle(pilot)
        assert screen.view == "curve"
        assert sorted(_built(screen)) == sorted(LATER_VIEWS)
        for vid in LATER_VIEWS:  # one container each, only the current one shown
            assert len(screen.query(f"#{vid}")) == 1
            assert screen.query_one(f"#{vid}").display == (vid == "curve")
        assert "[3 rate curve]" in screen_text(app)


@run_async
async def test_a_view_key_pressed_before_the_library_has_loaded_works():
    app = CrossrateApp(couple_set=CoupleSet(small_couples()))
    async with app.run_test(size=(80, 24)) as pilot:
        await pilot.pause(0)
        assert isinstance(app.screen, WorkbenchScreen)
        await pilot.press("3")
        screen = await _ready(pilot)
        await settle(pilot)
        assert screen.view == "curve" and _built(screen) == ["curve"]
        assert "[3 rate curve]" in screen_text(app)


@run_async
async def test_the_footer_follows_the_focus():
    app = CrossrateApp(couple_set=CoupleSet(small_couples()))
    async with app.run_test(size=(100, 24)) as pilot:
        await _ready(pilot)
        await settle(pilot)  # the footer's keys are rebuilt after a refresh
        footer = screen_text(app).splitlines()[-1]
        assert "o oxidant" in footer and "/ search" in footer
        await pilot.press("slash")  # into the filter field: the table's keys are text there
        await pilot.pause()
        footer = screen_text(app).splitlines()[-1]
        assert "oxidant" not in footer and "search" not in footer and "^q quit" in footer
        burst(app, ["escape", "slash", "escape"])  # three binding changes before one refresh
        await settle(pilot)
        footer = screen_text(app).splitlines()[-1]
        assert "o oxidant" in footer and "/ search" in footer
