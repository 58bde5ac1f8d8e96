"""The workbench's map view (6): which couples it maps, the worker's result, and why a cell has no value.

Mixed into WorkbenchScreen beside WorkbenchLogic (uses couple_set, conditions, oxidant, view_part())."""

from ...errors import CrossrateError
from .workbench_logic import tui_wording


class WorkbenchMap:
    """refresh_map() maps the couples the couples view's filter shows, in one medium, in a worker (run_map)."""

    def refresh_map(self) -> None:
        cs = self.couple_set
        heat = self.view_part("map")
        if cs is None or heat is None:
            return
        ids = self.query_one("#table").shown_ids
        medium = self.conditions.medium if self.conditions and self.conditions.medium else None
        if medium is None:
            anchor = self.oxidant if self.oxidant in cs else (ids[0] if ids else None)
            medium = cs[anchor].medium if anchor else None
        ids = [i for i in ids if cs[i].medium == medium]
        if not ids:
            heat.message("No couples in view (change the filter in the couples view).")
            return
        heat.message(f"computing the map of {len(ids)} couples...")
        cond, model_note = self.conditions, ""
        if cond is not None and cond.rate_model != "classical":
            # Every cell carries the quantum factor of the prediction panel's semiclassical model.
            model_note = "; semiclassical model"
        self.run_map(ids, cond, f"{len(ids)} couples in {medium} (the couples view's filter){model_note}")

    def service_map(self, ids, cond):
        from ...services.rate_map import rate_map

        try:
            return rate_map(self.couple_set, ids=ids, conditions=cond), ""
        except CrossrateError as exc:
            return None, str(exc)

    def explain_pair(self, ox: str, red: str) -> str:
        """Why a pair of the map gives no value (the service's message), "" when it does."""
        from ...services.prediction import predict

        try:
            predict(self.couple_set, ox, red, self.conditions, samples=0)
        except CrossrateError as exc:
            return tui_wording(str(exc))
        return ""

    def map_ready(self, ids, result, note: str) -> None:
        """result: the services.rate_map.RateMap (kept for saving it), None when it failed (note says why)."""
        heat = self.view_part("map")
        heat.explain = self.explain_pair
        self.map_result = result
        if result is None:
            heat.message(f"! {note}")
        else:
            heat.show(ids, result.log10_k_obs, note)
