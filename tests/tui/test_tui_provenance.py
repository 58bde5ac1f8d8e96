"""The workbench marks invented couples ('!' and the word) apart from unverified ones ('?'), in the table,
the detail and the pair bar, and says in words when no couple is loaded."""

from tui_fixtures import _c, run_async, small_couples
from tui_fixtures import ready_workbench as _ready
from tui_screen_text import screen_text

from crossrate.library.couple_set import CoupleSet
from crossrate.tui.app import CrossrateApp


def _set():
    invented = _c("hl-made-up", "Halden made-up mediator", 3, 2, 0.50, 1.0e4, 4.0, verified=False, invented=True,
                  line=111)
    return CoupleSet([invented, *small_couples()])


@run_async
async def test_invented_couple_marked_in_table_detail_and_pair_bar():
    app = CrossrateApp(couple_set=_set())
    async with app.run_test(size=(120, 40)) as pilot:
        screen = await _ready(pilot)
        await pilot.pause(0.1)  # the detail of the highlighted couple follows the table
        text = screen_text(app)
        rows = {ln.split()[1]: ln.split()[0] for ln in text.splitlines()
                if len(ln.split()) > 2 and ln.split()[0] in "!?" and ln.split()[1].startswith("hl-")}
        assert rows["hl-made-up"] == "!"  # its own mark in the first column
        assert rows["hl-iron"] == "?"  # the unverified one keeps '?'
        assert "! invented: made-up values (demo, teaching)" in text  # the detail of the highlighted (first) couple
        await pilot.press("o", "down", "down", "r")  # hl-made-up + hl-iron (small_couples' row 1)
        while any(not w.is_finished for w in app.workers):
            await pilot.pause(0.02)
        assert (screen.oxidant, screen.reductant) == ("hl-made-up", "hl-iron")
        text = screen_text(app)
        assert "oxidant hl-made-up (! invented)" in text and "reductant hl-iron (? unverified)" in text
        assert screen.prediction.oxidant_provenance == "invented"


@run_async
async def test_empty_set_said_in_words(tmp_path, monkeypatch):
    monkeypatch.setenv("HOME", str(tmp_path))
    monkeypatch.setenv("XDG_CONFIG_HOME", str(tmp_path / "config"))
    for name in ("CROSSRATE_GROUP_LIBRARY", "CROSSRATE_PERSONAL_LIBRARY"):
        monkeypatch.delenv(name, raising=False)
    app = CrossrateApp(layers={"bundled": False})
    async with app.run_test(size=(100, 30)) as pilot:
        await _ready(pilot)
        await pilot.pause(0.1)
        text = " ".join(screen_text(app).split())
        assert "no couples loaded: searched the personal layer" in text
        assert "crossrate library new FILE" in text and "--demo" in text
