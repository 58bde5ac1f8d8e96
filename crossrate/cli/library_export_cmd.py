"""`crossrate library export`: the layered couples, or one file's, as CSV, JSON or a self-contained TOML library.

The CSV form has the library's field names as columns (units as in libraries/README.md) and reads back
with `crossrate library import` to exactly the same couples.
"""

import sys

from .common_options import add_library_option, load_set


def register(sub) -> None:
    """Add `export` to the `library` subcommands."""
    p = sub.add_parser(
        "export", help="write the layered couples (or one file's) as CSV, JSON or a self-contained TOML library",
        description="Write couples as CSV (one row per couple, the field names as columns, units as in "
        "libraries/README.md; `crossrate library import` reads it back unchanged), JSON, or a TOML library "
        "that reads back on its own. Without --file: the layered set (bundled, group, personal, --library).",
    )
    add_library_option(p)
    p.add_argument("--format", choices=("csv", "json", "toml"), required=True, help="output form")
    p.add_argument("--file", metavar="FILE", help="only the couples of this library file (no other layer's)")
    p.add_argument("--tag", action="append", default=[], metavar="TAG", help="only couples with this tag (repeatable)")
    p.add_argument("--medium", metavar="NAME", help="only couples measured in this solvent (solvent key, e.g. water)")
    p.add_argument("--out", metavar="FILE", help="write to FILE (must not exist) instead of standard output")
    p.set_defaults(func=run_export)


def _file_couples(path: str):
    """(couples, scales) of one library file, read on top of the bundled scales."""
    from ..core.potential_scales import ScaleRegistry
    from ..library.toml_reader import read_library_file
    from .library_cmd import _bundled_scales

    known = _bundled_scales()
    lf = read_library_file(path, known_scales=known)
    return lf.couples, ScaleRegistry({**known, **lf.scales})


def run_export(args) -> int:
    from ..library.couple_export import couple_record, export_toml, records_csv, records_json
    from .library_cmd import _selected

    if args.out is not None:
        from .output_file import check_out_path

        check_out_path(args.out, can_force=False)
    if args.file is not None:
        couples, scales = _file_couples(args.file)
    else:
        cs = load_set(args)
        couples, scales = list(cs), cs.scales
    couples = _selected(couples, args.tag, args.medium)
    if args.format == "toml":
        text = export_toml(couples, scales)
    elif args.format == "json":
        text = records_json([couple_record(c) for c in couples])
    else:
        text = records_csv([couple_record(c) for c in couples])
    if args.out is None:
        sys.stdout.write(text)
        return 0
    from .output_file import write_out

    write_out(args.out, text, force=False, can_force=False)
    print(f"wrote {len(couples)} couples to {args.out}")
    return 0
