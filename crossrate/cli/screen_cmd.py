"""`crossrate screen TARGET --role oxidant|reductant`: every partner of a target couple, ranked by k_obs."""

import argparse

from .common_options import (
    add_condition_options,
    add_format_option,
    add_library_option,
    add_rate_model_options,
    finite_float,
    positive_float,
)
from .help_format import CAUTION

EPILOG = (
    "--medium both sets the medium of the prediction and keeps only partners measured in it. "
    "Pairs that cannot be computed (different media or potential scales, different ionic strengths without "
    "--ionic-strength, no self-exchange data) are left out and counted. --model semiclassical ranks by the\n"
    "rates of `crossrate predict --model semiclassical` (a line under the table, the JSON's rate_model and, with\n"
    "the CSV, the line on standard error say which model was used).\n\n" + CAUTION
)


def positive_int(text: str) -> int:
    """argparse type: a whole number >= 1."""
    try:
        value = int(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"{text!r} is not a whole number") from None
    if value < 1:
        raise argparse.ArgumentTypeError(f"{text!r}: expected 1 or more")
    return value


def register(subparsers) -> None:
    p = subparsers.add_parser(
        "screen",
        help="rank every couple that can react with a target couple by predicted k_obs",
        description=(
            "Predict k_obs for the target couple against every other loaded couple (Marcus cross relation, "
            "vectorized) and list the partners fastest first, with Delta G deg, the regime and a linear 95 % "
            "interval."
        ),
        epilog=EPILOG,

    )
    p.add_argument("target", metavar="TARGET", help="id of the target couple")
    p.add_argument(
        "--role", choices=("oxidant", "reductant"), required=True,
        help="the target's role: oxidant (its Ox takes the electron) or reductant (its Red gives it)",
    )
    add_library_option(p)
    add_condition_options(p)
    add_rate_model_options(p)
    f = p.add_argument_group("filters")
    f.add_argument("--min-k", type=positive_float, default=None, metavar="K",
                   help="keep pairs with k_obs >= K (M^-1 s^-1)")
    f.add_argument("--max-dG0", type=finite_float, default=None, metavar="KJ",
                   help="keep pairs with Delta G deg <= KJ (kJ/mol)")
    f.add_argument("--tag", default=None, metavar="TAG", help="keep partners carrying this tag")
    f.add_argument("--top", type=positive_int, default=None, metavar="N", help="show at most N partners")
    c = p.add_argument_group("computed candidates (instead of the library's couples)")
    c.add_argument("--candidates", metavar="TABLE.csv", help="screen against this CSV of computed couples: id, "
                   "charge_ox, charge_red, E (V), radius (angstrom) and k_self (M^-1 s^-1) or lambda_total "
                   "(kJ/mol), taken at the screen's conditions; checked like a library file (file:line:column)")
    c.add_argument("--candidate-scale", default="SHE", metavar="KEY",
                   help="potential scale of the candidates' E (default SHE)")
    add_format_option(p, choices=("table", "json", "csv"), default="table")
    p.set_defaults(func=run)


def run(args) -> int:
    import json
    import sys

    from ..services.screening import screen
    from .common_options import conditions_from_args, load_set
    from .render_screen import count_line, print_screen, screen_csv, screen_json

    conditions = conditions_from_args(args)
    couple_set = load_set(args)
    if args.candidates is not None:
        from .render_candidates import run_candidates

        return run_candidates(args, couple_set, conditions)
    if args.tag:
        from ..errors import ConditionsError
        from ..services.rate_map import ids_with_tag

        if not ids_with_tag(couple_set, args.tag):
            raise ConditionsError(f"--tag {args.tag}: no loaded couple carries this tag; expected a tag of the "
                                  "library (see `crossrate library list`)")
    result = screen(
        couple_set, args.target, args.role, conditions, min_k=args.min_k, max_dG0=args.max_dG0,
        medium=args.medium, tag=args.tag, top=args.top,
    )
    if args.format == "json":
        sys.stdout.write(json.dumps(screen_json(result), indent=2, allow_nan=False) + "\n")
    elif args.format == "csv":
        sys.stdout.write(screen_csv(result))
        # The CSV stays machine-readable; the count goes to stderr.
        print(f"crossrate screen: {count_line(result)}", file=sys.stderr)
    else:
        print_screen(result, sys.stdout)
    return 0
