"""Options shared by several subcommands, and the one place the CLI turns them into services' inputs."""

import argparse
import math

from ..core.constants import DEFAULT_Z, STANDARD_TEMPERATURE


def finite_float(text: str) -> float:
    """argparse type: a finite number (rejects nan, inf and words)."""
    try:
        value = float(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"{text!r} is not a number") from None
    if not math.isfinite(value):
        raise argparse.ArgumentTypeError(f"{text!r}: expected a finite number")
    return value


def positive_float(text: str) -> float:
    """argparse type: a finite number > 0."""
    value = finite_float(text)
    if value <= 0:
        raise argparse.ArgumentTypeError(f"{text!r}: expected a number greater than 0")
    return value


def seed_value(text: str) -> int:
    """argparse type: a random seed, a whole number >= 0 (numpy refuses negative seeds)."""
    try:
        value = int(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"{text!r} is not a whole number") from None
    if value < 0:
        raise argparse.ArgumentTypeError(f"{text!r}: expected a whole number 0 or greater")
    return value


def add_layer_options(parser: argparse.ArgumentParser, dest_prefix: str = "") -> None:
    """--demo, --no-starter, --no-bundled (dest_prefix keeps the root parser's apart from a subcommand's)."""
    parser.add_argument(
        "--demo", action="store_true", dest=dest_prefix + "demo",
        help="also load the invented demo library (made-up Halden Lake couples, marked '!' invented)",
    )
    parser.add_argument(
        "--no-starter", action="store_true", dest=dest_prefix + "no_starter",
        help="leave out the bundled starter library (literature values recalled from memory)",
    )
    parser.add_argument(
        "--no-bundled", action="store_true", dest=dest_prefix + "no_bundled",
        help="leave out every bundled library (starter and demo)",
    )


def add_library_option(parser: argparse.ArgumentParser) -> None:
    """--library PATH (repeatable), --demo, --no-starter, --no-bundled."""
    parser.add_argument(
        "--library",
        action="append",
        default=[],
        metavar="PATH",
        help="library file added on top of the layered set (bundled, group, personal); repeatable",
    )
    add_layer_options(parser)


def add_condition_options(parser: argparse.ArgumentParser, ionic_default_text: str = "the couples' own") -> None:
    """--temperature, --ionic-strength, --medium, --allow-mixed-media, --allow-E-other-medium, --Z, --no-diffusion,
    --activity-model."""
    g = parser.add_argument_group("conditions")
    g.add_argument(
        "--temperature", type=finite_float, default=STANDARD_TEMPERATURE, metavar="K",
        help=f"temperature in K (default {STANDARD_TEMPERATURE})",
    )
    g.add_argument(
        "--ionic-strength", type=finite_float, default=None, metavar="M",
        help=f"ionic strength in mol/L (default: {ionic_default_text} when they agree)",
    )
    g.add_argument("--medium", default=None, metavar="NAME", help="solvent key (default: the couples' own)")
    g.add_argument(
        "--allow-mixed-media", action="store_true",
        help="allow couples measured in different media (with a warning)",
    )
    g.add_argument(
        "--allow-E-other-medium", action="store_true", dest="allow_E_other_medium",
        help="use a formal potential measured in another medium as given (it cannot be carried between "
        "solvents; the output says so); without it such a pair is refused",
    )
    g.add_argument(
        "--Z", type=positive_float, default=DEFAULT_Z, metavar="VALUE",
        help=f"collision factor Z in M^-1 s^-1, 1e9 to 1e13 (default {DEFAULT_Z:g}; held constant in temperature)",
    )
    g.add_argument("--no-diffusion", action="store_true", help="do not cap the rate at the diffusion limit")
    g.add_argument(
        "--activity-model", choices=tuple(ACTIVITY_MODEL_CHOICES), default="debye-huckel",
        help="activity coefficients that carry formal potentials in ionic strength: debye-huckel (extended, "
             "the couple's radius as ion size; I up to about 0.1 M; default) or davies (up to about 0.5 M)",
    )


#: --activity-model choices and the equation each names (crossrate.core.potential_transfer's names).
ACTIVITY_MODEL_CHOICES = {"debye-huckel": "extended Debye-Hueckel", "davies": "Davies"}


def add_rate_model_options(parser: argparse.ArgumentParser) -> None:
    """--model classical|semiclassical and --hbar-omega CM-1 (services.rate_model)."""
    g = parser.add_argument_group("rate model")
    g.add_argument(
        "--model", dest="rate_model", choices=("classical", "semiclassical"), default="classical",
        help="classical Marcus cross relation (default) or semiclassical: the same times a quantum factor "
             "(one quantized mode, Marcus-Levich-Jortner) that is 1 at dG0' = 0",
    )
    g.add_argument(
        "--hbar-omega", type=positive_float, default=None, metavar="CM-1",
        help="energy of the quantized mode, 100-5000 cm^-1; given, it overrides every couple's own hbar_omega "
             "(without it: a couple's hbar_omega, else 1500; a pair takes the inner-lambda-weighted mean of its "
             "two couples' modes)",
    )


def add_format_option(parser: argparse.ArgumentParser, choices=("table", "json"), default="table") -> None:
    parser.add_argument("--format", choices=choices, default=default, help=f"output form (default {default})")


def conditions_from_args(args):
    """Conditions built from the condition options (ConditionsError for values out of range)."""
    from ..services.conditions import Conditions

    return Conditions(
        temperature_K=args.temperature,
        ionic_strength_M=args.ionic_strength,
        medium=args.medium,
        Z=args.Z,
        diffusion=not args.no_diffusion,
        allow_mixed_media=args.allow_mixed_media,
        allow_E_other_medium=getattr(args, "allow_E_other_medium", False),
        rate_model=getattr(args, "rate_model", "classical"),
        hbar_omega_cm1=getattr(args, "hbar_omega", None),
        activity_model=ACTIVITY_MODEL_CHOICES[getattr(args, "activity_model", "debye-huckel")],
    )


def layer_choice(args) -> dict:
    """Keyword arguments of load_layered from the layer options, given before or after the command."""
    from ..errors import CrossrateError

    def flag(name):
        return bool(getattr(args, name, False) or getattr(args, "root_" + name, False))

    if flag("demo") and flag("no_bundled"):
        raise CrossrateError("--demo and --no-bundled contradict each other (the demo is a bundled library); "
                             "expected one of them (--demo --no-starter loads the demo alone)")
    return {"bundled": not flag("no_bundled"), "starter": not flag("no_starter"), "demo": flag("demo")}


#: What to do about an empty set, added to the 'no couples loaded' line of the CLI.
EMPTY_HINT = ("expected couples: give your own file with --library FILE (`crossrate library new FILE` starts "
              "one), or add --demo for the invented demo couples")


def load_set(args, allow_empty: bool = False):
    """The layered CoupleSet: bundled starter (unless --no-starter / --no-bundled), the invented demo (with
    --demo), group, personal, then each --library. An empty set is a CrossrateError saying which layers
    were searched, unless allow_empty."""
    from ..errors import CrossrateError
    from ..library.layers import load_layered

    # --library may stand before the command (root option) or after it; both count, root ones first.
    paths = tuple(getattr(args, "root_library", []) or []) + tuple(getattr(args, "library", []) or [])
    cs = load_layered(extra_paths=paths, **layer_choice(args))
    if not len(cs) and not allow_empty:
        raise CrossrateError(f"{cs.empty_reason()}; {EMPTY_HINT}")
    return cs
