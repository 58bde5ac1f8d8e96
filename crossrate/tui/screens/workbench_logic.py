"""State and behaviour of the workbench screen: the pair, the conditions, and every call to a service.

Services are imported inside the methods so the first paint does not wait for numpy and scipy.
"""

import time

from textual.widgets import ContentSwitcher, Input, OptionList, Static

from ...errors import CrossrateError
from ..units import next_unit
from ..widgets.couple_detail import CoupleDetail
from ..widgets.couple_rows import build_rows, e_unit, filter_rows
from ..widgets.couple_table import CoupleTable
from ..widgets.pair_bar import PairBar
from ..widgets.view_tabs import ViewTabs

#: The services phrase some fixes as command-line options; here they are fields of view 2.
CLI_HINTS = (
    ("(--medium M --allow-mixed-media)", "(view 2: medium and 'allow mixed media')"),
    ("(--ionic-strength M)", "(view 2: ionic strength)"),
    ("--ionic-strength", "the ionic strength field (view 2)"),
    ("--medium", "the medium field (view 2)"),
)


#: What has the focus when a view is shown (and after esc): the table, the map, or the scrollable result.
VIEW_FOCUS = {"couples": "#table", "predict": "#prediction-scroll", "check": "#check-scroll", "map": "#heat"}

#: The status line on entering a view: how to move in it.
VIEW_HINTS = {
    "predict": "↑↓ PgUp PgDn scroll  tab: into the conditions  esc: out of a field",
    "curve": "a measured k (entered in view 5) is drawn as x  u energy units",
    "energy": "λ, ΔG°' and the barrier read off the dotted guides  u energy units",
    "check": "tab: a measured k, or a CSV of measured rates  esc: out of a field  PgUp PgDn scroll",
    "map": "arrows move  enter (or a second click) sets the pair  / filters the couples",
    "electrode": "the couple highlighted in view 1 (else the oxidant): k0 from k_self, k(η), ΔEp(v)",
}


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
    #: Why the conditions form holds no valid set ("" when it does): the last good conditions stay in use.
    cond_problem = ""
    measured: tuple[float, float | None] | None = None
    view = "couples"
    last_compute_ms: float | None = None
    _pending_key = None

    # -- library ----------------------------------------------------------------------------------------
    def library_loaded(self, cs, problem: str) -> None:
        """The set is read: the table first; what needs numpy and the services (the media list, the detail's
        λ breakdown, the prediction) follows once the rows are on the screen and the services are imported
        (prepare_services, then finish_loading)."""
        self.app.load_problem = problem
        if cs is None:
            self.query_one(CoupleDetail).update(f"! {problem}")
            self.status("the library could not be read: fix the file, then ctrl+r reloads (ctrl+q quits)")
            self.call_after_refresh(self.prepare_services, None, problem)
            return
        self.couple_set = cs
        self.rows = build_rows(cs)
        table = self.query_one(CoupleTable)
        table.set_rows(self.rows, filter_rows(self.rows, self.query_one("#search", Input).value), e_unit(cs))
        if self.oxidant not in cs or self.reductant not in cs:
            self.oxidant = self.oxidant if self.oxidant in cs else None
            self.reductant = self.reductant if self.reductant in cs else None
        shadowed = f", {len(cs.shadowed)} shadowed by a later layer" if cs.shadowed else ""
        self.status(f"{len(cs)} couples from {len(cs.files) or 'the given'} file(s){shadowed}")
        self.call_after_refresh(self.prepare_services, cs, problem)

    def prepare_services(self, cs, problem: str) -> None:
        """finish_loading now if the services are imported, else after a worker thread has imported them (the
        first time: numpy and the services take about 0.1 s, and the keys and the screen keep going meanwhile)."""
        from ..library_access import services_imported

        if services_imported():
            self.finish_loading(cs, problem)
        else:
            self.run_import_services(cs, problem)

    def finish_loading(self, cs, problem: str) -> None:
        from ...services.conditions import Conditions

        if self.conditions is None:
            self.conditions = Conditions()
        if self.view_built("predict"):
            self.show_media()
        if cs is None or cs is not self.couple_set:
            return
        # Every pane that shows a couple shows what the files now hold: the table keeps its cursor (so it
        # announces no new highlight), hence the detail, the prediction and the map are redrawn here.
        self.show_detail(self.query_one(CoupleTable).current_id)
        if not len(cs) and not problem:
            self.query_one(CoupleDetail).update(f"{cs.empty_reason()}; start a file with `crossrate library new "
                                                "FILE` and open it with --library FILE, or run with --demo for "
                                                "the invented demo couples")
            self.status(cs.empty_reason())
        self.recompute()
        if self.view == "map":
            self.refresh_map()
        if problem:
            left_out = len({ln.split(":", 1)[0] for ln in problem.splitlines() if ln})
            self.status(f"! {left_out} library file(s) left out, see p; {len(cs)} couples from the others")
            if not len(cs):
                self.query_one(CoupleDetail).update(f"! {problem}")
            self.action_problems()

    def show_media(self) -> None:
        """The media of the solvent table as the choices of the conditions form (view 2)."""
        from ...core.solvents import solvent_table

        self.query_one("#conditions").set_media(sorted(solvent_table()))

    def status(self, text: str) -> None:
        self.query_one("#status", Static).update(text)
        if self.view == "couples":
            self._couples_status = text  # shown again on coming back to the couples view

    _couples_status = ""

    def apply_filter(self, query: str) -> None:
        if self.rows:
            self.query_one(CoupleTable).show_indices(filter_rows(self.rows, query))
            if self.view == "map":
                self.refresh_map()

    def show_detail(self, couple_id: str | None) -> None:
        cs = self.couple_set
        c = cs[couple_id] if cs is not None and couple_id in cs else None
        # The λ breakdown needs numpy and the services: until finish_loading (after the rows are painted)
        # has set the conditions, the detail shows the record alone, and finish_loading shows it again.
        ready = c is not None and self.conditions is not None
        lines = self.app.lambda_lines(cs, c, self.conditions, self.unit) if ready else None
        self.query_one(CoupleDetail).show(cs, c, lines)

    # -- pair -------------------------------------------------------------------------------------------
    def _current(self) -> str | None:
        return self.query_one(CoupleTable).current_id

    def set_pair(self, ox: str | None, red: str | None) -> None:
        if (ox, red) != (self.oxidant, self.reductant) and self.measured is not None:
            # A measured rate belongs to its pair: a new pair starts without one.
            self.measured = None
            self.view_part("check").clear()  # a measured k is entered in view 5: it is built
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

    async def action_view(self, vid: str) -> None:
        await self.ensure_view(vid)
        self.view = vid
        self.query_one(ContentSwitcher).current = vid
        self.query_one(ViewTabs).show(vid, self.unit)
        # Text fields are not focused on entry, so the view keys keep working; tab moves into them. Focus is
        # set at once (not after a refresh), so keys typed ahead already go where the user expects.
        self._focus_view()
        self.status(VIEW_HINTS.get(vid, self._couples_status))
        if vid == "map":
            self.refresh_map()
        if vid == "electrode":
            self.refresh_electrode()

    def _focus_view(self) -> None:
        target = VIEW_FOCUS.get(self.view)
        if self.view == "check" and getattr(self, "series_report", None) is not None:
            target = "#series-table"
        self.set_focus(self.query_one(target) if target else None)

    def action_scroll_result(self, pages: int) -> None:
        """PgUp / PgDn in the prediction and check views scroll the result even from inside a field."""
        target = {"predict": "#prediction-scroll", "check": "#check-scroll"}.get(self.view)
        if target:
            box = self.query_one(target)
            box.scroll_page_down() if pages > 0 else box.scroll_page_up()

    def check_action(self, action: str, parameters) -> bool | None:
        # Inside a text field '/' is text: the search binding is off there (and hidden from the footer).
        if action == "search" and isinstance(self.focused, Input):
            return False
        # An open drop-down list (the medium) handles esc and tab itself.
        if action in ("leave_input", "move_focus") and isinstance(self.focused, OptionList):
            return False
        return True

    async def action_search(self) -> None:
        if self.view != "couples":
            await self.action_view("couples")
        self.set_focus(self.query_one("#search", Input))

    def action_toggle_detail(self) -> None:
        """Give the detail panel most of the couples view (and the focus, to scroll it), or give it back."""
        if self.view != "couples":
            return
        big = not self.has_class("-detail-big")
        self.set_class(big, "-detail-big")
        self.set_focus(self.query_one("#detail-scroll" if big else "#table"))

    def action_move_focus(self, step: int) -> None:
        """tab / shift+tab: the next or previous field."""
        self.focus_next() if step > 0 else self.focus_previous()

    def action_leave_input(self) -> None:
        if self.has_class("-detail-big"):
            self.action_toggle_detail()
            return
        self._focus_view()

    def action_cycle_unit(self) -> None:
        self.unit = next_unit(self.unit)
        self.query_one(ViewTabs).show(self.view, self.unit)
        self.show_detail(self._current())  # its λ lines follow the unit too
        self.refresh_results()

    # -- prediction -------------------------------------------------------------------------------------
    def service_predict(self, ox: str, red: str, cond, samples: int):
        from ...services.prediction import predict

        try:
            # The API's default seed is the CLI's, so a saved result is reproduced by `crossrate predict`.
            return predict(self.couple_set, ox, red, cond, samples=samples)
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
        elif p is None and self.problem:
            note = f"! {self.problem}"
        elif p is None and (self.oxidant or self.reductant):
            note = "Now set the " + ("reductant (r)" if self.oxidant else "oxidant (o)") + " in the couples table (1)."
        if p is not None and self._prediction_is_current() and self.cond_problem:
            note = f"! {self.cond_problem}: shown for the last good conditions"
        current = self._prediction_is_current()
        cs = self.couple_set
        kinds = tuple(cs[c].provenance if cs is not None and c in cs else "" for c in (self.oxidant, self.reductant))
        self.query_one(PairBar).show(self.oxidant, self.reductant, p if current else None, self.problem,
                                     self.cond_problem if current else "", kinds)
        if (panel := self.view_part("predict")) is not None:
            panel.show(p, self.unit, note)
        self.refresh_curves()
        self.refresh_check()

    def refresh_curves(self) -> None:
        if not (self.view_built("curve") or self.view_built("energy")):
            return  # drawn when one of them is opened
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
        if (plot := self.view_part("curve")) is not None:
            plot.show(driving_force_curve(p) if p else None, self.unit, measured, note)
        if (plot := self.view_part("energy")) is not None:
            plot.show(energy_surfaces(p) if p else None, self.unit, note)

    def refresh_check(self) -> None:
        from ..widgets.check_panel import check_text

        panel = self.view_part("check")
        if panel is None:
            return
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

    # -- other screens ----------------------------------------------------------------------------------
    def action_problems(self) -> None:
        """List the problems of the library files that were left out (or say there are none)."""
        from .problems_screen import ProblemsScreen

        if not self.app.load_problem:
            self.status("every library file was read")
            return
        self.app.push_screen(ProblemsScreen(self.app.load_problem, len(self.couple_set or ())))

    def action_help(self) -> None:
        from .help_screen import HelpScreen

        self.app.push_screen(HelpScreen())

    def action_sort_table(self) -> None:
        self.query_one(CoupleTable).action_cycle_sort()

    def action_reverse_sort(self) -> None:
        self.query_one(CoupleTable).action_reverse_sort()
