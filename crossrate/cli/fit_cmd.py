"""`crossrate fit SERIES.csv`: fit a driving-force series for lambda, A and k_D, and test for an inverted region."""

import argparse
import json
import sys

from . import common_options as co

HELP = """\
Weighted least squares on log10 k_obs of k_obs = (1/k_act + 1/k_D)^-1, k_act = A exp(-(lambda + dG0)^2 / 4 lambda RT)
(Marcus free-energy relationship with the diffusion limit), with standard errors from the Jacobian and a
profile-likelihood (or bootstrap) 95 % interval for lambda. Then the inverted-region test: the Marcus curve
against a curve with no inverted region (barrier held at 0 past -dG0 = lambda), by AIC.
CSV columns: dG0_kJ_per_mol or dG0_eV (negative = downhill), k_obs (M^-1 s^-1); optional log10_sd, label.
"""


def register(subparsers) -> None:
    p = subparsers.add_parser("fit", help="fit a driving-force series for lambda; test for an inverted region",
                              description=HELP, formatter_class=argparse.RawDescriptionHelpFormatter)
    p.add_argument("series", metavar="SERIES.csv", help="CSV file of the series")
    p.add_argument("--temperature", type=co.finite_float, default=298.15, metavar="K",
                   help="temperature of the series in K (default 298.15)")
    g = p.add_mutually_exclusive_group()
    g.add_argument("--k-diff", type=co.positive_float, default=None, metavar="K",
                   help="hold the diffusion limit k_D fixed at K (M^-1 s^-1) instead of fitting it")
    g.add_argument("--no-diffusion", action="store_true", help="no diffusion limit: k_obs = k_act")
    p.add_argument("--interval", choices=("profile", "bootstrap"), default="profile",
                   help="95 %% interval for lambda: profile likelihood (default) or parametric bootstrap")
    p.add_argument("--bootstrap", type=int, default=200, metavar="N", help="bootstrap refits (default 200)")
    p.add_argument("--seed", type=int, default=0, metavar="S", help="bootstrap random seed (default 0)")
    co.add_format_option(p)
    p.add_argument("--plot", default=None, metavar="FILE", help="figure of data, fit and regions (.svg or .png)")
    p.set_defaults(func=run)


def run(args) -> int:
    from ..errors import ConditionsError
    from ..services.conditions import TEMPERATURE_RANGE_K
    from ..services.measured_csv import read_series_csv

    lo, hi = TEMPERATURE_RANGE_K
    if not lo <= args.temperature <= hi:
        raise ConditionsError(f"--temperature {args.temperature:g}: expected {lo:g} to {hi:g} K")
    if args.bootstrap < 10:
        raise ConditionsError(f"--bootstrap {args.bootstrap}: expected at least 10 refits")
    if args.plot:
        from ..figures.backend import check_figure_path, pyplot

        check_figure_path(args.plot)
        pyplot()
    series = read_series_csv(args.series)
    diffusion = "off" if args.no_diffusion else ("fixed" if args.k_diff is not None else "fitted")
    fit = _run_fit(args, series, diffusion)
    if args.format == "json":
        print(json.dumps(fit.to_dict(), indent=2, allow_nan=False))
    else:
        _print_table(fit, args.series)
    if args.plot:
        from ..figures.series_plot import plot_series

        out = plot_series(fit, args.plot)
        print(f"figure written to {out}", file=sys.stderr)
    return 0


def _run_fit(args, series, diffusion):
    from ..services.series_fit import fit_series

    def job(progress):
        return fit_series(series, args.temperature, diffusion, args.k_diff, args.interval, args.bootstrap,
                          args.seed, progress)

    if args.interval != "bootstrap" or not sys.stderr.isatty():
        return job(None)
    from rich.progress import Progress

    with Progress(transient=True) as bar:
        task = bar.add_task("bootstrap", total=args.bootstrap)
        return job(lambda done, _total: bar.update(task, completed=done))


def _fmt_bound(x):
    return "open" if x is None else f"{x:.1f}"


def _print_table(fit, path) -> None:
    from rich import box
    from rich.console import Console
    from rich.table import Table

    console = Console(highlight=False)
    lo, hi = fit.lambda_95
    console.print(f"series {path}: {fit.n} points at {fit.temperature_K:g} K; diffusion limit {fit.diffusion}; "
                  f"scatter {fit.scatter}" + (f" ({fit.log10_sd_used:.3f} in log10)" if fit.log10_sd_used else ""))
    console.print(f"lambda = {fit.lambda_kJ_per_mol:.1f} +- {fit.lambda_se:.1f} kJ/mol ({fit.lambda_eV:.3f} eV); "
                  f"95 % [{_fmt_bound(lo)}, {_fmt_bound(hi)}] kJ/mol ({fit.interval_method})")
    console.print(f"log10 A = {fit.log10_A:.2f} +- {fit.log10_A_se:.2f}" + (
        f"; log10 k_D = {fit.log10_k_diff:.2f}" + (f" +- {fit.log10_k_diff_se:.2f}" if fit.log10_k_diff_se is not None
                                                  else " (fixed)")
        if fit.log10_k_diff is not None else "; no diffusion limit"))
    console.print(f"maximum at -Delta G deg = lambda = {fit.minus_dG0_at_max_kJ_per_mol:.1f} kJ/mol "
                  f"({fit.minus_dG0_at_max_eV:.3f} eV), plateau 10^{fit.log10_k_plateau:.2f} M^-1 s^-1; "
                  f"chi2 = {fit.chi2:.2f} on {fit.dof} dof")
    t = Table(title="points (dG0 in kJ/mol, k in M^-1 s^-1, logs base 10; k_D: diffusion-controlled)",
              title_justify="left", box=box.SIMPLE_HEAD, pad_edge=False, collapse_padding=True)
    for name in ("line", "label", "dG0", "log k", "fit", "resid", "region", "k_D"):
        t.add_column(name, justify="left" if name in ("label", "region", "k_D") else "right", no_wrap=True)
    for p in fit.points:
        t.add_row(str(p.line or ""), p.label, f"{p.dG0_kJ_per_mol:.1f}", f"{p.log10_k_obs:.2f}",
                  f"{p.log10_k_fit:.2f}", f"{p.residual:+.2f}", p.region + (", past max" if p.past_maximum else ""),
                  "yes" if p.diffusion_controlled else "")
    console.print(t)
    console.print(("inverted region supported: " if fit.inverted_region_supported else
                   "inverted region not supported: ") + fit.evidence)
    for w in fit.warnings:
        console.print(f"warning: {w}")
