"""`crossrate map`: log10 k_obs for every ordered pair of loaded couples that share a medium."""

import argparse

from .common_options import add_condition_options, add_format_option, add_library_option

EPILOG = (
    "Rows are oxidants (couple i), columns reductants (couple j); a cell is empty (CSV) or null (JSON) where\n"
    "the pair cannot be computed: different media or potential scales, different ionic strengths without\n"
    "--ionic-strength, or no self-exchange data. The diagonal is each couple's self-exchange rate at these\n"
    "conditions. --medium keeps only couples measured in that medium (with --allow-mixed-media: computes every\n"
    "couple in it). Predictions are estimates, not a safety assessment; follow your lab's safety rules and\n"
    "local regulations when handling strong oxidants and reductants."
)


def register(subparsers) -> None:
    p = subparsers.add_parser(
        "map",
        help="matrix of log10 k_obs for every ordered pair of couples sharing a medium",
        description="Matrix of predicted log10 k_obs (M^-1 s^-1) over all ordered pairs of the loaded couples.",
        epilog=EPILOG,
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    add_library_option(p)
    add_condition_options(p)
    p.add_argument("--tag", default=None, metavar="TAG", help="only couples carrying this tag")
    add_format_option(p, choices=("csv", "json"), default="csv")
    p.add_argument("--out", default=None, metavar="FILE", help="write to FILE instead of standard output")
    p.add_argument("--force", action="store_true", help="with --out: replace FILE if it exists")
    p.set_defaults(func=run)


def _write_out(path: str, text: str, force: bool) -> None:
    """Write text to path through a temporary file, so a failure never leaves a half-written FILE."""
    import os
    import tempfile

    from ..errors import InputFileError

    if os.path.exists(path) and not force:
        raise InputFileError(f"{path}: file exists; choose another --out or add --force to replace it")
    folder = os.path.dirname(os.path.abspath(path))
    fd, tmp = tempfile.mkstemp(prefix=".crossrate-map-", dir=folder)
    try:
        with os.fdopen(fd, "w", encoding="utf-8", newline="") as fh:
            fh.write(text)
        os.replace(tmp, path)
    except BaseException:
        if os.path.exists(tmp):
            os.unlink(tmp)
        raise


def run(args) -> int:
    import json
    import sys

    from ..services.rate_map import ids_with_tag, rate_map
    from .common_options import conditions_from_args, load_set
    from .render_map import map_csv, progress_bar

    conditions = conditions_from_args(args)
    couple_set = load_set(args)
    ids = ids_with_tag(couple_set, args.tag) if args.tag else None
    with progress_bar(sys.stderr) as progress:
        result = rate_map(couple_set, ids=ids, conditions=conditions, progress=progress)
    if args.format == "json":
        text = json.dumps(result.to_dict(), allow_nan=False) + "\n"
    else:
        text = map_csv(result)
    if args.out:
        _write_out(args.out, text, args.force)
        n = len(result)
        print(f"crossrate map: {n} x {n} couples, {result.computable} pairs computed, written to {args.out}",
              file=sys.stderr)
    else:
        sys.stdout.write(text)
    return 0
