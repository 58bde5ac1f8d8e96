"""Results that leave the screen: `w` saves what the current view shows (the prediction, the check, the map)
to a file in text, Markdown or the command line's JSON; `c` copies it as text to the clipboard (the terminal's
OSC 52 escape, so it works over SSH where the terminal allows it).

Mixed into WorkbenchScreen beside WorkbenchLogic; the forms come from services.result_export.
"""

from ...errors import CrossrateError


class WorkbenchResults:
    """Actions w and c (uses view, prediction, measured, couple_set, status())."""

    #: The last rate map computed (services.rate_map.RateMap), saved by `w` in the map view.
    map_result = None

    def current_result(self):
        """(what, result, couple ids, file stem, title) of the current view, or (None, reason)."""
        if self.view == "map":
            m = self.map_result
            if m is None:
                return None, "no map yet"
            return ("the rate map", m, list(m.ids), f"crossrate-map-{len(m.ids)}-couples",
                    f"crossrate rate map: {len(m.ids)} couples in {m.medium or 'several media'}")
        if self.view == "check":
            series = getattr(self, "series_report", None)
            if series is not None:
                ids = sorted({r.oxidant for r in series.rows} | {r.reductant for r in series.rows})
                return ("the measured series check", series, ids, "crossrate-check-series",
                        f"crossrate check of {len(series.rows)} measured rates")
            if self.measured is None or not self._prediction_is_current():
                return None, "no check yet: enter a measured k for the current pair"
            from ..library_access import check_measured

            k, sd = self.measured
            p = self.prediction
            try:
                result = check_measured(self.couple_set, p, k, sd)
            except CrossrateError as exc:
                return None, str(exc)
            return ("the check", result, [p.oxidant, p.reductant], f"crossrate-check-{p.oxidant}-{p.reductant}",
                    f"crossrate check: {p.oxidant} + {p.reductant}, measured {k:.3g} M^-1 s^-1")
        if not self._prediction_is_current():
            return None, "no prediction for the current pair: set one with o and r"
        p = self.prediction
        return ("the prediction", p, [p.oxidant, p.reductant], f"crossrate-prediction-{p.oxidant}-{p.reductant}",
                f"crossrate prediction: {p.oxidant} + {p.reductant}")

    def result_text(self, fmt: str):
        """(what, text) of the current view's result in `fmt`, or (None, reason)."""
        from ...services.result_export import export_text

        found = self.current_result()
        if found[0] is None:
            return found
        what, result, ids, _stem, title = found
        return what, export_text(result, fmt, title, self.couple_set, ids)

    def action_copy_result(self) -> None:
        what, text = self.result_text("text")
        if what is None:
            self.status(f"! nothing to copy: {text}")
            return
        self.app.copy_to_clipboard(text)
        self.status(f"copied {what} as text to the clipboard (terminal clipboard escape, OSC 52)")

    def action_save_result(self) -> None:
        from ...services.result_export import EXTENSIONS
        from .save_screen import SaveScreen

        found = self.current_result()
        if found[0] is None:
            self.status(f"! nothing to save: {found[1]}")
            return
        what, _result, _ids, stem, _title = found

        def chosen(answer) -> None:
            if answer:
                self._save(what, *answer)

        self.app.push_screen(SaveScreen(what, stem + EXTENSIONS["markdown"]), chosen)

    def _save(self, what: str, path: str, fmt: str, replace: bool = False) -> None:
        from ..result_files import write_result_file
        from .confirm_screen import ConfirmScreen

        found, text = self.result_text(fmt)
        if found is None:
            self.status(f"! nothing to save: {text}")
            return
        try:
            written = write_result_file(path, text, replace=replace)
        except FileExistsError:
            def answered(yes: bool | None) -> None:
                if yes:
                    self._save(what, path, fmt, replace=True)
                else:
                    self.status(f"not saved: {path} exists and was kept as it is")

            self.app.push_screen(ConfirmScreen(f"{path} exists. Replace it with {what}?", "replace", "keep it"),
                                 answered)
            return
        except CrossrateError as exc:
            self.status(f"! {exc}")
            return
        self.status(f"saved {what} to {written} ({fmt})")
