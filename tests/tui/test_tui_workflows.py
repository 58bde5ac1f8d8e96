"""Workbench workflows driven by real keys: search, pairing, conditions, units, swap, map, help, palette."""

import math

import pytest
from tui_fixtures import ready_workbench as _ready
from tui_fixtures import run_async, settle, small_couples
from tui_screen_text import screen_text

from crossrate.library.couple_set import CoupleSet
from crossrate.services.conditions import Conditions
from crossrate.services.prediction import predict
from crossrate.tui.app import CrossrateApp
from crossrate.tui.commands import ACTIONS
from crossrate.tui.screens.workbench import WorkbenchScreen
from crossrate.tui.widgets.couple_table import CoupleTable
from crossrate.tui.widgets.heat_map import HeatMap
from crossrate.tui.widgets.prediction_panel import PredictionPanel


def _app(cs=None):
    return CrossrateApp(couple_set=cs or CoupleSet(small_couples()))


async def _settle(pilot, screen):
    """Let typed conditions be read and the Monte Carlo worker finish (the panel shows the final interval)."""
    await settle(pilot)


@run_async
async def test_search_narrows_the_table_as_you_type():
    app = _app()
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        table = screen.query_one(CoupleTable)
        assert len(table.shown_ids) == 9
        await pilot.press("slash", *"quin")
        await pilot.pause()
        assert table.shown_ids == ["hl-quinone"]
        # tags are searched too: 'cage' is a tag of hl-cobalt only
        await pilot.press(*["backspace"] * 4, *"cage")
        await pilot.pause()
        assert table.shown_ids == ["hl-cobalt"]
        # medium: one couple in acetonitrile
        await pilot.press(*["backspace"] * 4, *"acetonitrile")
        await pilot.pause()
        assert table.shown_ids == ["hl-ferrocene-mecn"]
        assert "hl-ferrocene-mecn" in screen_text(app)
        await pilot.press(*["backspace"] * 12)
        await pilot.pause()
        assert len(table.shown_ids) == 9


@run_async
async def test_sort_keys_reorder_the_table():
    app = _app()
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        table = screen.query_one(CoupleTable)
        set_order = table.shown_ids
        await pilot.press("s")  # by id
        assert table.shown_ids == sorted(set_order)
        await pilot.press("s", "s", "s")  # name, charges, E on the common scale
        E = [screen.couple_set.E_on_root(screen.couple_set[i])[0] for i in table.shown_ids]
        assert E == sorted(E)
        await pilot.press("S")
        E = [screen.couple_set.E_on_root(screen.couple_set[i])[0] for i in table.shown_ids]
        assert E == sorted(E, reverse=True)
        assert "E▼" in screen_text(app)  # the sorted column is marked in the header


@pytest.mark.parametrize("width", [80, 120])
@run_async
async def test_every_sortable_column_shows_its_arrow(width):
    from crossrate.tui.widgets.couple_rows import COLUMNS

    app = _app()
    async with app.run_test(size=(width, 24)) as pilot:
        screen = await _ready(pilot)
        table = screen.query_one(CoupleTable)
        head = screen_text(app).splitlines()
        # the header: names, then units (E on the set's common scale, the rate constant in M⁻¹ s⁻¹)
        assert any("log k_self" in ln for ln in head) and any("V vs SHE" in ln and "M⁻¹ s⁻¹" in ln for ln in head)
        seen = set()
        for _ in range(len(COLUMNS) + 1):
            col = table.sort.column
            arrow = f"{COLUMNS[col].title}▲"
            assert arrow in screen_text(app), arrow
            seen.add(col)
            await pilot.press("S")
            await pilot.pause()
            assert f"{COLUMNS[col].title}▼" in screen_text(app)
            await pilot.press("s")
            await pilot.pause()
        # every column takes its turn, except the layer's below 100 columns, where it is not shown
        assert len(seen) == len(COLUMNS) - (1 if width < 100 else 0)


@run_async
async def test_pairing_keys_give_the_service_prediction_and_swap():
    cs = CoupleSet(small_couples())
    app = _app(cs)
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        # hl-osmium is row 0, hl-vanadium row 5 (set order)
        await pilot.press("o", *["down"] * 5, "r")
        await _settle(pilot, screen)
        assert (screen.oxidant, screen.reductant) == ("hl-osmium", "hl-vanadium")
        expected = predict(cs, "hl-osmium", "hl-vanadium", Conditions(), samples=0)
        assert screen.prediction.log10_k_obs == pytest.approx(expected.log10_k_obs, rel=0, abs=1e-12)
        assert screen.prediction.dG_act_kJ_per_mol == pytest.approx(expected.dG_act_kJ_per_mol, abs=1e-12)
        # the Monte Carlo interval arrives from the worker and brackets the point value
        lo, hi = screen.prediction.log10_k_obs_95
        assert lo < expected.log10_k_obs < hi
        text = screen_text(app)
        assert "oxidant hl-osmium" in text and "reductant hl-vanadium" in text
        assert f"{10 ** expected.log10_k_obs:.2e}" in text
        await pilot.press("x")
        await _settle(pilot, screen)
        swapped = predict(cs, "hl-vanadium", "hl-osmium", Conditions(), samples=0)
        assert screen.prediction.oxidant == "hl-vanadium"
        assert screen.prediction.log10_k_obs == pytest.approx(swapped.log10_k_obs, abs=1e-12)
        # the pair stays visible in every view
        for key in "23456":
            await pilot.press(key)
            await pilot.pause()
            assert "oxidant hl-vanadium" in screen_text(app)


@run_async
async def test_bad_condition_keeps_last_good_prediction_and_explains():
    cs = CoupleSet(small_couples())
    app = _app(cs)
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("o", "down", "r", "2", "tab")
        assert app.focused.id == "cond-T"
        await pilot.press(*["backspace"] * 6, *"310")
        await _settle(pilot, screen)
        good = predict(cs, "hl-osmium", "hl-iron", Conditions(temperature_K=310.0), samples=0)
        assert screen.prediction.log10_k_obs == pytest.approx(good.log10_k_obs, abs=1e-12)
        await pilot.press("backspace", "backspace", "backspace", *"9999")
        await _settle(pilot, screen)
        assert screen.prediction.log10_k_obs == pytest.approx(good.log10_k_obs, abs=1e-12)
        assert screen.prediction.conditions.temperature_K == 310.0
        message = str(screen.query_one("#cond-message").content)
        assert message.startswith("! temperature 9999") and "from 200 to 400 K" in message
        assert message.endswith("the last good prediction is kept")
        assert f"k_obs {10 ** good.log10_k_obs:.2e}" in screen_text(app)  # pair bar keeps the good value
        assert screen.query_one("#cond-T").has_class("-bad")
        await pilot.press(*["backspace"] * 4, *"abc")
        await _settle(pilot, screen)
        assert "'abc' is not a number" in str(screen.query_one("#cond-message").content)
        # Z accepts exponent notation; a non-positive Z is refused with its own message
        await pilot.press("tab", "tab", "tab")
        assert app.focused.id == "cond-Z"


@run_async
async def test_units_switch_between_kj_kcal_and_ev():
    cs = CoupleSet(small_couples())
    app = _app(cs)
    async with app.run_test(size=(120, 40)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("o", "down", "r", "2")
        await _settle(pilot, screen)
        dG = screen.prediction.dG0_kJ_per_mol
        assert f"{dG:+.1f} kJ/mol" in screen_text(app)
        await pilot.press("u")
        await pilot.pause()
        # 1 kcal = 4.184 kJ exactly (thermochemical calorie, NIST SP 811)
        assert f"{dG / 4.184:+.1f} kcal/mol" in screen_text(app)
        await pilot.press("u")
        await pilot.pause()
        # 1 eV per molecule = e N_A J/mol = 96.485 kJ/mol (CODATA, scipy.constants)
        assert f"{dG / 96.48533212331002:+.3f} eV" in screen_text(app)


@run_async
async def test_mixed_media_pair_is_refused_with_a_message():
    app = _app()
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("o", "end", "r")
        await pilot.pause()
        assert screen.problem.startswith("couples measured in different media")
        assert "! couples measured in different media" in screen_text(app)
        # no good prediction yet: the panel of view 2 gives the reason (not "No pair yet")
        await pilot.press("2")
        assert str(screen.query_one("#prediction").content).startswith("! couples measured in different media")


@run_async
async def test_heat_map_cell_sets_the_pair():
    cs = CoupleSet(small_couples())
    app = _app(cs)
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("6")
        await _settle(pilot, screen)
        heat = screen.query_one(HeatMap)
        assert app.focused is heat
        await pilot.press("down", "down", "right", "enter")
        await _settle(pilot, screen)
        # rows are oxidants, columns reductants, in the order of the (water-only) table
        assert (screen.oxidant, screen.reductant) == ("hl-cobalt", "hl-iron")
        expected = predict(cs, "hl-cobalt", "hl-iron", Conditions(), samples=0)
        assert screen.prediction.log10_k_obs == pytest.approx(expected.log10_k_obs, abs=1e-9)
        text = screen_text(app)
        assert "hl-cobalt + hl-iron: k_obs 10^" in text
        # the mouse: a click moves the cursor, a second click on the same cell sets the pair
        from crossrate.tui.widgets.heat_map import CELL, LABEL

        where = (LABEL + 3 * CELL + 1, 1 + 4)  # column 3 (hl-ruthenium), row 4 (hl-cyano) under one header row
        await pilot.click(HeatMap, offset=where)
        await pilot.pause()
        assert heat.cell == ("hl-cyano", "hl-ruthenium") and screen.oxidant == "hl-cobalt"
        await pilot.click(HeatMap, offset=where)
        await _settle(pilot, screen)
        assert (screen.oxidant, screen.reductant) == ("hl-cyano", "hl-ruthenium")


@run_async
async def test_measured_check_and_curve_mark():
    cs = CoupleSet(small_couples())
    app = _app(cs)
    async with app.run_test(size=(100, 30)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("o", "down", "r", "5", "tab")
        await _settle(pilot, screen)
        k = 10 ** (screen.prediction.log10_k_obs + 2.0)  # 100x faster than predicted
        await pilot.press(*f"{k:.4e}")
        await _settle(pilot, screen)
        text = screen_text(app)
        assert "beyond" in text or "more than a factor of 10" in text
        assert "log10 +2.00" in text
        await pilot.press("escape", "3")
        await pilot.pause()
        assert "x measured" in screen_text(app)
        await pilot.press("x")  # another pair: the measured value belonged to the old one
        await _settle(pilot, screen)
        assert screen.measured is None and "x measured" not in screen_text(app)
        assert screen.query_one("#check-k").value == ""


@run_async
async def test_help_has_caution_and_palette_lists_every_action():
    app = _app()
    async with app.run_test(size=(80, 24)) as pilot:
        await _ready(pilot)
        await pilot.press("question_mark")
        await pilot.pause()
        help_screen = app.screen
        static = help_screen.query_one("#help-text")
        from io import StringIO

        from rich.console import Console

        con = Console(width=200, file=StringIO(), record=True)
        con.print(static.content)
        text = " ".join(con.export_text().split())
        assert "predictions are estimates, not a safety assessment" in text.lower()
        assert "local regulations when handling strong oxidants and reductants" in text
        assert "Marcus cross relation" in text and "Marcus parabolic free-energy surfaces" in text
        await pilot.press("escape")
        await pilot.pause()
        commands = {c.title: c for c in app.get_system_commands(app.screen)}
        assert {title for title, _h, _a, _k in ACTIONS} <= set(commands)
        # the palette runs the action: pick "Show rate map" through the palette's own keys
        await pilot.press("ctrl+p", *"show rate map")
        await pilot.pause(0.3)
        await pilot.press("enter")
        await pilot.pause(0.2)
        assert isinstance(app.screen, WorkbenchScreen) and app.screen.view == "map"


def test_rate_text_is_finite_for_the_prediction_range():
    from crossrate.tui.units import power_of_ten, rate_text

    assert rate_text(5.0) == "1.00e+05"
    assert rate_text(math.nan) == "-"
    assert power_of_ten(-3) == "10⁻³"


@run_async
async def test_ansi_theme_and_no_color_keep_every_mark(monkeypatch):
    # NO_COLOR (no-color.org): Textual then drops colours; meaning must survive in plain characters.
    monkeypatch.setenv("NO_COLOR", "1")
    app = _app()
    async with app.run_test(size=(80, 24)) as pilot:
        app.theme = "ansi-dark"
        screen = await _ready(pilot)
        await pilot.press("o", "down", "r")
        await _settle(pilot, screen)
        text = screen_text(app)
        assert "[1 couples]" in text  # current view bracketed
        assert " ? hl-iron" in text  # unverified couple marked
        await pilot.press("2")
        await pilot.pause()
        text = screen_text(app)
        assert "[x] diffusion cap" in text and "[ ] allow mixed media" in text
        for key in "3456":
            await pilot.press(key)
            await pilot.pause()
            assert f"[{key} " in screen_text(app)


@run_async
async def test_heat_map_of_thirty_couples_fits_80_columns_and_scrolls():
    from tui_fixtures import many_couples

    app = _app(CoupleSet(many_couples(40)))
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("6")
        await _settle(pilot, screen)
        lines = screen_text(app).splitlines()
        tens = next(line for line in lines if line.strip().startswith("1 1 1"))
        units = next(line for line in lines if line.lstrip().startswith("ox \\ red"))
        # 30 columns (0..29) side by side, two cells each, within 80 characters
        assert units.split("red", 1)[1].split() == [str(j % 10) for j in range(30)]
        assert tens.split()[-1] == "2" and len(units) <= 80
        await pilot.press(*["right"] * 32, "pagedown", "pagedown", "pagedown", "down", "down")
        await pilot.pause()
        heat = screen.query_one(HeatMap)
        assert heat.cell == ("gen-00032", "gen-00032")
        text = screen_text(app)
        assert "gen-00032 + gen-00032" in text
        assert "32 gen-00032" in text and " 0 gen-00000" not in text  # scrolled: the cursor row stays in view


@run_async
async def test_keys_typed_fast_after_slash_land_in_the_filter():
    from textual import events

    app = _app()
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        # all keys queued at once, as a fast typist or a paste over SSH delivers them
        for key, ch in (("slash", "/"), ("c", "c"), ("a", "a"), ("g", "g"), ("e", "e"), ("slash", "/")):
            app.post_message(events.Key(key, ch))
        await pilot.pause(0.2)
        assert screen.query_one("#search").value == "cage/"  # a '/' typed in the filter is text
        assert isinstance(app.screen, WorkbenchScreen)  # the "e" did not open the editor


@run_async
async def test_prediction_view_at_80x24_shows_the_answer_first_and_scrolls():
    cs = CoupleSet(small_couples())
    app = _app(cs)
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("o", *["down"] * 5, "r", "2")
        await _settle(pilot, screen)
        p = screen.prediction
        text = screen_text(app)
        lo, hi = p.log10_k_obs_95
        for shown in (f"k_obs      {10 ** p.log10_k_obs:.2e}", f"95 %       {10 ** lo:.2e} to {10 ** hi:.2e}",
                      f"regime     {p.regime}", "warnings"):
            assert shown in text
        assert app.focused.id == "prediction-scroll"
        box = screen.query_one("#prediction-scroll")
        assert box.max_scroll_y > 0 and box.scroll_y == 0
        await pilot.press("pagedown")
        await pilot.pause(0.3)
        assert box.scroll_y > 0
        assert "k_D" in screen_text(app)  # the last lines are reachable
        await pilot.press("tab")  # into the conditions: PgUp still scrolls the prediction
        assert app.focused.id == "cond-T"
        await pilot.press("pageup")
        await pilot.pause(0.3)
        assert box.scroll_y == 0


@run_async
async def test_bad_condition_is_shown_in_the_pair_bar_and_a_pair_problem_in_the_panel():
    app = _app()
    async with app.run_test(size=(100, 30)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("o", "down", "r", "2", "tab", *["backspace"] * 6)
        await _settle(pilot, screen)
        bar = " ".join(str(screen.query_one("#pair-bar").content).split())
        assert "! temperature: empty; expected a number (K); k_obs above is for the last good conditions" in bar
        await pilot.press(*"300")
        await _settle(pilot, screen)
        assert "last good" not in str(screen.query_one("#pair-bar").content)
        # a pair the services refuse: the panel says why and labels the last good prediction it keeps
        await pilot.press("escape", "1", "end", "r", "2")
        await pilot.pause()
        panel = str(screen.query_one("#prediction").content)
        assert "\n! couples measured in different media" in panel
        assert "showing the last good prediction (hl-osmium + hl-iron)" in panel


@run_async
async def test_mouse_pairing_click_a_row_then_the_footer_keys():
    from textual.widgets._footer import FooterKey

    app = _app()
    async with app.run_test(size=(100, 30)) as pilot:
        screen = await _ready(pilot)
        await pilot.click(CoupleTable, offset=(5, 4))  # two header rows (names, units), then the third couple
        await pilot.pause()
        assert screen.query_one(CoupleTable).current_id == "hl-cobalt"
        await pilot.click(next(k for k in screen.query(FooterKey) if k.key == "o"))
        await pilot.click(CoupleTable, offset=(5, 3))
        await pilot.pause()
        await pilot.click(next(k for k in screen.query(FooterKey) if k.key == "r"))
        await _settle(pilot, screen)
        assert (screen.oxidant, screen.reductant) == ("hl-cobalt", "hl-iron")


def test_every_key_is_in_the_help_and_every_action_in_the_palette():
    from crossrate.tui.screens.help_screen import help_table
    from crossrate.tui.widgets.heat_map import HeatMap

    con_text = []
    from io import StringIO

    from rich.console import Console

    con = Console(width=200, file=StringIO(), record=True)
    con.print(help_table())
    con_text = con.export_text()
    actions = {a.split("(")[0] for _t, _h, a, _k in ACTIONS}
    # navigation keys are described together in the help ("↑ ↓ PgUp PgDn", "Home End", "tab / esc")
    navigation = {"move", "page", "jump", "leave_input", "move_focus", "scroll_result", "choose"}
    for cls in (WorkbenchScreen, CoupleTable, HeatMap):
        for b in cls.BINDINGS:
            name = b.action.split("(")[0]
            assert name in actions or name in navigation or name in {"cycle_sort", "reverse_sort"}, b
    for _title, _help, action, key in ACTIONS:
        assert hasattr(WorkbenchScreen, "action_" + action.split("(")[0]), action
        assert key.split(" ")[0] in con_text
    for words in ("PgUp", "Home End", "ctrl+p", "ctrl+q", "tab / esc", "enter"):
        assert words in con_text


@run_async
async def test_model_toggle_gives_the_semiclassical_prediction_and_both_curves():
    cs = CoupleSet(small_couples())
    app = _app(cs)
    async with app.run_test(size=(100, 30)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("o", *["down"] * 5, "r", "2", "tab")
        for _ in range(10):
            if app.focused.id == "cond-model":
                break
            await pilot.press("tab")
        assert app.focused.id == "cond-model"
        await pilot.press("space")
        await _settle(pilot, screen)
        want = predict(cs, "hl-osmium", "hl-vanadium", Conditions(rate_model="semiclassical"), samples=0)
        assert screen.prediction.rate_model == "semiclassical"
        assert screen.prediction.log10_k_obs == pytest.approx(want.log10_k_obs, abs=1e-12)
        panel = str(screen.query_one(PredictionPanel).content)  # the panel scrolls: read all of it
        assert "quantum factor" in panel and "λ12 split" in panel
        await pilot.press("escape", "3")
        await pilot.pause()
        text = screen_text(app)
        assert "semiclassical" in text and "classical" in text and "inverted past it" in text
        await pilot.press("6")  # the map takes the same model and says so
        heat = screen.query_one(HeatMap)
        for _ in range(200):
            await pilot.pause(0.02)
            if heat._values is not None:
                break
        assert "; semiclassical model" in heat._note  # the note line ends the legend
        m = screen.map_result
        assert m.rate_model == "semiclassical"
        i, j = m.ids.index("hl-osmium"), m.ids.index("hl-vanadium")
        # ln Q within 1e-5 of the per-pair sum (level_sum) and ln k_D within 2e-5 (screened table), in log10
        assert m.log10_k_obs[i, j] == pytest.approx(want.log10_k_obs, abs=3e-5 / 2.302585)
