"""`crossrate electrode check COUPLE --k0 X | --peaks FILE.csv`: a measured k0, or measured peak
separations at several scan rates, against the k0 predicted from the couple's self-exchange rate."""

import json

from . import common_options as co

CHECK_HELP = (
    "Check a measurement against the k0 predicted from the couple's self-exchange rate. Give a measured k0\n"
    "(--k0-measured CM_S, with --k0-log10-sd; default SD 0.3) or a CSV of peak separations (--peaks FILE):\n"
    "columns scan_rate (V/s) and dEp_mV; optional dEp_sd_mV (default 2 mV), label, note, source; lines\n"
    "starting with # are comments. Each separation is turned into k0 through a working curve of Delta Ep\n"
    "against Nicholson's psi simulated for the given alpha, D_ox/D_red and temperature (no resistance); a\n"
    "separation at the reversible value gives only a lower bound.\n\n"
    "Verdict ladder: within_interval (inside the combined 95 % interval of prediction and measurement),\n"
    "within_10x, beyond_10x (the likely causes worth checking are listed)."
)


def register(sub, add_common) -> None:
    from .electrode_cmd import ELECTRODE_CAUTION

    p = sub.add_parser("check", help="a measured k0 or peak separations against the predicted k0",
                       description=CHECK_HELP, epilog=ELECTRODE_CAUTION)
    p.add_argument("couple", metavar="COUPLE", help="id of the couple")
    add_common(p)
    what = p.add_mutually_exclusive_group(required=True)
    what.add_argument("--k0-measured", type=co.positive_float, default=None, metavar="CM_S",
                      help="measured standard rate constant, cm/s")
    what.add_argument("--peaks", default=None, metavar="FILE.csv", help="CSV of scan rates and peak separations")
    p.add_argument("--k0-log10-sd", type=co.positive_float, default=None, metavar="SD",
                   help="SD of the measured log10 k0 (default 0.3)")
    p.add_argument("--alpha", type=co.finite_float, default=0.5, metavar="A",
                   help="transfer coefficient for the working curve (default 0.5)")
    p.add_argument("--D-ox", type=co.positive_float, default=None, metavar="CM2_S", dest="D_ox",
                   help="diffusion coefficient of Ox, cm^2/s (default Stokes-Einstein)")
    p.add_argument("--D-red", type=co.positive_float, default=None, metavar="CM2_S", dest="D_red",
                   help="diffusion coefficient of Red, cm^2/s (default: that of Ox)")
    co.add_format_option(p)
    p.set_defaults(func=run)


def run(args) -> int:
    from ..services.electrode_check import check_electrode, read_peak_csv
    from ..services.electrode_rate import couple_diffusion_cm2_s, predict_k0
    from ..services.voltammogram import CvSetup
    from .electrode_cmd import _print
    from .render_electrode import check_lines

    peak_rows = read_peak_csv(args.peaks) if args.peaks else None
    cs = co.load_set(args)
    cond = co.conditions_from_args(args)
    prediction = predict_k0(cs, args.couple, cond, args.Z_el)
    couple = cs[args.couple]
    setup = None
    if peak_rows is not None:
        D_ox = args.D_ox or couple_diffusion_cm2_s(cs, args.couple, cond)
        setup = CvSetup(log10_k0=prediction.log10_k0, D_ox_cm2_s=D_ox, D_red_cm2_s=args.D_red or D_ox,
                        alpha=args.alpha, temperature_K=args.temperature)
    report = check_electrode(prediction, k0_measured_cm_s=args.k0_measured, k0_log10_sd=args.k0_log10_sd,
                             peak_rows=peak_rows, setup=setup, source=args.peaks or "",
                             charges=(couple.charge_ox, couple.charge_red))
    if args.format == "json":
        d = report.to_dict()
        if setup is not None:
            d["D_ox_cm2_s"], d["D_red_cm2_s"], d["alpha"] = setup.D_ox_cm2_s, setup.D_red_cm2_s, setup.alpha
        print(json.dumps(d, indent=2, allow_nan=False))
    else:
        _print(check_lines(report, setup))
    return 0
