"""`crossrate predict OXIDANT REDUCTANT`: one cross-rate prediction in full, as a table or JSON."""

import argparse

from .common_options import (
    add_condition_options,
    add_format_option,
    add_library_option,
    add_rate_model_options,
    seed_value,
)
from .help_format import CAUTION

#: Seed of the Monte Carlo interval when --seed is not given, so the same command prints the same interval;
#: the same value as crossrate.services.prediction.DEFAULT_SEED (the API's default; tested), kept here so that
#: building the parser imports no numpy.
DEFAULT_SEED = 20261201
DEFAULT_SAMPLES = 20000

EPILOG = (
    "The 95 % interval of k_obs comes from Monte Carlo draws of E and log k_self of both couples (their E_sd\n"
    "and k_self_log10_sd; couples without them get the defaults 10 mV and 0.3, and the warnings say so).\n"
    "Formal potentials are carried to the target ionic strength (extended Debye-Hueckel) and temperature\n"
    "(dE_dT, else E held with its SD grown by 1 mV/K); never to another solvent (see --allow-E-other-medium).\n"
    "Z is held constant in temperature (not scaled as sqrt(T)). Warnings mark water's correlations outside\n"
    "273-373 K, Debye-Hueckel screening far past dilute solution, and a large work-term factor W12.\n\n"
    "\n" + CAUTION
)


#: Fewest draws that give a usable 2.5/97.5 percentile interval, and the most that fit in memory comfortably
#: (4 draws of 8 bytes per sample and couple pair: 10^6 samples are about 32 MB).
MIN_SAMPLES, MAX_SAMPLES = 100, 1_000_000


def non_negative_int(text: str) -> int:
    """argparse type: a whole number >= 0."""
    try:
        value = int(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"{text!r} is not a whole number") from None
    if value < 0:
        raise argparse.ArgumentTypeError(f"{text!r}: expected 0 or more")
    return value


def sample_count(text: str) -> int:
    """argparse type: number of Monte Carlo draws, 0 (no interval) or MIN_SAMPLES..MAX_SAMPLES."""
    value = non_negative_int(text)
    if value != 0 and not MIN_SAMPLES <= value <= MAX_SAMPLES:
        raise argparse.ArgumentTypeError(
            f"{text!r}: expected 0 (no interval) or {MIN_SAMPLES} to {MAX_SAMPLES} draws"
        )
    return value


def add_mc_options(parser: argparse.ArgumentParser) -> None:
    """--samples N and --seed S of the Monte Carlo interval."""
    parser.add_argument(
        "--samples", type=sample_count, default=DEFAULT_SAMPLES, metavar="N",
        help=f"Monte Carlo draws for the 95 %% interval (default {DEFAULT_SAMPLES}; 0 skips it)",
    )
    parser.add_argument(
        "--seed", type=seed_value, default=DEFAULT_SEED, metavar="S",
        help=f"random seed of the Monte Carlo draws (default {DEFAULT_SEED}, so output is reproducible)",
    )


def register(subparsers) -> None:
    p = subparsers.add_parser(
        "predict",
        help="predict the cross-rate constant of one oxidant/reductant pair",
        description=(
            "Predict k12 for Ox1 + Red2 -> Red1 + Ox2 with the Marcus cross relation (work terms, diffusion "
            "limit). OXIDANT is the couple whose oxidized form takes the electron, REDUCTANT the couple whose "
            "reduced form gives it."
        ),
        epilog=EPILOG,

    )
    p.add_argument("oxidant", metavar="OXIDANT", help="id of the oxidant's couple (Ox1/Red1)")
    p.add_argument("reductant", metavar="REDUCTANT", help="id of the reductant's couple (Ox2/Red2)")
    add_library_option(p)
    add_condition_options(p)
    add_rate_model_options(p)
    add_mc_options(p)
    add_format_option(p, choices=("table", "json"), default="table")
    p.set_defaults(func=run)


def run(args) -> int:
    import sys

    from ..services.prediction import predict
    from .common_options import conditions_from_args, load_set

    conditions = conditions_from_args(args)
    couple_set = load_set(args)
    prediction = predict(
        couple_set, args.oxidant, args.reductant, conditions, samples=args.samples, seed=args.seed
    )
    if args.format == "json":
        from ..services.result_export import result_json  # the workbench saves the same JSON

        sys.stdout.write(result_json(prediction))
    else:
        from .render_prediction import print_prediction

        print_prediction(prediction, sys.stdout)
    return 0
