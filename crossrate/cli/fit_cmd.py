"""`crossrate fit SERIES.csv`: fit a driving-force series under the classical, semiclassical and
no-inverted-region models, report lambda from the one the data support, and test for an inverted region."""

import json
import sys

from . import common_options as co
from .help_format import CAUTION

HELP = """\
Weighted least squares on log10 k under three models of the activation-controlled rate k_act: classical
Marcus, k_act = A exp(-(lambda + dG0)^2 / 4 lambda RT); semiclassical Marcus-Levich-Jortner (lambda =
lambda_s + lambda_v, one quantized mode of energy hbar omega, --hbar-omega, default 1500 cm^-1); and a curve
with no inverted region (held at its top past -dG0 = lambda). A bimolecular series (column k_obs, M^-1 s^-1)
carries the diffusion limit, k_obs = (1/k_act + 1/k_D)^-1; an intramolecular one (column k_intra, s^-1) has
none. The model with the lowest AIC is the one reported; lambda's 95 % interval (profile likelihood or
bootstrap) spans any model within Delta AIC < 2, and is given as a one-sided bound, or none, when the data
do not determine lambda. lambda_s and lambda_v come with 95 % intervals and are called separately determined
only when the semiclassical model is favoured and each interval lies within 10 % of its value. The
inverted-region test is made under the favoured model.
CSV columns: dG0_kJ_per_mol or dG0_eV (negative = downhill), k_obs or k_intra; optional log10_sd, label.
"""


def register(subparsers) -> None:
    p = subparsers.add_parser("fit", help="fit a driving-force series for lambda; test for an inverted region",
                              description=HELP, epilog=CAUTION)
    p.add_argument("series", metavar="SERIES.csv", help="CSV file of the series")
    p.add_argument("--temperature", type=co.finite_float, default=298.15, metavar="K",
                   help="temperature of the series in K (default 298.15)")
    g = p.add_mutually_exclusive_group()
    g.add_argument("--k-diff", type=co.positive_float, default=None, metavar="K",
                   help="hold the diffusion limit k_D fixed at K (M^-1 s^-1) instead of fitting it")
    g.add_argument("--no-diffusion", action="store_true", help="no diffusion limit: k_obs = k_act")
    p.add_argument("--hbar-omega", type=co.positive_float, default=1500.0, metavar="CM-1",
                   help="energy of the semiclassical model's quantized mode, 100-5000 cm^-1 (default 1500)")
    p.add_argument("--interval", choices=("profile", "bootstrap"), default="profile",
                   help="95 %% interval for lambda: profile likelihood (default) or parametric bootstrap")
    p.add_argument("--bootstrap", type=co.seed_value, default=200, metavar="N", help="bootstrap refits, 10 to 10000 (default 200)")
    p.add_argument("--seed", type=co.seed_value, default=0, metavar="S", help="bootstrap random seed (default 0)")
    co.add_format_option(p)
    p.add_argument("--plot", default=None, metavar="FILE", help="figure of data, fit and regions (.svg or .png)")
    p.add_argument("--force", action="store_true", help="with --plot: replace FILE if it exists")
    p.set_defaults(func=run)


def run(args) -> int:
    from ..errors import ConditionsError
    from ..services.conditions import TEMPERATURE_RANGE_K
    from ..services.measured_csv import read_series_csv

    lo, hi = TEMPERATURE_RANGE_K
    if not lo <= args.temperature <= hi:
        raise ConditionsError(f"--temperature {args.temperature:g}: expected {lo:g} to {hi:g} K")
    if not 10 <= args.bootstrap <= 10000:
        raise ConditionsError(f"--bootstrap {args.bootstrap}: expected 10 to 10000 refits")
    if args.plot:
        from ..figures.backend import check_figure_path, pyplot

        check_figure_path(args.plot, args.force)
        pyplot()
    series = read_series_csv(args.series)
    diffusion = "off" if args.no_diffusion else ("fixed" if args.k_diff is not None else None)
    fit = _run_fit(args, series, diffusion)
    if args.format == "json":
        print(json.dumps(fit.to_dict(), indent=2, allow_nan=False))
    else:
        _print_table(fit, args.series)
    if args.plot:
        from ..figures.series_plot import plot_series

        out = plot_series(fit, args.plot, replace=args.force)
        print(f"figure written to {out}", file=sys.stderr)
    return 0


def _run_fit(args, series, diffusion):
    from ..services.series_fit import fit_series

    def job(progress):
        return fit_series(series, args.temperature, diffusion, args.k_diff, args.interval, args.bootstrap,
                          args.seed, progress, hbar_omega_cm1=args.hbar_omega)

    if args.interval != "bootstrap" or not sys.stderr.isatty():
        return job(None)
    from rich.progress import Progress

    from .terminal_output import console_for

    with Progress(transient=True, console=console_for(sys.stderr)) as bar:
        task = bar.add_task("bootstrap", total=args.bootstrap)
        return job(lambda done, _total: bar.update(task, completed=done))


def _print_table(fit, path) -> None:
    from .render_common import print_lines

    unit = fit.rate_unit
    lines = [
        f"series {path}: {fit.n} points at {fit.temperature_K:g} K, {fit.kind} ({unit}); diffusion limit "
        f"{fit.diffusion}; scatter {fit.scatter}" + (f" ({fit.log10_sd_used:.3f} in log10)" if fit.log10_sd_used
                                                      else ""),
        "models: " + fit.model_comparison,
        fit.lambda_statement,
    ]
    if fit.model_fit("semiclassical") is not None:
        lines.append(f"semiclassical fit (hbar omega {fit.hbar_omega_cm1:g} cm^-1): {fit.lambda_split_statement}")
    lines += [
        f"log10 A = {fit.log10_A:.2f} +- {fit.log10_A_se:.2f}" + (
            f"; log10 k_D = {fit.log10_k_diff:.2f}" + (f" +- {fit.log10_k_diff_se:.2f}"
                                                      if fit.log10_k_diff_se is not None else " (fixed)")
            if fit.log10_k_diff is not None else "; no diffusion limit"),
        f"maximum at -Delta G deg = {fit.minus_dG0_at_max_kJ_per_mol:.1f} kJ/mol "
        f"({fit.minus_dG0_at_max_eV:.3f} eV); top 10^{fit.log10_k_plateau:.2f} {unit}",
        f"chi2 = {fit.chi2:.2f} on {fit.dof} dof",
    ]
    print_lines(lines)
    print()
    print("\n".join(point_lines(fit)))
    print()
    print_lines([("inverted region supported: " if fit.inverted_region_supported else
                  "inverted region not supported: ") + fit.evidence, *(f"warning: {w}" for w in fit.warnings)])


POINT_HEADER = ("line", "label", "dG0", "log k", "fit", "resid", "region", "k_D")


def point_lines(fit) -> list[str]:
    """Fixed-width table of the points, with a line saying the units."""
    from .render_common import wrap_text

    rows = [(str(p.line or ""), p.label, f"{p.dG0_kJ_per_mol:.1f}", f"{p.log10_k_obs:.2f}", f"{p.log10_k_fit:.2f}",
             f"{p.residual:+.2f}", p.region + (", past max" if p.past_maximum else ""),
             "yes" if p.diffusion_controlled else "") for p in fit.points]
    widths = [max([len(h)] + [len(r[k]) for r in rows]) for k, h in enumerate(POINT_HEADER)]
    left = {1, 6, 7}

    def line(cells):
        return "  ".join(c.ljust(w) if k in left else c.rjust(w)
                         for k, (c, w) in enumerate(zip(cells, widths, strict=True))).rstrip()

    head = line(POINT_HEADER)
    return [head, "-" * len(head), *(line(r) for r in rows),
            *wrap_text(f"dG0 in kJ/mol; log k, fit = log10 k measured and fitted by the favoured model "
                       f"({fit.rate_unit}); resid = log k - fit; k_D yes = diffusion-controlled (k_act > 10 k_D); "
                       "past max = beyond the fitted maximum")]
