"""The workbench screen: pair bar, view tabs and the seven views; it wires user actions to the services.

Only the couples view is composed with the screen; the others are built on first visit (workbench_views.py).
"""

from textual import on, work
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical, VerticalScroll
from textual.screen import Screen
from textual.widgets import ContentSwitcher, Input, Static

from ...errors import CrossrateError
from ..widgets.couple_detail import CoupleDetail
from ..widgets.couple_table import CoupleTable
from ..widgets.field_input import FieldInput
from ..widgets.pair_bar import PairBar
from ..widgets.quiet_footer import QuietFooter
from ..widgets.view_tabs import VIEWS, ViewTabs
from .workbench_editing import WorkbenchEditing
from .workbench_electrode import WorkbenchElectrode
from .workbench_logic import WorkbenchLogic
from .workbench_map import WorkbenchMap
from .workbench_results import WorkbenchResults
from .workbench_series import WorkbenchSeries
from .workbench_views import WorkbenchViews

#: Below this terminal width the couple detail goes under the table instead of beside it, columns.
NARROW_BELOW = 130


class WorkbenchScreen(
    WorkbenchLogic, WorkbenchViews, WorkbenchMap, WorkbenchEditing, WorkbenchResults, WorkbenchSeries,
    WorkbenchElectrode, Screen
):
    """Main screen. The state and the calls to services live in WorkbenchLogic, library edits in
    WorkbenchEditing, saving and copying results in WorkbenchResults."""

    CSS_PATH = ["workbench.tcss", "../widgets/series_view.tcss"]
    BINDINGS = [
        *(Binding(key, f"view('{vid}')", title, show=False) for vid, key, title in VIEWS),
        Binding("o", "set_oxidant", "oxidant"),
        Binding("r", "set_reductant", "reductant"),
        Binding("x", "swap", "swap"),
        # A priority binding runs before the next key is passed on, so "/cage" typed fast lands in the filter.
        Binding("slash", "search", "search", priority=True),
        Binding("u", "cycle_unit", "units", show=False),
        Binding("e", "edit", "edit"),
        Binding("a", "add", "add", show=False),
        Binding("d", "duplicate", "duplicate", show=False),
        Binding("delete", "delete", "delete", show=False),
        Binding("ctrl+r", "reload", "reload", show=False),
        Binding("p", "problems", "library problems", show=False),
        Binding("w", "save_result", "save", show=False),
        Binding("c", "copy_result", "copy", show=False),
        Binding("question_mark,f1", "help", "help"),
        # esc, tab and shift+tab move the focus: as priority bindings they act before the next key is handed to
        # a field, so text typed right after them lands where the user now is (see widgets/field_input.py).
        Binding("escape", "leave_input", show=False, priority=True),
        Binding("tab", "move_focus(1)", show=False, priority=True),
        Binding("shift+tab", "move_focus(-1)", show=False, priority=True),
        Binding("enter", "toggle_detail", "detail", show=False),
        Binding("pageup", "scroll_result(-1)", show=False),
        Binding("pagedown", "scroll_result(1)", show=False),
    ]

    def compose(self) -> ComposeResult:
        yield PairBar(id="pair-bar")
        yield ViewTabs(id="view-tabs")
        with ContentSwitcher(initial="couples", id="views"):
            with Vertical(id="couples"):
                yield FieldInput(placeholder="filter: id, name, tag or medium   (/ to search, esc to leave)", id="search", compact=True)
                with Horizontal(id="couples-body"):
                    yield CoupleTable(id="table")
                    with VerticalScroll(id="detail-scroll"):
                        yield CoupleDetail("Loading the library...", id="detail", markup=False)
        yield Static("", id="status", markup=False)
        yield QuietFooter()

    def on_mount(self) -> None:
        self.query_one(ViewTabs).show("couples", self.unit)
        self.query_one(PairBar).show(None, None, None)
        self.set_focus(self.query_one(CoupleTable))
        # The loader starts at once, in a thread beside the first layout and paint (it reads and validates the
        # files, or takes them from the load cache, without numpy). A --library file that does not exist yet
        # is offered to be created first (new_library_screen.py), after the first frame.
        from .new_library_screen import missing_files, offer_missing_files

        if missing_files(self.app.library_paths):
            self.call_after_refresh(lambda: offer_missing_files(self, self.start_loading))
        else:
            self.start_loading()

    def on_resize(self, event) -> None:
        self.set_class(event.size.width < NARROW_BELOW, "-narrow")

    # -- workers ----------------------------------------------------------------------------------------
    @work(thread=True, exclusive=True, group="load")
    def start_loading(self) -> None:
        cs, problem = self.app.load_couple_set()
        self.app.call_from_thread(self.library_loaded, cs, problem)

    @work(thread=True, group="services")
    def run_import_services(self, cs, problem: str) -> None:
        from ..library_access import import_services

        import_services()
        self.app.call_from_thread(self.finish_loading, cs, problem)

    @work(thread=True, exclusive=True, group="mc")
    def run_interval(self, key, ox: str, red: str, cond) -> None:
        p = self.service_predict(ox, red, cond, samples=20000)
        self.app.call_from_thread(self.interval_ready, key, p)

    @work(thread=True, exclusive=True, group="series")
    def run_series(self, path: str, cond) -> None:
        from ..library_access import check_series

        try:
            report, problem = check_series(self.couple_set, path, cond), ""
        except CrossrateError as exc:
            report, problem = None, str(exc)
        self.app.call_from_thread(self.series_ready, path, report, problem)

    @work(thread=True, exclusive=True, group="map")
    def run_map(self, ids, cond, note: str) -> None:
        result, problem = self.service_map(ids, cond)
        self.app.call_from_thread(self.map_ready, ids, result, problem or note)

    # -- events -----------------------------------------------------------------------------------------
    @on(Input.Changed, "#search")
    def _search_changed(self, event: Input.Changed) -> None:
        self.apply_filter(event.value)

    @on(Input.Submitted, "#search")
    def _search_done(self) -> None:
        self.set_focus(self.query_one(CoupleTable))

    @on(CoupleTable.Highlighted)
    def _highlighted(self, event: CoupleTable.Highlighted) -> None:
        self.show_detail(event.couple_id)
        if self.view == "electrode":
            self.refresh_electrode()

    # The handlers below are named after their messages (Textual's on_<widget>_<message>), so this module
    # need not import the widgets of views built on first visit.
    def on_conditions_form_changed(self, event) -> None:
        self.conditions = event.conditions
        self.cond_problem = ""
        self.show_detail(self._current())  # the λ breakdown is at the current conditions
        self.recompute()
        if self.view == "map":
            self.refresh_map()

    def on_conditions_form_invalid(self, event) -> None:
        self.cond_problem = event.problem
        self.refresh_results()

    def on_check_panel_entered(self, event) -> None:
        self.measured = (event.k, event.log10_sd) if event.k is not None else None
        self.refresh_check()
        self.refresh_curves()

    def on_check_panel_series_requested(self, event) -> None:
        self.load_series(event.path)

    def on_series_table_chosen(self, event) -> None:
        r = event.row
        self.set_pair(r.oxidant, r.reductant)
        where = f"line {r.line}" if r.line is not None else "the series"
        self.status(f"pair from {where}: {r.oxidant} + {r.reductant} (measured {r.k_measured:.3g} M⁻¹ s⁻¹; "
                    "that row's own T, I and medium are in the file)")

    def on_heat_map_chosen(self, event) -> None:
        self.set_pair(event.oxidant, event.reductant)
