"""The measured-rate check: a measured k for the current pair against the prediction and its interval."""

import math

from rich.table import Table
from rich.text import Text
from textual.app import ComposeResult
from textual.containers import Container, Horizontal, Vertical, VerticalScroll
from textual.message import Message
from textual.widgets import Input, Label, Static

from ..units import rate_text
from .conditions_form import DEBOUNCE_S
from .field_input import FieldInput
from .series_view import SeriesPlot, SeriesTable

#: Usual reasons a measured rate departs from the cross relation (shown when the service gives none).
USUAL_CAUSES = (
    "non-adiabatic transfer (weak electronic coupling, kappa_el < 1): slower than predicted",
    "spin change on electron transfer: often much slower than predicted",
    "ion pairing or specific electrolyte effects: work terms off, either way",
    "an inner-sphere path (a bridging ligand): faster than predicted",
    "mismatched conditions (T, ionic strength, medium differ from the couples' data)",
)


class CheckPanel(Vertical):
    """Inputs for k_measured (M^-1 s^-1) and its log10 SD, and the verdict."""

    class SeriesRequested(Message):
        """The user asked to load a measured-rates CSV (path as typed; '' clears the series)."""

        def __init__(self, path: str):
            self.path = path
            super().__init__()

    class Entered(Message):
        def __init__(self, k: float | None, log10_sd: float | None):
            self.k, self.log10_sd = k, log10_sd
            super().__init__()

    def compose(self) -> ComposeResult:
        with Horizontal(id="check-inputs"):
            yield Label("measured k (M⁻¹ s⁻¹) ")
            yield FieldInput("", placeholder="e.g. 3.5e4", id="check-k", compact=True)
            yield Label("  log10 SD ")
            yield FieldInput("", placeholder="optional", id="check-sd", compact=True)
        with Horizontal(id="check-series-inputs"):
            yield Label("measured series (CSV) ")
            yield FieldInput("", placeholder="a file as for crossrate check; enter loads it", id="check-csv",
                             compact=True)
        with VerticalScroll(id="check-scroll"):
            yield Static("", id="check-result", markup=False)
        with Container(id="series"):
            yield SeriesTable(id="series-table")
            yield SeriesPlot(id="series-plot")

    _timer = None

    @property
    def pending(self) -> bool:
        """True while typed text waits for the quiet time before it is read."""
        return self._timer is not None

    def on_input_changed(self, event: Input.Changed) -> None:
        event.stop()
        if event.input.id == "check-csv":
            return
        if self._timer is not None:
            self._timer.stop()
        self._timer = self.set_timer(DEBOUNCE_S, self.flush)

    def on_input_submitted(self, event: Input.Submitted) -> None:
        event.stop()
        if event.input.id == "check-csv":
            self.post_message(self.SeriesRequested(event.value.strip()))
            return
        self.flush()

    def show_series(self, report) -> None:
        """Show every row of a series check (services.measured_check.CheckReport); None goes back to the
        single measured k."""
        self.set_class(report is not None, "-series")
        rows = report.rows if report is not None else ()
        self.query_one(SeriesTable).show(rows)
        self.query_one(SeriesPlot).show(rows, 0)

    def on_series_table_moved(self) -> None:
        table = self.query_one(SeriesTable)
        self.query_one(SeriesPlot).show(table.rows, table.cursor)

    def flush(self) -> None:
        """Read both fields now and announce the measurement (or mark the bad field)."""
        if self._timer is not None:
            self._timer.stop()
            self._timer = None
        out = self.query_one("#check-result", Static)
        k_box, sd_box = self.query_one("#check-k", Input), self.query_one("#check-sd", Input)
        for box in (k_box, sd_box):
            box.remove_class("-bad")
        try:
            k = float(k_box.value) if k_box.value.strip() else None
            if k is not None and not (math.isfinite(k) and k > 0):
                raise ValueError
        except ValueError:
            k_box.add_class("-bad")
            out.update(f"! measured k {k_box.value!r}: expected a positive number in M⁻¹ s⁻¹")
            return
        try:
            sd = float(sd_box.value) if sd_box.value.strip() else None
            if sd is not None and not (math.isfinite(sd) and sd >= 0):
                raise ValueError
        except ValueError:
            sd_box.add_class("-bad")
            out.update(f"! log10 SD {sd_box.value!r}: expected a number >= 0 (log10 units)")
            return
        self.post_message(self.Entered(k, sd))

    def clear(self) -> None:
        """Empty both inputs without announcing a new measurement."""
        if self._timer is not None:
            self._timer.stop()
            self._timer = None
        for wid in ("#check-k", "#check-sd"):
            box = self.query_one(wid, Input)
            with box.prevent(Input.Changed):
                box.value = ""

    def show(self, text) -> None:
        self.query_one("#check-result", Static).update(text)


def check_text(result, k_measured: float) -> Table:
    """The measured-rate check as a two-column table (a services.measured_check.PairCheck)."""
    t = Table.grid(padding=(0, 2))
    t.add_column(style="bold", no_wrap=True)
    t.add_column()
    t.add_row("measured k", f"{rate_text(math.log10(k_measured))} M⁻¹ s⁻¹"
              + ("  (SD not given: default used)" if getattr(result, "measured_sd_defaulted", False) else ""))
    t.add_row("predicted", f"{rate_text(result.log10_k_pred)} M⁻¹ s⁻¹")
    lo, hi = result.combined_95
    t.add_row("combined 95 %", f"{rate_text(lo)} to {rate_text(hi)} M⁻¹ s⁻¹ (prediction and measurement)")
    t.add_row("measured/pred.", f"{rate_text(result.log10_ratio)}  (log10 {result.log10_ratio:+.2f}), {result.position} the interval")
    t.add_row("verdict", Text(result.verdict.replace("_", " "), style="bold"))
    t.add_row("", result.verdict_text)
    if getattr(result, "above_diffusion_limit", False):
        t.add_row("", "the measured rate is above the diffusion limit of the pair: check the data")
    causes = list(result.likely_causes)
    t.add_row("", "")
    t.add_row("worth checking" if causes else "usual reasons", "" if causes else
              "why a measured rate departs from the cross relation:")
    for c in causes or USUAL_CAUSES:
        t.add_row("", f"- {c}")
    return t
