"""`crossrate check MEASURED.csv`: measured cross rates against the cross-relation predictions."""

import math
import sys

from . import common_options as co
from .help_format import CAUTION
from .predict_cmd import sample_count

HELP = """\
Compare measured cross rates with the Marcus cross-relation prediction under each row's conditions.
CSV columns: oxidant, reductant, k_measured (M^-1 s^-1); optional k_measured_log10_sd, temperature (K),
ionic_strength (mol/L), medium, label, note, source. Lines starting with # are comments.

Verdict ladder: within_interval (inside the combined 95 % interval of prediction and measurement),
within_10x (within a factor of 10, the usual agreement for well-behaved outer-sphere pairs),
beyond_10x (further off; the likely causes worth checking are listed).
"""


def register(subparsers) -> None:
    p = subparsers.add_parser(
        "check", help="check measured cross rates against predictions", description=HELP, epilog=CAUTION,

    )
    p.add_argument("measured", metavar="MEASURED.csv", help="CSV file of measured rates")
    co.add_library_option(p)
    co.add_condition_options(p)
    p.add_argument("--samples", type=sample_count, default=5000, metavar="N",
                   help="Monte Carlo draws per row for the prediction interval (default 5000; 0 skips it)")
    p.add_argument("--seed", type=co.seed_value, default=0, metavar="S", help="random seed of the draws (default 0)")
    p.add_argument("--fail-over", type=co.positive_float, default=None, metavar="FACTOR",
                   help="exit 1 when any row is off by more than this factor (k_measured/k_predicted or its "
                        "inverse; > 1, e.g. 10), for a group's own CI")
    co.add_format_option(p, choices=("table", "json", "csv"))
    p.add_argument("--plot", default=None, metavar="FILE", help="measured vs predicted figure (.svg or .png)")
    p.add_argument("--force", action="store_true", help="with --plot: replace FILE if it exists")
    p.set_defaults(func=run)


def run(args) -> int:
    from ..services.measured_check import check_measured
    from ..services.measured_csv import read_measured_csv

    if args.fail_over is not None and args.fail_over <= 1.0:
        from ..errors import ConditionsError

        raise ConditionsError(f"--fail-over {args.fail_over:g}: expected a factor greater than 1 (e.g. 10)")
    if args.plot:
        from ..figures.backend import check_figure_path, pyplot

        check_figure_path(args.plot, args.force)
        pyplot()  # fail now, before the work, when matplotlib is missing
    rows = read_measured_csv(args.measured)
    cs = co.load_set(args)
    cond = co.conditions_from_args(args)
    report = _with_progress(lambda progress: check_measured(cs, rows, cond, args.samples, args.seed, progress), len(rows))
    if args.format == "json":
        from ..services.result_export import result_json  # the workbench saves the same JSON

        sys.stdout.write(result_json(report))
    elif args.format == "csv":
        _print_csv(report)
    else:
        _print_table(report)
    if args.plot:
        from ..figures.check_plot import plot_check

        out = plot_check(report, args.plot, replace=args.force)
        print(f"figure written to {out}", file=sys.stderr)
    if args.fail_over is not None:
        over = report.rows_over(args.fail_over)
        if over:
            worst = ", ".join(f"line {r.line} ({r.oxidant} + {r.reductant}, {_times(r.log10_ratio)})" for r in over[:5])
            print(f"crossrate: {len(over)} row(s) off by more than a factor of {args.fail_over:g}: {worst}",
                  file=sys.stderr)
            return 1
    return 0


def _with_progress(job, total):
    if total < 20 or not sys.stderr.isatty():
        return job(None)
    from rich.progress import Progress

    from .terminal_output import console_for

    with Progress(transient=True, console=console_for(sys.stderr)) as bar:
        task = bar.add_task("predicting", total=total)
        return job(lambda done, _total: bar.update(task, completed=done))


CSV_COLUMNS = (
    "line", "label", "oxidant", "reductant", "k_measured", "log10_k_measured", "k_measured_log10_sd",
    "log10_k_pred", "log10_k_pred_low", "log10_k_pred_high", "log10_ratio", "position", "verdict",
    "regime", "log10_k_diff", "likely_causes", "oxidant_provenance", "reductant_provenance",
)


def _print_csv(report) -> None:
    import csv

    from ..library.spreadsheet_cells import safe_row

    w = csv.writer(sys.stdout, lineterminator="\n")
    w.writerow(CSV_COLUMNS)
    for r in report.rows:
        w.writerow(safe_row([
            r.line, r.label or "", r.oxidant, r.reductant, f"{r.k_measured:.6g}", f"{r.log10_k_measured:.4f}",
            f"{r.k_measured_log10_sd:.3g}", f"{r.log10_k_pred:.4f}", f"{r.log10_k_pred_95[0]:.4f}",
            f"{r.log10_k_pred_95[1]:.4f}", f"{r.log10_ratio:+.4f}", r.position, r.verdict, r.regime,
            f"{r.log10_k_diff:.4f}", "; ".join(r.likely_cause_keys), r.oxidant_provenance, r.reductant_provenance,
        ]))


SHORT_VERDICT = {"within_interval": "inside", "within_10x": "within 10x", "beyond_10x": "beyond 10x"}
TABLE_HEADER = ("line", "oxidant", "reductant", "k meas", "pred [95 %]", "log r", "verdict")


def table_lines(report) -> list[str]:
    """The fixed-width table of the rows (ids never cut, each with its '!' invented or '?' unverified mark;
    fits 80 columns for ids up to 16 characters)."""
    from ..library.provenance import marked_id

    rows = [
        (str(r.line), marked_id(r.oxidant, r.oxidant_provenance), marked_id(r.reductant, r.reductant_provenance),
         f"{r.k_measured:.3g}",
         f"{r.log10_k_pred:.2f} [{r.log10_k_pred_95[0]:.2f},{r.log10_k_pred_95[1]:.2f}]",
         f"{r.log10_ratio:+.2f}", SHORT_VERDICT[r.verdict])
        for r in report.rows
    ]
    widths = [max([len(h)] + [len(row[k]) for row in rows]) for k, h in enumerate(TABLE_HEADER)]
    right = {0, 3, 4, 5}

    def line(cells):
        parts = [c.rjust(w) if k in right else c.ljust(w) for k, (c, w) in enumerate(zip(cells, widths, strict=True))]
        # one space after "line" and before "k meas": their headers are wider than their values, which so
        # keep two; the room goes to the ids and their marks
        return (parts[0] + " " + "  ".join(parts[1:3]) + " " + "  ".join(parts[3:])).rstrip()

    return [line(TABLE_HEADER), "-" * len(line(TABLE_HEADER)), *(line(row) for row in rows)]


def _print_table(report) -> None:
    from .render_common import wrap_text

    out = [f"measured vs predicted: {report.path}", ""]
    out += table_lines(report)
    out += wrap_text("k meas in M^-1 s^-1; pred = log10 of the predicted k (M^-1 s^-1) with its 95 % interval; "
                     "log r = log10(k_measured/k_predicted); inside = within the combined 95 % interval")
    from ..library.provenance import legend_lines

    pairs = {(r.oxidant, r.oxidant_provenance) for r in report.rows} | {(r.reductant, r.reductant_provenance)
                                                                         for r in report.rows}
    for legend in legend_lines([kind for _, kind in sorted(pairs)]):
        out += wrap_text(legend)
    out.append("")
    for r in (r for r in report.rows if r.verdict == "beyond_10x"):
        out += wrap_text(f"line {r.line}: {r.oxidant} + {r.reductant}: {r.verdict_text}")
        for k, cause in enumerate(r.likely_causes[:4], start=1):
            out += wrap_text(f"{k}. {cause}", indent="    ", subsequent="       ")
    defaulted = [str(r.line) for r in report.rows if r.measured_sd_defaulted]
    if defaulted:
        from ..services.measured_check import DEFAULT_MEASURED_LOG10_SD

        out += wrap_text(f"no k_measured_log10_sd on line(s) {', '.join(defaulted)}: "
                         f"{DEFAULT_MEASURED_LOG10_SD:g} in log10 assumed")
    s = report.summary
    worst = "; ".join(f"line {line} {ox} + {red} ({ratio:+.2f})" for line, ox, red, ratio in s.worst)
    out += wrap_text(
        f"summary: {s.n} rows, median |log10 ratio| {s.median_abs_log10_ratio:.2f}, "
        f"{_pct(s.fraction_within_interval)} inside the interval, {_pct(s.fraction_within_10x)} within 10x; "
        f"worst: {worst}"
    )
    out += wrap_text(CAUTION, subsequent="")
    sys.stdout.write("\n".join(out) + "\n")


def _times(log10_ratio: float) -> str:
    f = 10.0 ** abs(log10_ratio)
    return f"{f:.3g} times {'faster' if log10_ratio > 0 else 'slower'}"


def _pct(x: float) -> str:
    return f"{100.0 * x:.0f} %" if math.isfinite(x) else "-"
