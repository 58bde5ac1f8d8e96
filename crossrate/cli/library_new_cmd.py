"""`crossrate library new FILE`: start a library file of one's own (a thin face over library/new_library.py)."""

from .common_options import finite_float


def register(sub) -> None:
    """Add `new` to the subparsers of `crossrate library`."""
    from ..library.new_library import DEFAULT_E_SCALE, DEFAULT_MEDIUM, DEFAULT_TEMPERATURE_K

    p = sub.add_parser(
        "new", help="start a new library file (header and a commented example couple); never overwrites",
        description="Create FILE with the [library] header (format, title, the default medium, temperature and "
        "potential scale of its couples) and a commented example couple naming every required field with its "
        "unit. FILE must not exist yet. Then add couples with `crossrate library add FILE ...` and use them with "
        "--library FILE.",
    )
    p.add_argument("file", metavar="FILE", help="the new library file (ending in .toml; must not exist)")
    p.add_argument("--title", metavar="TEXT", help="title of the library (default: the file name)")
    p.add_argument("--medium", default=DEFAULT_MEDIUM, metavar="NAME",
                   help=f"default solvent key of the couples (default {DEFAULT_MEDIUM})")
    p.add_argument("--E-scale", dest="E_scale", default=DEFAULT_E_SCALE, metavar="KEY",
                   help=f"default potential scale of the couples: SHE, SCE, AgCl-sat or AgCl-3M (default "
                   f"{DEFAULT_E_SCALE})")
    p.add_argument("--temperature", type=finite_float, default=DEFAULT_TEMPERATURE_K, metavar="K",
                   help=f"default temperature of the couples' measurements in K (default {DEFAULT_TEMPERATURE_K})")
    p.set_defaults(func=run_new)


def run_new(args) -> int:
    from ..library.new_library import create_library

    create_library(args.file, args.title, args.medium, args.E_scale, args.temperature)
    print(f"created {args.file}: no couple yet (defaults {args.medium}, {args.E_scale}, {args.temperature:g} K)")
    print(f"next: crossrate library add {args.file} --id ID ..., then --library {args.file}")
    return 0
