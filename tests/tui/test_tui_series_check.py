"""A whole measured series in the check view: a CSV of measured rates (the format of `crossrate check`) is
checked row by row, every row shown with its verdict and plotted against the 1:1 line; a row becomes the
current pair; a bad file is named with its line; the series is saved as the command line's JSON."""

import io
from contextlib import redirect_stdout

from test_tui_editing import _app as _file_app
from test_tui_editing import _library
from tui_fixtures import ready_workbench as _ready
from tui_fixtures import run_async, settle
from tui_screen_text import screen_text

from crossrate.services.measured_check import check_measured
from crossrate.services.measured_csv import read_measured_csv
from crossrate.tui.library_access import SERIES_SAMPLES
from crossrate.tui.screens.save_screen import SaveScreen
from crossrate.tui.widgets.series_view import SeriesTable

CSV = """\
# invented measurements for the workbench tests (Halden Lake style)
oxidant,reductant,k_measured,k_measured_log10_sd,label
hl-osmium,hl-iron,3.0e6,0.2,fast run
hl-iron,hl-osmium,1.0e-3,,slow run
"""


async def _load(pilot, path) -> None:
    await pilot.press("5", "tab", "tab", "tab")
    assert pilot.app.focused.id == "check-csv"
    await pilot.press(*str(path), "enter")
    await settle(pilot)


@run_async
async def test_series_rows_verdicts_plot_and_a_row_becomes_the_pair(tmp_path):
    lib = _library(tmp_path)
    csv = tmp_path / "measured.csv"
    csv.write_text(CSV, encoding="utf-8")
    app = _file_app(lib)
    async with app.run_test(size=(100, 30)) as pilot:
        screen = await _ready(pilot)
        await _load(pilot, csv)
        expected = check_measured(screen.couple_set, read_measured_csv(csv), screen.conditions,
                                  samples=SERIES_SAMPLES, seed=0)
        report = screen.series_report
        assert [(r.line, r.oxidant, r.reductant, r.verdict) for r in report.rows] == \
            [(r.line, r.oxidant, r.reductant, r.verdict) for r in expected.rows]
        text = screen_text(app)
        for r in expected.rows:
            assert f"{r.oxidant} + {r.reductant}" in text and f"{r.log10_ratio:+.2f}" in text
        assert "k measured (up) against k predicted" in text and "── 1:1" in text and "··· factor of 10" in text
        assert "◉" in text  # the row under the cursor, in the plot
        assert isinstance(app.focused, SeriesTable)
        await pilot.press("down", "enter")
        await settle(pilot)
        assert (screen.oxidant, screen.reductant) == ("hl-iron", "hl-osmium")
        assert "pair from line 4" in str(screen.query_one("#status").content)
        # saved: the same JSON as `crossrate check FILE --format json` with the same draws and seed
        await pilot.press("w")
        await settle(pilot)
        assert isinstance(app.screen, SaveScreen)
        app.screen.query_one("#save-path").value = ""
        await pilot.press(*str(tmp_path / "series.json"), "enter")
        await settle(pilot)
        from crossrate.cli.main import main

        out = io.StringIO()
        with redirect_stdout(out):
            assert main(["check", str(csv), "--no-bundled", "--library", str(lib), "--format", "json",
                         "--samples", str(SERIES_SAMPLES), "--seed", "0"]) == 0
        assert (tmp_path / "series.json").read_text(encoding="utf-8") == out.getvalue()
        # an empty file name goes back to the single measured k
        await pilot.press("5", "tab", "tab", "tab", "ctrl+a")
        screen.query_one("#check-csv").value = ""
        await pilot.press("enter")
        await settle(pilot)
        assert screen.series_report is None and not screen.query_one("#check").has_class("-series")


@run_async
async def test_a_bad_series_file_is_named_with_its_line(tmp_path):
    lib = _library(tmp_path)
    csv = tmp_path / "bad.csv"
    csv.write_text("oxidant,reductant,k_measured\nhl-osmium,hl-iron,-5\n", encoding="utf-8")
    app = _file_app(lib)
    async with app.run_test(size=(100, 30)) as pilot:
        screen = await _ready(pilot)
        await _load(pilot, csv)
        status = str(screen.query_one("#status").content)
        assert status.startswith(f"! {csv}:2") and "k_measured" in status
        assert screen.series_report is None
