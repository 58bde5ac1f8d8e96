"""The electrode view (key 7): k0 of the highlighted couple with its interval, k(eta) and Delta Ep against
scan rate, all from crossrate.services.electrode_view."""

import pytest
from tui_fixtures import ready_workbench as _ready
from tui_fixtures import run_async, small_couples
from tui_screen_text import screen_text

from crossrate.library.couple_set import CoupleSet
from crossrate.services.conditions import Conditions
from crossrate.services.electrode_rate import predict_k0
from crossrate.tui.app import CrossrateApp
from crossrate.tui.widgets.electrode_panel import ElectrodePanel


async def _settle(pilot):
    while any(not w.is_finished for w in pilot.app.workers):
        await pilot.pause(0.01)
    await pilot.pause()


@run_async
async def test_electrode_view_follows_the_highlighted_couple():
    cs = CoupleSet(small_couples())
    app = CrossrateApp(couple_set=cs)
    async with app.run_test(size=(100, 40)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("down", "down", "down")  # hl-ruthenium (row 3)
        await pilot.press("7")
        await _settle(pilot)
        panel = screen.query_one(ElectrodePanel)
        expected = predict_k0(cs, "hl-ruthenium", Conditions())
        assert panel.view.couple == "hl-ruthenium"
        assert panel.view.rate.log10_k0 == pytest.approx(expected.log10_k0, abs=1e-12)
        text = screen_text(app)
        assert "k0 of hl-ruthenium" in text
        assert f"{expected.k0_cm_s:.3g} cm/s" in text and "95 %" in text
        assert "ΔEp / mV" in text and "Matsuda-Ayabe" in text and "not a safety assessment" in text
        # Delta Ep grows with scan rate (slower electron transfer relative to the scan).
        seps = [t.dEp_mV for t in panel.view.series.traces]
        assert seps == sorted(seps)
        # Back to the couples, another couple, back to the view: it follows.
        await pilot.press("1", "down", "7")
        await _settle(pilot)
        assert panel.view.couple == "hl-cyano"
        assert "k0 of hl-cyano" in screen_text(app)


@run_async
async def test_electrode_view_palette_entry_and_a_couple_without_rate_data():
    from crossrate.library.couple import Couple

    bare = Couple(id="hl-bare", name="Halden couple without rate data", charge_ox=1, charge_red=0, E=0.2,
                  E_scale="SHE", radius=4.0, medium="water", ionic_strength=0.1, temperature=298.15,
                  source="invented for the tests")
    app = CrossrateApp(couple_set=CoupleSet([bare, *small_couples()]))
    async with app.run_test(size=(100, 40)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("7")
        await _settle(pilot)
        assert screen.view == "electrode"
        assert "hl-bare" in screen_text(app) and "no k_self" in screen_text(app)
