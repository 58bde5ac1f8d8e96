"""`crossrate lambda ID` / `crossrate lambda --radius A --medium M`: the reorganization-energy breakdown
(inner, outer, work) of a couple and the k_self it implies, as a table or JSON."""

import argparse
import math

from .common_options import add_format_option, add_library_option, finite_float, positive_float
from .help_format import CAUTION

EPILOG = (
    "lambda_out: Marcus two-sphere model in the chosen solvent, r = 2a. lambda_in: sum over the bonds of both\n"
    "partners of f_ox f_red/(f_ox + f_red) (delta_d)^2; force constants in N/m (1 mdyn/A = 100 N/m).\n"
    "k_self = kappa_el Z exp(-(w + lambda/4)/RT); kappa_el is 1 unless given (library couples tagged\n"
    "non-adiabatic without a kappa_el: 0.1). Estimated lambda carries a default 15 % SD.\n\n"
    "Examples:\n"
    "  crossrate lambda hl-quinone --medium acetonitrile\n"
    "  crossrate lambda --radius 3.5 --medium water \\\n"
    "                   --bonds 6:0.14:250:160 --charges 3:2\n\n"
    + CAUTION
)


def bond_spec(text: str):
    """argparse type: COUNT:DELTA_D:F_OX:F_RED (bonds per molecule, angstrom, N/m, N/m) -> BondSet; the same
    form the workbench's couple form takes (library.bond_text)."""
    from ..library.bond_text import parse_bond_item
    from ..library.couple import BondSet

    try:
        b = parse_bond_item(text)
    except ValueError as exc:
        raise argparse.ArgumentTypeError(str(exc)) from None
    if b["count"] < 1 or not all(math.isfinite(b[k]) for k in ("delta_d", "f_ox", "f_red")) or b["f_ox"] <= 0 \
            or b["f_red"] <= 0:
        raise argparse.ArgumentTypeError(
            f"{text!r}: count must be a whole number >= 1, delta_d finite, force constants > 0 N/m"
        )
    return BondSet(**b)


def charges_spec(text: str) -> tuple[int, int]:
    """argparse type: ZOX:ZRED, two whole numbers with z_ox - z_red = 1."""
    parts = text.split(":")
    try:
        z_ox, z_red = (int(p) for p in parts)
    except ValueError:
        raise argparse.ArgumentTypeError(f"{text!r}: expected ZOX:ZRED, e.g. 3:2") from None
    if z_ox - z_red != 1:
        raise argparse.ArgumentTypeError(f"{text!r}: expected z_ox - z_red = 1 (one-electron couple)")
    return z_ox, z_red


def kappa_spec(text: str) -> float:
    """argparse type: 0 < kappa_el <= 1."""
    value = finite_float(text)
    if not 0 < value <= 1:
        raise argparse.ArgumentTypeError(f"{text!r}: expected 0 < kappa_el <= 1")
    return value


def register(subparsers) -> None:
    from ..core.constants import DEFAULT_Z, STANDARD_TEMPERATURE

    p = subparsers.add_parser(
        "lambda",
        help="reorganization-energy breakdown of a couple and the k_self it implies",
        description=(
            "Show a couple's reorganization energy split into inner-sphere (bond changes) and outer-sphere "
            "(solvent, two-sphere model) parts, the work term of its self-exchange and the k_self they imply; "
            "beside the measured k_self and the lambda it implies, when the library has one. With --radius "
            "instead of an ID, the same for a couple not in the library."
        ),
        epilog=EPILOG,

    )
    p.add_argument("couple", nargs="?", metavar="ID", help="id of a library couple")
    s = p.add_argument_group("couple not in the library")
    s.add_argument("--radius", type=positive_float, metavar="A", help="couple radius in angstrom, 1 to 30")
    s.add_argument(
        "--bonds", type=bond_spec, action="append", default=[], metavar="COUNT:DD:FOX:FRED",
        help="bond set: bonds per molecule, length change (angstrom), force constants ox/red (N/m); repeatable",
    )
    s.add_argument("--lambda-in", type=finite_float, metavar="KJ", help="inner-sphere lambda in kJ/mol (instead of --bonds)")
    s.add_argument("--charges", type=charges_spec, metavar="ZOX:ZRED", help="charges of the two forms (work term)")
    s.add_argument(
        "--kappa-el", type=kappa_spec, metavar="K", help="electronic transmission factor, 0 < K <= 1 (default 1, adiabatic)"
    )
    g = p.add_argument_group("conditions")
    g.add_argument("--medium", default=None, metavar="NAME", help="solvent key (default: the couple's own)")
    g.add_argument(
        "--temperature", type=finite_float, default=STANDARD_TEMPERATURE, metavar="K",
        help=f"temperature in K (default {STANDARD_TEMPERATURE})",
    )
    g.add_argument(
        "--ionic-strength", type=finite_float, default=None, metavar="M",
        help="ionic strength in mol/L (default: the couple's own; 0 for --radius)",
    )
    g.add_argument(
        "--Z", type=positive_float, default=DEFAULT_Z, metavar="VALUE",
        help=f"collision factor Z in M^-1 s^-1, 1e9 to 1e13 (default {DEFAULT_Z:g})",
    )
    add_library_option(p)
    add_format_option(p, choices=("table", "json"), default="table")
    p.set_defaults(func=run)


def breakdown_from_args(args):
    """The LambdaBreakdown the arguments ask for (ConditionsError for a contradictory or incomplete request)."""
    from ..errors import ConditionsError
    from ..services.conditions import Conditions
    from ..services.lambda_estimate import lambda_breakdown, lambda_for_structure
    from . import common_options

    conditions = Conditions(
        temperature_K=args.temperature, ionic_strength_M=args.ionic_strength, medium=args.medium, Z=args.Z
    )
    structure = [
        name for name, v in (("--radius", args.radius), ("--bonds", args.bonds or None),
                             ("--lambda-in", args.lambda_in), ("--charges", args.charges),
                             ("--kappa-el", args.kappa_el))
        if v is not None
    ]
    if args.couple is not None:
        if structure:
            raise ConditionsError(
                f"give either a couple ID or a structure ({', '.join(structure)}), not both; "
                "for a library couple the structure comes from its entry"
            )
        couple_set = common_options.load_set(args)
        return lambda_breakdown(couple_set, args.couple, medium=args.medium, conditions=conditions)
    if args.radius is None:
        raise ConditionsError(
            "give a couple ID, or --radius A --medium M (with optional --bonds, --charges) for a couple not in "
            "the library"
        )
    if args.medium is None:
        raise ConditionsError("--radius needs --medium NAME: the solvent sets the outer-sphere lambda")
    if args.lambda_in is not None and args.bonds:
        raise ConditionsError("give --lambda-in or --bonds, not both")
    return lambda_for_structure(
        args.radius, args.medium, bonds=tuple(args.bonds), charges=args.charges, lambda_in_kJ=args.lambda_in,
        kappa_el=args.kappa_el, conditions=conditions,
    )


def run(args) -> int:
    import json
    import sys

    breakdown = breakdown_from_args(args)
    if args.format == "json":
        sys.stdout.write(json.dumps(breakdown.to_dict(), indent=2, allow_nan=False) + "\n")
    else:
        from .render_lambda import print_lambda

        print_lambda(breakdown, sys.stdout)
    return 0
