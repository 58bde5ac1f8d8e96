"""The workbench's views beyond the couples table, built the first time they are opened.

The first frame holds only what it shows (pair bar, view line, couples table and detail, status, footer), so
it is composed, laid out and painted sooner; the widgets of views 2 to 7 (and the modules that define them)
are made when their view is first opened, then filled from the screen's state. Building is serialized: two
view keys pressed in a burst build one view after the other, and the key after them waits for both.
"""

import asyncio

from textual.widget import Widget

#: The widget of each lazily built view that the screen fills: view id -> CSS selector.
VIEW_PARTS = {
    "predict": "#prediction",
    "curve": "#curve",
    "energy": "#energy",
    "check": "#check",
    "map": "#heat",
    "electrode": "#electrode",
}


def build_view(vid: str) -> Widget:
    """The container of view `vid` (one of VIEW_PARTS), not yet mounted; its id is `vid`."""
    from textual.containers import Horizontal, Vertical, VerticalScroll

    if vid == "predict":
        from ..widgets.conditions_form import ConditionsForm
        from ..widgets.prediction_panel import PredictionPanel

        return Horizontal(ConditionsForm(id="conditions"),
                          VerticalScroll(PredictionPanel(id="prediction"), id="prediction-scroll"), id="predict")
    if vid == "curve":
        from ..widgets.rate_curve_plot import RateCurvePlot

        return RateCurvePlot(id="curve")
    if vid == "energy":
        from ..widgets.energy_plot import EnergyPlot

        return EnergyPlot(id="energy")
    if vid == "check":
        from ..widgets.check_panel import CheckPanel

        return CheckPanel(id="check")
    if vid == "map":
        from ..widgets.heat_map import HeatMap

        return Vertical(HeatMap(id="heat"), id="map")
    if vid == "electrode":
        from ..widgets.electrode_panel import ElectrodePanel

        return ElectrodePanel(id="electrode")
    raise ValueError(f"no view {vid!r}")


class WorkbenchViews:
    """Mixin of WorkbenchScreen: which views are built, building one on first visit, and reaching a view's
    widget only when its view exists (refreshes of a view not yet built are skipped: it is filled when built)."""

    _built: set | None = None
    _build_lock: asyncio.Lock | None = None

    def view_built(self, vid: str) -> bool:
        return vid == "couples" or (self._built is not None and vid in self._built)

    def view_part(self, vid: str):
        """The widget of view `vid` that the screen fills (VIEW_PARTS), None while the view is not built."""
        return self.query_one(VIEW_PARTS[vid]) if self.view_built(vid) else None

    async def ensure_view(self, vid: str) -> None:
        """Build view `vid` if it is not built yet: mount it (hidden) in the view switcher, then fill it."""
        if self.view_built(vid):
            return
        if self._build_lock is None:
            self._build_lock = asyncio.Lock()
        async with self._build_lock:
            if self.view_built(vid):  # built while this call waited for another
                return
            await self.query_one("#views").add_content(build_view(vid))
            if self._built is None:
                self._built = set()
            self._built.add(vid)
            self.fill_view(vid)

    def fill_view(self, vid: str) -> None:
        """Show the screen's current state in a view that was just built."""
        if vid == "predict" and self.conditions is not None:  # the library is loaded: the media are known
            self.show_media()
        if vid in ("predict", "curve", "energy", "check"):
            self.refresh_results()
