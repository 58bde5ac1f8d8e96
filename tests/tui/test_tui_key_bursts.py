"""No keystroke is lost or reordered when keys arrive in a burst: the keys are sent all at once (tui_fixtures
.burst), not one by one as Pilot.press does, and every burst is repeated several times."""

from test_tui_editing import _app as _file_app
from test_tui_editing import _library
from test_tui_editing import _ready as _file_ready
from tui_fixtures import burst, run_async, settle, small_couples
from tui_fixtures import ready_workbench as _ready
from tui_screen_text import screen_text

from crossrate.library.couple_set import CoupleSet
from crossrate.tui.app import CrossrateApp
from crossrate.tui.screens.editor_screen import EditorScreen


@run_async
async def test_temperature_typed_in_a_burst_arrives_whole():
    app = CrossrateApp(couple_set=CoupleSet(small_couples()))
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("o", "down", "r", "2", "tab")
        box = screen.query_one("#cond-T")
        assert app.focused is box
        for text in ("298.15", "310.5", "300", "305.25", "298.15", "301"):
            burst(app, ["end", *["backspace"] * 8, *text])
            await settle(pilot)
            assert box.value == text
            assert screen.cond_problem == "" and str(screen.query_one("#cond-message").content) == ""
            assert screen.prediction.conditions.temperature_K == float(text)
            bar = str(screen.query_one("#pair-bar").content)
            assert f"{float(text):g} K" in bar and "empty" not in bar and "last good" not in bar


@run_async
async def test_text_right_after_tab_lands_in_the_next_field_of_the_conditions():
    app = CrossrateApp(couple_set=CoupleSet(small_couples()))
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("o", "down", "r", "2", "tab")
        for k in range(4):
            burst(app, ["end", *["backspace"] * 8, *f"30{k}", "tab", *"0.2", "shift+tab", "end", "backspace", "5"])
            await settle(pilot)
            assert screen.query_one("#cond-T").value == f"30{k}"[:-1] + "5"
            assert screen.query_one("#cond-I").value.endswith("0.2")
            assert app.focused.id == "cond-T"
            # clear the ionic strength again for the next round
            burst(app, ["tab", "end", *["backspace"] * 12, "shift+tab"])
            await settle(pilot)
            assert screen.query_one("#cond-I").value == ""


@run_async
async def test_keys_after_esc_act_on_the_view_not_on_the_field():
    app = CrossrateApp(couple_set=CoupleSet(small_couples()))
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("o", "down", "r")
        for _ in range(3):
            burst(app, ["2", "tab", "end", "backspace", "escape", "3"])
            await settle(pilot)
            assert screen.view == "curve"
            assert screen.query_one("#cond-T").value in ("298.1", "298.15")
            burst(app, ["2", "tab", "end", *"5", "escape", "1"])
            await settle(pilot)
            assert screen.view == "couples" and screen.query_one("#cond-T").value == "298.15"


@run_async
async def test_search_typed_in_a_burst():
    app = CrossrateApp(couple_set=CoupleSet(small_couples()))
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        table = screen.query_one("#table")
        for _ in range(4):
            burst(app, ["slash", *"cage", *["backspace"] * 4, *"quin", "enter"])
            await settle(pilot)
            assert screen.query_one("#search").value == "quin"
            assert table.shown_ids == ["hl-quinone"] and app.focused is table
            burst(app, ["slash", *["backspace"] * 4, "escape"])
            await settle(pilot)
            assert len(table.shown_ids) == 9


@run_async
async def test_measured_k_typed_in_a_burst():
    app = CrossrateApp(couple_set=CoupleSet(small_couples()))
    async with app.run_test(size=(100, 30)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("o", "down", "r", "5", "tab")
        for text in ("3.5e4", "1.25e2", "7e6"):
            burst(app, ["end", *["backspace"] * 10, *text, "tab", *"0.3", "shift+tab"])
            await settle(pilot)
            assert screen.query_one("#check-k").value == text
            assert screen.measured == (float(text), 0.3)
            burst(app, ["tab", "end", *["backspace"] * 5, "shift+tab"])
            await settle(pilot)
            assert screen.query_one("#check-sd").value == ""


@run_async
async def test_editor_fields_typed_in_a_burst(tmp_path):
    path = _library(tmp_path)
    app = _file_app(path)
    async with app.run_test(size=(100, 40)) as pilot:
        await _file_ready(pilot)
        await pilot.press("e")
        await pilot.pause()
        editor = app.screen
        assert isinstance(editor, EditorScreen) and app.focused.id == "f-id"
        for k in range(4):
            # tab from the id into the name, the name replaced; down into charge_ox, End, one backspace, a digit
            burst(app, ["tab", "end", *["backspace"] * 40, *f"Halden osmium {k}", "down", "end", "backspace",
                        str(k + 1), "shift+tab", "shift+tab"])
            await settle(pilot)
            assert editor.query_one("#f-id").value == "hl-osmium"
            assert editor.query_one("#f-name").value == f"Halden osmium {k}"
            assert editor.query_one("#f-charge_ox").value == str(k + 1)
            assert app.focused.id == "f-id"
        assert "Halden osmium 3" in screen_text(app)
