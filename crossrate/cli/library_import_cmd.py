"""`crossrate library import couples.csv --into FILE`: couples from a spreadsheet into a library file.

A thin face over crossrate.library.couple_import (the CSV's form is described there and in
libraries/README.md). Every problem of the CSV is printed as `file:line:column: ...` and nothing is written
when there is any; exit 0 on success, 2 otherwise.
"""

import os


def register(sub) -> None:
    """Add `import` to the `library` subcommands."""
    p = sub.add_parser(
        "import", help="add the couples of a CSV file (one row per couple) to a library file",
        description="Add the couples of a CSV file to FILE (created when missing) in one safe write that keeps "
        "every comment and untouched line of FILE (the previous version is kept as FILE.bak). The header row "
        "names the columns: id and the field names of libraries/README.md, in the units it gives (V, "
        "M^-1 s^-1, angstrom, kJ/mol, M, K); an empty cell leaves the field out, and FILE's [library] defaults "
        "apply. tags are separated by ';', bonds written in their TOML inline form, date as YYYY-MM-DD. "
        "Every problem is listed as file:line:column and nothing is written when there is any.",
    )
    p.add_argument("csv_file", metavar="CSV", help="CSV file of couples (UTF-8; what `library export --format csv` "
                   "writes reads back)")
    p.add_argument("--into", required=True, metavar="FILE", help="library file to add the couples to")
    p.add_argument("--replace", action="store_true", help="rewrite couples whose id FILE has already (otherwise "
                   "such ids are refused)")
    p.set_defaults(func=run_import)


def run_import(args) -> int:
    from ..errors import CrossrateError
    from ..library.couple_import import import_couples_csv
    from .library_cmd import _bundled_scales

    folder = os.path.dirname(os.path.abspath(args.into))
    if not os.path.isdir(folder):
        raise CrossrateError(f"--into {args.into}: folder {folder} does not exist; expected an existing folder for "
                             "the library file (nothing was written)")
    result = import_couples_csv(args.csv_file, args.into, replace=args.replace, known_scales=_bundled_scales())
    parts = [f"{len(result.added)} added"]
    if result.replaced:
        parts.append(f"{len(result.replaced)} replaced ({', '.join(result.replaced)})")
    tail = "created" if result.created else f"previous version kept as {result.path}.bak"
    print(f"imported {len(result.added) + len(result.replaced)} couples into {result.path}: {', '.join(parts)} "
          f"({tail})")
    return 0
