"""At 80x24 no view and no dialog cuts a word: hints wrap or are short, labels keep their distinguishing end.

Every view and dialog is walked with real keys; tests/tui/cut_words.py flags any word on the screen that is
the cut start of a word the app means to show."""

from cut_words import cut_words, screen_vocabulary, words
from test_tui_editing import _app as _file_app
from test_tui_editing import _library
from tui_fixtures import ready_workbench as _ready
from tui_fixtures import run_async, settle, small_couples
from tui_screen_text import screen_text

from crossrate.library.couple_set import CoupleSet
from crossrate.services.curves import driving_force_curve, energy_surfaces
from crossrate.tui.app import CrossrateApp
from crossrate.tui.screens.workbench_logic import VIEW_HINTS
from crossrate.tui.widgets.couple_rows import COLUMNS
from crossrate.tui.widgets.energy_plot import energy_lines
from crossrate.tui.widgets.heat_map import CHOOSE_HINT, CORNER, LEGEND
from crossrate.tui.widgets.rate_curve_plot import curve_lines
from crossrate.tui.widgets.series_view import PLOT_LEGEND, PLOT_TITLE, TABLE_HEAD, VERDICT_MARK

SIZE = (80, 24)


def _extra_vocabulary(screen) -> set[str]:
    """What custom-drawn widgets mean to show: the couples, the column heads, the legends, plots drawn wide."""
    vocab = words(" ".join((*VIEW_HINTS.values(), LEGEND, CORNER, CHOOSE_HINT, PLOT_TITLE, TABLE_HEAD,
                            *PLOT_LEGEND, *(w for w, _mark in VERDICT_MARK.values()))))
    for col in COLUMNS:
        vocab |= words(f"{col.title} {col.unit}")
    vocab |= words(" ".join(screen.query_one("#table").units))
    cs = screen.couple_set
    for c in cs or ():
        vocab |= words(f"{c.id} {c.name} {c.medium} {' '.join(c.tags)} {c.origin.layer if c.origin else ''}")
    p = screen.prediction
    if p is not None:
        vocab |= words(str(curve_lines(driving_force_curve(p), 400, 30, screen.unit, None)))
        vocab |= words(str(curve_lines(driving_force_curve(p), 400, 30, screen.unit, 1.0)))
        vocab |= words(str(energy_lines(energy_surfaces(p), 400, 30, screen.unit)))
    return vocab


class Walk:
    def __init__(self, app, screen):
        self.app, self.workbench, self.problems = app, screen, []

    def look(self, where: str) -> None:
        text = screen_text(self.app)
        vocab = screen_vocabulary(self.app) | _extra_vocabulary(self.workbench)
        lines = text.splitlines()
        assert len(lines) <= SIZE[1] and all(len(ln) <= SIZE[0] for ln in lines)
        self.problems += [f"{where}: {w}" for w in cut_words(text, vocab)]


def test_detector_finds_a_cut_word():
    vocab = words("? help  ^q quit  ^p palette  hl-ferrocene-mecn")
    assert cut_words("? hel▏^p palette", vocab) == ["'hel' (cut from 'help')"]
    assert cut_words("hl-ferrocene-m", vocab) == ["'hl-ferrocene-m' (cut from 'hl-ferrocene-mecn')"]
    assert cut_words("? help ^q quit hl-ferr…ne-mecn", vocab) == []


@run_async
async def test_every_view_and_dialog_at_80x24():
    app = CrossrateApp(couple_set=CoupleSet(small_couples()))
    async with app.run_test(size=SIZE) as pilot:
        screen = await _ready(pilot)
        walk = Walk(app, screen)
        walk.look("couples, nothing set")
        await pilot.press("o", "end", "up", "r")  # a pair, the cursor on the long id hl-ferrocene-mecn below
        await settle(pilot)
        walk.look("couples")
        await pilot.press("end", "enter")
        await settle(pilot)
        walk.look("couple detail enlarged")
        await pilot.press("escape", "home", "down")
        for key, name in (("2", "prediction"), ("pagedown", "prediction scrolled"), ("3", "rate curve"),
                          ("4", "energy"), ("u", "energy in kcal/mol"), ("5", "check")):
            await pilot.press(key)
            await settle(pilot)
            walk.look(name)
        await pilot.press("tab", *"3.5e4")
        await settle(pilot)
        walk.look("check with a measured k")
        await pilot.press("w")
        await settle(pilot)
        walk.look("save dialog")
        await pilot.press("escape", "escape", "3")
        await settle(pilot)
        walk.look("rate curve with a measured k")
        await pilot.press("6")
        await settle(pilot)
        walk.look("map")
        await pilot.press("end", "down", "down")
        await settle(pilot)
        walk.look("map, last rows")
        await pilot.press("question_mark")
        await settle(pilot)
        walk.look("help")
        for k in range(4):
            await pilot.press("pagedown")
            await settle(pilot)
            walk.look(f"help page {k + 2}")
        await pilot.press("escape", "ctrl+p")
        await settle(pilot)
        walk.look("command palette")
        await pilot.press("escape")
        await settle(pilot)
        assert not walk.problems, "\n".join(walk.problems)


@run_async
async def test_series_check_at_80x24(tmp_path):
    csv = tmp_path / "measured.csv"
    csv.write_text("oxidant,reductant,k_measured\nhl-osmium,hl-iron,3.0e6\nhl-ferrocene-mecn,hl-ferrocene-mecn,5e6\n"
                   "hl-ruthenium,hl-cobalt,2.0e2\n", encoding="utf-8")
    app = CrossrateApp(couple_set=CoupleSet(small_couples()))
    async with app.run_test(size=SIZE) as pilot:
        screen = await _ready(pilot)
        walk = Walk(app, screen)
        await pilot.press("5", "tab", "tab", "tab", *str(csv), "enter")
        await settle(pilot)
        assert screen.series_report is not None
        walk.look("series check")
        await pilot.press("down", "enter")
        await settle(pilot)
        walk.look("series check, a row set as the pair")
        assert not walk.problems, "\n".join(walk.problems)


@run_async
async def test_editor_and_its_dialogs_at_80x24(tmp_path):
    path = _library(tmp_path)
    app = _file_app(path)
    async with app.run_test(size=SIZE) as pilot:
        screen = await _ready(pilot)
        walk = Walk(app, screen)
        for mode in ("e", "a"):
            await pilot.press(mode)
            await settle(pilot)
            walk.look(f"editor {mode}")
            for k in range(26):  # every field, its help line under the form
                await pilot.press("tab")
                await settle(pilot)
                walk.look(f"editor {mode}, field {k + 1} ({app.focused.id})")
            await pilot.press("ctrl+s")
            await settle(pilot)
            walk.look(f"editor {mode} after ctrl+s")
            if mode == "e":
                await pilot.press("n")  # the confirm dialog: not now
            await pilot.press("escape")
            await settle(pilot)
            if app.screen is not screen:
                walk.look("discard question")
                await pilot.press("y")
                await settle(pilot)
        await pilot.press("delete")
        await settle(pilot)
        walk.look("delete question")
        await pilot.press("n")
        assert not walk.problems, "\n".join(walk.problems)
