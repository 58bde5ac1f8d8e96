"""Labels say what they mean: units in the detail follow `u`, the map legend's end symbols, the plots'
legends, the medium field's arrows, the bonds form and the required id in the editor, the palette's mark."""

import io

from rich.console import Console
from test_tui_editing import _app as _file_app
from test_tui_editing import _library, _set_field
from tui_fixtures import ready_workbench as _ready
from tui_fixtures import run_async, settle, small_couples
from tui_screen_text import screen_text

from crossrate.library.couple_set import CoupleSet
from crossrate.tui.app import CrossrateApp
from crossrate.tui.screens.editor_screen import EditorScreen
from crossrate.tui.screens.workbench import WorkbenchScreen


def _detail(screen) -> str:
    console = Console(width=200, file=io.StringIO(), color_system=None)
    with console.capture() as cap:
        console.print(screen.query_one("#detail").content)
    return cap.get()


@run_async
async def test_u_converts_the_detail_lambda_too():
    app = CrossrateApp(couple_set=CoupleSet(small_couples()))
    async with app.run_test(size=(140, 40)) as pilot:
        screen = await _ready(pilot)
        lam = [ln for ln in _detail(screen).splitlines() if ln.strip().startswith("λ_out")]
        assert lam and "kJ/mol" in lam[0]
        kj = float(lam[0].split()[1])
        await pilot.press("u")
        await settle(pilot)
        lam = [ln for ln in _detail(screen).splitlines() if ln.strip().startswith("λ_out")]
        assert "kcal/mol" in lam[0] and "kJ/mol" not in lam[0]
        # 1 kcal = 4.184 kJ (thermochemical calorie, NIST SP 811); one decimal shown
        assert abs(float(lam[0].split()[1]) - kj / 4.184) <= 0.051 + kj * 1e-4
        await pilot.press("u")
        await settle(pilot)
        assert "eV" in [ln for ln in _detail(screen).splitlines() if "λ est." in ln][0]


@run_async
async def test_plots_and_map_legends():
    app = CrossrateApp(couple_set=CoupleSet(small_couples()))
    async with app.run_test(size=(80, 24)) as pilot:
        await _ready(pilot)
        await pilot.press("o", "down", "r", "3")
        await settle(pilot)
        assert screen_text(app).count("● this pair") == 1
        await pilot.press("4")
        await settle(pilot)
        text = screen_text(app)
        assert "R reactant minimum" in text and "◆ crossing" in text
        await pilot.press("6")
        await settle(pilot)
        flat = " ".join(screen_text(app).split())
        assert "i = 10⁻⁹ and slower" in flat and "C = 10¹² and faster" in flat


@run_async
async def test_down_on_the_medium_field_moves_on_and_enter_opens_it():
    app = CrossrateApp(couple_set=CoupleSet(small_couples()))
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("2", "tab", "tab", "tab")
        assert app.focused.id == "cond-medium"
        await pilot.press("down")
        await pilot.pause()
        assert app.focused.id == "cond-Z" and not screen.query_one("#cond-medium").expanded
        await pilot.press("shift+tab", "up")
        await pilot.pause()
        assert app.focused.id == "cond-I" and not screen.query_one("#cond-medium").expanded
        await pilot.press("tab")
        await pilot.press("enter")
        await pilot.pause()
        assert screen.query_one("#cond-medium").expanded


@run_async
async def test_palette_search_mark_is_plain():
    app = CrossrateApp(couple_set=CoupleSet(small_couples()))
    async with app.run_test(size=(80, 24)) as pilot:
        await _ready(pilot)
        await pilot.press("ctrl+p")
        await settle(pilot)
        text = screen_text(app)
        assert ">  Search for commands" in text or "> Search for commands" in text
        assert all(ord(ch) < 0x1F000 for ch in text)  # no emoji


@run_async
async def test_editor_takes_bonds_as_the_command_line_does_and_marks_id_required(tmp_path):
    path = _library(tmp_path)
    app = _file_app(path)
    async with app.run_test(size=(100, 40)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("e")
        await pilot.pause()
        editor = app.screen
        assert isinstance(editor, EditorScreen)
        assert "*id" in screen_text(app)
        await _set_field(pilot, "bonds", "6:0.13:230:160")
        await settle(pilot)
        assert not editor.query_one("#f-bonds").has_class("-bad")
        assert "COUNT:DELTA_D:F_OX:F_RED" in str(editor.query_one("#field-help").content)
        await pilot.press("ctrl+s")
        await pilot.pause()
        await pilot.press("y")
        for _ in range(50):
            await pilot.pause(0.02)
            if isinstance(app.screen, WorkbenchScreen):
                break
        text = path.read_text(encoding="utf-8")
        assert "bonds = [{count = 6, delta_d = 0.13, f_ox = 230.0, f_red = 160.0}]" in text
        b = screen.couple_set["hl-osmium"].bonds[0]
        assert (b.count, b.delta_d, b.f_ox, b.f_red) == (6, 0.13, 230.0, 160.0)
        # opened again, the form shows the same typed form
        await pilot.press("e")
        await pilot.pause()
        assert app.screen.query_one("#f-bonds").value == "6:0.13:230:160"
        # a bad form is marked with what is expected
        await _set_field(pilot, "bonds", "6:0.13:230")
        await settle(pilot)
        assert app.screen.query_one("#f-bonds").has_class("-bad")
        assert "COUNT:DELTA_D:F_OX:F_RED" in str(app.screen.query_one("#m-bonds").content)
