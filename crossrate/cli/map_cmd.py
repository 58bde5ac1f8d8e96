"""`crossrate map`: log10 k_obs for every ordered pair of loaded couples that share a medium."""


from .common_options import (
    add_condition_options,
    add_format_option,
    add_library_option,
    add_rate_model_options,
)
from .help_format import CAUTION

EPILOG = (
    "Rows are oxidants (couple i), columns reductants (couple j); a cell is empty (CSV) or null (JSON) where\n"
    "the pair cannot be computed: different media or potential scales, different ionic strengths without\n"
    "--ionic-strength, or no self-exchange data. The diagonal is each couple's self-exchange rate at these\n"
    "conditions. --medium keeps only couples measured in that medium (with --allow-mixed-media: computes every\n"
    "couple in it).\n"
    "--model semiclassical gives every cell the quantum factor of `crossrate predict --model semiclassical`\n"
    "(the same numbers, to 1e-5 in ln k); the JSON says which model was used (rate_model), and with the CSV\n"
    "a line on standard error says so.\n\n" + CAUTION
)


def register(subparsers) -> None:
    p = subparsers.add_parser(
        "map",
        help="matrix of log10 k_obs for every ordered pair of couples sharing a medium",
        description="Matrix of predicted log10 k_obs (M^-1 s^-1) over all ordered pairs of the loaded couples.",
        epilog=EPILOG,

    )
    add_library_option(p)
    add_condition_options(p)
    add_rate_model_options(p)
    p.add_argument("--tag", default=None, metavar="TAG", help="only couples carrying this tag")
    add_format_option(p, choices=("csv", "json"), default="csv")
    p.add_argument("--out", default=None, metavar="FILE", help="write to FILE instead of standard output")
    p.add_argument("--force", action="store_true", help="with --out: replace FILE if it exists")
    p.set_defaults(func=run)


def run(args) -> int:
    import sys

    from ..errors import ConditionsError
    from ..services.rate_map import ids_with_tag, rate_map
    from .common_options import conditions_from_args, load_set
    from .output_file import check_out_path, write_out
    from .render_map import map_csv, progress_bar

    if args.out:
        check_out_path(args.out, args.force)  # before the work, so a bad --out costs nothing
    conditions = conditions_from_args(args)
    couple_set = load_set(args)
    ids = ids_with_tag(couple_set, args.tag) if args.tag else None
    if ids is not None and len(ids) == 0:
        raise ConditionsError(f"--tag {args.tag}: no loaded couple carries this tag; expected a tag of the "
                              "library (see `crossrate library list`)")
    with progress_bar(sys.stderr) as progress:
        result = rate_map(couple_set, ids=ids, conditions=conditions, progress=progress)
    if args.format == "json":
        from ..services.result_export import result_json  # the workbench saves the same JSON

        text = result_json(result, indent=None)
    else:
        text = map_csv(result)
    if args.out:
        write_out(args.out, text, args.force)
        n = len(result)
        print(f"crossrate map: {n} x {n} couples, {result.computable} pairs computed, written to {args.out}",
              file=sys.stderr)
    else:
        sys.stdout.write(text)
    if result.rate_model != "classical" and args.format != "json":
        from ..services.rate_model import model_line

        print(f"crossrate map: {model_line(result.semiclassical)}", file=sys.stderr)
    if result.E_not_carried:
        # The CSV matrix has no place for it: say it beside, on stderr (the JSON has E_not_carried).
        print(f"crossrate map: E was not carried for {', '.join(result.E_not_carried)} (measured in another medium, "
              "used as given)", file=sys.stderr)
    return 0
