"""State and behaviour of the workbench screen: the pair, the conditions, and every call to a service.

Services are imported inside the methods so the first paint does not wait for numpy and scipy.
"""

import time

from textual.widgets import ContentSwitcher, Input, Static

from ...errors import CrossrateError
from ..units import next_unit
from ..widgets.check_panel import CheckPanel, check_text
from ..widgets.conditions_form import ConditionsForm
from ..widgets.couple_detail import CoupleDetail
from ..widgets.couple_rows import build_rows, filter_rows
from ..widgets.couple_table import CoupleTable
from ..widgets.energy_plot import EnergyPlot
from ..widgets.heat_map import HeatMap
from ..widgets.pair_bar import PairBar
from ..widgets.prediction_panel import PredictionPanel
from ..widgets.rate_curve_plot import RateCurvePlot
from ..widgets.view_tabs import ViewTabs

#: The services phrase some fixes as command-line options; here they are fields of view 2.
CLI_HINTS = (
    ("(--medium M --allow-mixed-media)", "(view 2: medium and 'allow mixed media')"),
    ("(--ionic-strength M)", "(view 2: ionic strength)"),
    ("--ionic-strength", "the ionic strength field (view 2)"),
    ("--medium", "the medium field (view 2)"),
)


def tui_wording(message: str) -> str:
    """A service message with command-line option hints replaced by where to fix it in the workbench."""
    for cli, tui in CLI_HINTS:
        message = message.replace(cli, tui)
    return message


class WorkbenchLogic:
    """Mixed into WorkbenchScreen. Holds: couple_set, rows, oxidant, reductant, conditions, unit,
    prediction (last good one), problem (why the current pair/conditions give none), measured."""

    couple_set = None
    rows: list = []
    oxidant: str | None = None
    reductant: str | None = None
    conditions = None
    unit = "kJ/mol"
    prediction = None
    problem = ""
    measured: tuple[float, float | None] | None = None
    view = "couples"
    last_compute_ms: float | None = None
    _pending_key = None

    # -- library ----------------------------------------------------------------------------------------
    def library_loaded(self, cs, problem: str) -> None:
        from ...core.solvents import solvent_table
        from ...services.conditions import Conditions

        if self.conditions is None:
            self.conditions = Conditions()
        self.query_one(ConditionsForm).set_media(sorted(solvent_table()))
        self.app.load_problem = problem if cs is None else ""
        if cs is None:
            self.query_one(CoupleDetail).update(f"! {problem}")
            self.status("the library could not be read: fix the file, then ctrl+r reloads (ctrl+q quits)")
            return
        self.couple_set = cs
        self.rows = build_rows(cs)
        table = self.query_one(CoupleTable)
        table.set_rows(self.rows, filter_rows(self.rows, self.query_one("#search", Input).value))
        if self.oxidant not in cs or self.reductant not in cs:
            self.oxidant = self.oxidant if self.oxidant in cs else None
            self.reductant = self.reductant if self.reductant in cs else None
        shadowed = f", {len(cs.shadowed)} shadowed by a later layer" if cs.shadowed else ""
        self.status(f"{len(cs)} couples from {len(cs.files) or 'the given'} file(s){shadowed}")
        self.recompute()

    def status(self, text: str) -> None:
        self.query_one("#status", Static).update(text)

    def apply_filter(self, query: str) -> None:
        if self.rows:
            self.query_one(CoupleTable).show_indices(filter_rows(self.rows, query))
            if self.view == "map":
                self.refresh_map()

    def show_detail(self, couple_id: str | None) -> None:
        cs = self.couple_set
        c = cs[couple_id] if cs is not None and couple_id in cs else None
        self.query_one(CoupleDetail).show(cs, c, self.app.lambda_lines(cs, c, self.conditions) if c is not None else None)

    # -- pair -------------------------------------------------------------------------------------------
    def _current(self) -> str | None:
        return self.query_one(CoupleTable).current_id

    def set_pair(self, ox: str | None, red: str | None) -> None:
        if (ox, red) != (self.oxidant, self.reductant) and self.measured is not None:
            # A measured rate belongs to its pair: a new pair starts without one.
            self.measured = None
            self.query_one(CheckPanel).clear()
        self.oxidant, self.reductant = ox, red
        self.recompute()

    def action_set_oxidant(self) -> None:
        if (cid := self._current()) is not None:
            self.set_pair(cid, self.reductant)

    def action_set_reductant(self) -> None:
        if (cid := self._current()) is not None:
            self.set_pair(self.oxidant, cid)

    def action_swap(self) -> None:
        self.set_pair(self.reductant, self.oxidant)

    def action_view(self, vid: str) -> None:
        self.view = vid
        self.query_one(ContentSwitcher).current = vid
        self.query_one(ViewTabs).show(vid, self.unit)
        # Text fields are not focused on entry, so the view keys keep working; tab moves into them.
        focus = {"couples": "#table", "map": "#heat"}.get(vid)
        if focus:
            self.query_one(focus).focus()
        else:
            self.set_focus(None)
        if vid in ("predict", "check"):
            self.status("tab: into the fields; esc: out of a field (then 1-6 switch views)")
        if vid == "map":
            self.refresh_map()

    def action_search(self) -> None:
        self.action_view("couples")
        self.query_one("#search", Input).focus()

    def action_toggle_detail(self) -> None:
        """Give the detail panel most of the couples view (and the focus, to scroll it), or give it back."""
        if self.view != "couples":
            return
        big = not self.has_class("-detail-big")
        self.set_class(big, "-detail-big")
        self.query_one("#detail-scroll" if big else "#table").focus()

    def action_leave_input(self) -> None:
        if self.has_class("-detail-big"):
            self.action_toggle_detail()
            return
        target = {"couples": "#table", "map": "#heat"}.get(self.view)
        if target:
            self.query_one(target).focus()
        else:
            self.set_focus(None)

    def action_cycle_unit(self) -> None:
        self.unit = next_unit(self.unit)
        self.query_one(ViewTabs).show(self.view, self.unit)
        self.refresh_results()

    # -- prediction -------------------------------------------------------------------------------------
    def service_predict(self, ox: str, red: str, cond, samples: int):
        from ...services.prediction import predict

        try:
            return predict(self.couple_set, ox, red, cond, samples=samples, seed=12345)
        except CrossrateError:
            return None

    def recompute(self) -> None:
        """Deterministic prediction now (no Monte Carlo), the interval afterwards in a worker."""
        from ...services.prediction import predict

        cs, ox, red = self.couple_set, self.oxidant, self.reductant
        self.problem = ""
        if cs is not None and ox and red:
            t0 = time.perf_counter()
            try:
                p = predict(cs, ox, red, self.conditions, samples=0)
            except CrossrateError as exc:
                self.problem = tui_wording(str(exc))
            else:
                self.prediction = p
                self._pending_key = (ox, red, self.conditions)
                self.run_interval(self._pending_key, ox, red, self.conditions)
            self.last_compute_ms = (time.perf_counter() - t0) * 1e3
        elif ox or red:
            self.problem = ""
        self.refresh_results()

    def interval_ready(self, key, p) -> None:
        if p is not None and key == self._pending_key:
            self.prediction = p
            self.refresh_results()

    def _prediction_is_current(self) -> bool:
        p = self.prediction
        return p is not None and (p.oxidant, p.reductant) == (self.oxidant, self.reductant) and not self.problem

    def refresh_results(self) -> None:
        p = self.prediction
        note = ""
        if p is not None and not self._prediction_is_current():
            note = f"showing the last good prediction ({p.oxidant} + {p.reductant})"
            if self.problem:
                note = f"! {self.problem}\n{note}"
        self.query_one(PairBar).show(self.oxidant, self.reductant, p if self._prediction_is_current() else None, self.problem)
        self.query_one(PredictionPanel).show(p, self.unit, note)
        self.refresh_curves()
        self.refresh_check()

    def refresh_curves(self) -> None:
        from ...services.curves import driving_force_curve, energy_surfaces

        p = self.prediction
        m = self.measured
        measured = None
        if m is not None:
            import math

            measured = math.log10(m[0])
        note = ""
        if p is not None and not self._prediction_is_current():
            note = f"(last good pair {p.oxidant} + {p.reductant}; the current pair gives no prediction)"
        self.query_one(RateCurvePlot).show(driving_force_curve(p) if p else None, self.unit, measured, note)
        self.query_one(EnergyPlot).show(energy_surfaces(p) if p else None, self.unit, note)

    def refresh_check(self) -> None:
        panel = self.query_one(CheckPanel)
        p = self.prediction
        if self.measured is None:
            panel.show("Enter the rate constant you measured for the current pair under the current conditions.")
            return
        if p is None or not self._prediction_is_current():
            panel.show("Set a pair that can be predicted first (o / r in the couples table).")
            return
        k, sd = self.measured
        try:
            from ..library_access import check_measured

            result = check_measured(self.couple_set, p, k, sd)
        except CrossrateError as exc:
            panel.show(f"! {exc}")
            return
        panel.show(check_text(result, k))

    # -- map --------------------------------------------------------------------------------------------
    def refresh_map(self) -> None:
        cs = self.couple_set
        heat = self.query_one(HeatMap)
        if cs is None:
            return
        ids = self.query_one(CoupleTable).shown_ids
        medium = self.conditions.medium if self.conditions and self.conditions.medium else None
        if medium is None:
            anchor = self.oxidant if self.oxidant in cs else (ids[0] if ids else None)
            medium = cs[anchor].medium if anchor else None
        ids = [i for i in ids if cs[i].medium == medium]
        if not ids:
            heat.message("No couples in view (change the filter in the couples view).")
            return
        heat.message(f"computing the map of {len(ids)} couples...")
        self.run_map(ids, self.conditions, f"{len(ids)} couples in {medium} (the couples view's filter)")

    def service_map(self, ids, cond):
        from ...services.rate_map import rate_map

        try:
            return rate_map(self.couple_set, ids=ids, conditions=cond).log10_k_obs, ""
        except CrossrateError as exc:
            return None, str(exc)

    def map_ready(self, ids, values, note: str) -> None:
        heat = self.query_one(HeatMap)
        if values is None:
            heat.message(f"! {note}")
        else:
            heat.show(ids, values, note)

    # -- other screens ----------------------------------------------------------------------------------
    def action_help(self) -> None:
        from .help_screen import HelpScreen

        self.app.push_screen(HelpScreen())

    def action_sort_table(self) -> None:
        self.query_one(CoupleTable).action_cycle_sort()
