"""`crossrate electrode cv` and `crossrate electrode check`: simulated voltammograms of a couple, and a
measured k0 or measured peak separations against the predicted k0."""

import argparse
import json
import sys

from . import common_options as co

CV_HELP = (
    "Simulate cyclic voltammograms of a one-electron couple at a planar electrode (semi-infinite diffusion,\n"
    "implicit finite differences on an expanding grid) and report the peak separation Delta Ep against scan\n"
    "rate, the peak currents, Nicholson's psi and the scan rate above which the couple stops looking\n"
    "reversible (Matsuda-Ayabe: k0/(D f v)^1/2 = 15). The scan starts at E0' + window with only Ox present.\n"
    "D defaults to Stokes-Einstein from the couple's radius and the medium's viscosity (1e-5 cm^2/s without\n"
    "a couple). Currents are anodic-positive, in microampere."
)


def scan_rate_list(text: str) -> list[float]:
    """argparse type: comma-separated scan rates in V/s, each > 0."""
    out = []
    for part in text.split(","):
        try:
            out.append(co.positive_float(part.strip()))
        except argparse.ArgumentTypeError:
            raise argparse.ArgumentTypeError(
                f"{text!r}: expected scan rates in V/s separated by commas, e.g. 0.01,0.1,1"
            ) from None
    return out


def register_cv(sub, add_kinetics_source) -> None:
    p = sub.add_parser("cv", help="simulated cyclic voltammograms and Delta Ep against scan rate",
                       description=CV_HELP, epilog=_caution())
    add_kinetics_source(p)
    _add_cell_options(p)
    p.add_argument("--scan-rates", type=scan_rate_list, default=[0.01, 0.1, 1.0, 10.0], metavar="V,V,...",
                   help="scan rates in V/s (default 0.01,0.1,1,10)")
    co.add_format_option(p, choices=("table", "json", "csv"))
    p.add_argument("--plot", default=None, metavar="FILE", help="voltammograms and Delta Ep figure (.svg or .png)")
    p.set_defaults(func=run_cv)


def _add_cell_options(p) -> None:
    g = p.add_argument_group("cell")
    g.add_argument("--kinetics", choices=("bv", "mhc"), default="bv",
                   help="Butler-Volmer or Marcus-Hush-Chidsey (default bv)")
    g.add_argument("--D-ox", type=co.positive_float, default=None, metavar="CM2_S", dest="D_ox",
                   help="diffusion coefficient of Ox, cm^2/s")
    g.add_argument("--D-red", type=co.positive_float, default=None, metavar="CM2_S", dest="D_red",
                   help="diffusion coefficient of Red, cm^2/s (default: that of Ox)")
    g.add_argument("--Ru", type=co.finite_float, default=0.0, metavar="OHM",
                   help="uncompensated resistance, ohm (default 0)")
    g.add_argument("--area", type=co.positive_float, default=0.0707, metavar="CM2",
                   help="electrode area, cm^2 (default 0.0707, a 3 mm disc)")
    g.add_argument("--conc", type=co.positive_float, default=1.0, metavar="MM",
                   help="bulk concentration of Ox, mM (default 1)")
    g.add_argument("--window", type=co.positive_float, default=None, metavar="V",
                   help="half-width of the scan about E0', V (default 0.2, widened until the peaks fit)")


def _caution() -> str:
    from .electrode_cmd import ELECTRODE_CAUTION

    return ELECTRODE_CAUTION


def cv_setup(args, log10_k0, lam, prediction):
    """CvSetup from the command's options (D from the couple where not given)."""
    from ..services.voltammogram import DEFAULT_D_CM2_S, CvSetup

    D_ox = args.D_ox
    if D_ox is None and prediction is not None:
        from ..services.electrode_rate import couple_diffusion_cm2_s

        D_ox = couple_diffusion_cm2_s(co.load_set(args), args.couple, co.conditions_from_args(args))
    D_ox = D_ox or DEFAULT_D_CM2_S
    return CvSetup(log10_k0=log10_k0, D_ox_cm2_s=D_ox, D_red_cm2_s=args.D_red or D_ox, alpha=args.alpha,
                   lambda_el_kJ_per_mol=lam, kinetics=args.kinetics, temperature_K=args.temperature,
                   area_cm2=args.area, conc_mM=args.conc, Ru_ohm=args.Ru, window_V=args.window)


def run_cv(args) -> int:
    from ..services.voltammogram import scan_rate_series
    from .electrode_cmd import _print, kinetics_inputs
    from .render_electrode import cv_lines

    if args.plot:
        from ..figures.backend import check_figure_path, pyplot

        check_figure_path(args.plot)
        pyplot()
    prediction, log10_k0, lam = kinetics_inputs(args)
    series = scan_rate_series(cv_setup(args, log10_k0, lam, prediction), args.scan_rates)
    if args.format == "json":
        d = series.to_dict()
        d["k0_prediction"] = prediction.to_dict() if prediction is not None else None
        print(json.dumps(d, indent=2, allow_nan=False))
    elif args.format == "csv":
        import csv

        w = csv.writer(sys.stdout, lineterminator="\n")
        rows = series.records()
        w.writerow(list(rows[0]))
        for r in rows:
            w.writerow([f"{x:.6g}" for x in r.values()])
    else:
        _print(cv_lines(series, prediction))
    if args.plot:
        from ..figures.electrode_plot import plot_cv

        print(f"figure written to {plot_cv(series, args.plot)}", file=sys.stderr)
    return 0

