"""The workbench's electrode view: which couple it shows and the worker that fetches its numbers."""

from textual import work


class WorkbenchElectrode:
    """Mixin of WorkbenchScreen: refresh_electrode() shows the highlighted couple (else the oxidant) at the
    current conditions, computed in a worker thread (a few simulated voltammograms take a fraction of a second)."""

    def electrode_couple(self) -> str | None:
        return self._current() or self.oxidant

    def refresh_electrode(self) -> None:
        cid = self.electrode_couple()
        if self.couple_set is None or cid is None:
            self.query_one("#electrode").show(None)
            return
        self.query_one("#electrode").show(None, f"computing k0 and the voltammograms of {cid} ...")
        self.run_electrode(cid, self.conditions)

    @work(thread=True, exclusive=True, group="electrode")
    def run_electrode(self, cid: str, cond) -> None:
        from ...services.electrode_view import electrode_view

        view = electrode_view(self.couple_set, cid, cond)
        self.app.call_from_thread(self.electrode_ready, view)

    def electrode_ready(self, view) -> None:
        if view.couple == self.electrode_couple():
            self.query_one("#electrode").show(view)
