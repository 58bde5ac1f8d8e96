"""The check view's measured series: load a measured-rates CSV (the format of `crossrate check`), check every
row in a worker, show the rows with their verdicts and the measured-against-predicted plot.

Mixed into WorkbenchScreen beside WorkbenchLogic (uses couple_set, conditions, status(), set_focus)."""


class WorkbenchSeries:
    #: The series check on show (services.measured_check.CheckReport), None when none is loaded.
    series_report = None

    def load_series(self, path: str) -> None:
        from ..widgets.check_panel import CheckPanel

        if not path:
            self.series_report = None
            self.query_one(CheckPanel).show_series(None)
            self.status("series cleared: the check is for one measured k again")
            return
        if self.couple_set is None:
            return
        self.status(f"checking every row of {path}...")
        self.run_series(path, self.conditions)

    def series_ready(self, path: str, report, problem: str) -> None:
        from ..widgets.check_panel import CheckPanel
        from ..widgets.series_view import SeriesTable

        if report is None:
            # the file's own message: file, line, field and what was expected; the last series stays
            self.status(f"! {problem.splitlines()[0] if problem else 'not read'}")
            self.query_one(CheckPanel).show(f"! {problem}")
            return
        self.series_report = report
        self.query_one(CheckPanel).show_series(report)
        s = report.summary
        self.status(f"{s.n} rows of {path}: {s.fraction_within_10x:.0%} within a factor of 10; "
                    "↑↓ move, enter sets the row's pair, w saves the series check")
        if self.view == "check":
            self.set_focus(self.query_one(SeriesTable))
