"""`crossrate electrode ...`: a couple at an electrode. k0 from the self-exchange rate, k(eta) under
Butler-Volmer and Marcus-Hush-Chidsey kinetics, a simulated cyclic voltammogram, and a measured k0 or peak
separations checked against the prediction."""

import json

from . import common_options as co

ELECTRODE_CAUTION = (
    "Predictions are estimates, not a safety assessment; follow your lab's safety rules and local "
    "regulations for electrochemical work (cells, solvents, electrolytes, reference electrodes)."
)

DESCRIPTION = (
    "A redox couple at an electrode. k0: the standard heterogeneous rate constant predicted from the "
    "self-exchange rate with Marcus' relation k0/Z_el = (k_ex/Z_sol)^1/2. rates: k_red and k_ox against "
    "overpotential (Butler-Volmer and Marcus-Hush-Chidsey). cv: a simulated cyclic voltammogram and the peak "
    "separation against scan rate. check: a measured k0 or peak separations against the prediction."
)

K0_HELP = (
    "Predict k0 (cm/s) of a library couple with its 95 % interval: ln(k0/Z_el) = 1/2 [ln(k_ex/Z_sol) + w_ex/RT]\n"
    "(Marcus 1965; lambda at the electrode is half the self-exchange one). k_ex is the couple's self-exchange\n"
    "rate at the chosen conditions, w_ex its work term, Z_sol the collision factor --Z, and Z_el = (RT/2 pi M)^1/2\n"
    "from the couple's molar_mass (else 1e4 cm/s). The work of bringing a charged couple to the electrode\n"
    "is taken as zero (an approximation; best in excess supporting electrolyte). The interval includes the\n"
    "relation's own scatter (log10 SD 0.5: agreement within about an order of magnitude is typical)."
)

RATES_HELP = (
    "k_red and k_ox (cm/s) against overpotential eta = E - E0' under Butler-Volmer (transfer coefficient\n"
    "--alpha) and Marcus-Hush-Chidsey kinetics (reorganization energy at the electrode: half the couple's\n"
    "self-exchange lambda, or --lambda-el). MHC rates level off at large |eta|: the metal's continuum of\n"
    "levels hides the inverted region."
)


def register(subparsers) -> None:
    p = subparsers.add_parser("electrode", help="a couple at an electrode: k0, k(eta), cyclic voltammetry",
                              description=DESCRIPTION, epilog=ELECTRODE_CAUTION)
    sub = p.add_subparsers(dest="electrode_command", metavar="SUBCOMMAND", required=True)

    k0 = sub.add_parser("k0", help="predicted k0 of a couple from its self-exchange rate", description=K0_HELP,
                        epilog=ELECTRODE_CAUTION)
    k0.add_argument("couple", metavar="COUPLE", help="id of the couple")
    _add_common(k0)
    co.add_format_option(k0)
    k0.set_defaults(func=run_k0)

    rates = sub.add_parser("rates", help="k_red and k_ox against overpotential (Butler-Volmer, MHC)",
                           description=RATES_HELP, epilog=ELECTRODE_CAUTION)
    _add_kinetics_source(rates)
    rates.add_argument("--eta-max", type=co.positive_float, default=0.5, metavar="V",
                       help="overpotential range -V..+V (default 0.5)")
    rates.add_argument("--points", type=int, default=21, metavar="N", help="number of overpotentials (default 21)")
    co.add_format_option(rates)
    rates.add_argument("--plot", default=None, metavar="FILE", help="figure of log10 k against eta (.svg or .png)")
    rates.set_defaults(func=run_rates)

    from .electrode_cv_cmd import register_cv

    register_cv(sub, _add_kinetics_source)

    from .electrode_check_cmd import register as register_check

    register_check(sub, _add_common)


def _add_common(p) -> None:
    co.add_library_option(p)
    co.add_condition_options(p)
    p.add_argument("--Z-el", type=co.positive_float, default=None, metavar="CM_S", dest="Z_el",
                   help="electrode collision factor Z_el in cm/s (default: from molar_mass, else 1e4)")


def _add_kinetics_source(p) -> None:
    p.add_argument("couple", metavar="COUPLE", nargs="?", default=None,
                   help="id of the couple (its predicted k0 and lambda); leave out with --k0")
    _add_common(p)
    p.add_argument("--k0", type=co.positive_float, default=None, metavar="CM_S",
                   help="standard rate constant k0 in cm/s (instead of the couple's predicted one)")
    p.add_argument("--lambda-el", type=co.positive_float, default=None, metavar="KJ_MOL",
                   help="reorganization energy at the electrode, kJ/mol (default: half the couple's)")
    p.add_argument("--alpha", type=co.finite_float, default=0.5, metavar="A",
                   help="Butler-Volmer transfer coefficient (default 0.5)")


def kinetics_inputs(args):
    """(ElectrodeRate or None, log10 k0 in cm/s, lambda_el in kJ/mol or None) from COUPLE / --k0 / --lambda-el."""
    import math

    from ..errors import ConditionsError

    prediction = None
    if args.couple is not None:
        from ..services.electrode_rate import predict_k0

        prediction = predict_k0(co.load_set(args), args.couple, co.conditions_from_args(args), args.Z_el)
    elif args.k0 is None:
        raise ConditionsError("give a couple id, or --k0 CM_S (and --lambda-el KJ_MOL for Marcus-Hush-Chidsey)")
    log10_k0 = math.log10(args.k0) if args.k0 is not None else prediction.log10_k0
    lam = args.lambda_el
    if lam is None and prediction is not None and math.isfinite(prediction.lambda_el_kJ_per_mol):
        lam = prediction.lambda_el_kJ_per_mol
    return prediction, log10_k0, lam


def run_k0(args) -> int:
    from ..services.electrode_rate import predict_k0
    from .render_electrode import k0_lines

    r = predict_k0(co.load_set(args), args.couple, co.conditions_from_args(args), args.Z_el)
    if args.format == "json":
        print(json.dumps(r.to_dict(), indent=2, allow_nan=False))
        return 0
    _print(k0_lines(r))
    return 0


def run_rates(args) -> int:
    from ..services.electrode_kinetics import rate_curves
    from .render_electrode import rates_lines

    if args.plot:
        from ..figures.backend import check_figure_path, pyplot

        check_figure_path(args.plot)
        pyplot()
    prediction, log10_k0, lam = kinetics_inputs(args)
    curves = rate_curves(log10_k0, lam, args.alpha, args.temperature, args.eta_max, args.points)
    if args.format == "json":
        d = curves.to_dict()
        d["k0_prediction"] = prediction.to_dict() if prediction is not None else None
        print(json.dumps(d, indent=2, allow_nan=False))
    else:
        _print(rates_lines(curves, prediction))
    if args.plot:
        import sys

        from ..figures.electrode_plot import plot_rates

        out = plot_rates(curves, args.plot)
        print(f"figure written to {out}", file=sys.stderr)
    return 0


def _print(lines) -> None:
    import sys

    from .render_common import wrap_text

    sys.stdout.write("\n".join([*lines, "", *wrap_text(ELECTRODE_CAUTION, subsequent="")]) + "\n")

