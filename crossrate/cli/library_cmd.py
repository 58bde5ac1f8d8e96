"""`crossrate library ...`: validate, list, show, add, rename and remove couples (export, import, diff and
audit: their own modules, registered here).

A thin face over crossrate.library: reading, validation, layering and the safe, comment-keeping edits
all live there. Exit 0 on success, 2 with `path:line: ...` messages on stderr for bad input.
"""

import os
import sys
from pathlib import Path

from ..errors import CrossrateError, LibraryError, Problem
from .common_options import add_library_option, load_set

_FIELD_DEST = "field_"


def _field_option(name: str) -> str:
    return "--" + name.replace("_", "-")


def register(subparsers) -> None:
    """Add `library` and its subcommands to the root parser's subparsers."""
    from ..library.schema import FIELD_SPECS

    lib = subparsers.add_parser(
        "library",
        help="validate, list, show, add, rename, remove, import, export, diff and audit library couples",
        description="Work with the couple library: TOML files layered bundled -> group -> personal -> --library. "
        "The file format is described in libraries/README.md.",
    )
    lib.set_defaults(func=lambda args: _no_action(lib))
    sub = lib.add_subparsers(dest="library_command", metavar="ACTION")

    p = sub.add_parser("validate", help="check library files; exit 0 when all are valid, 2 otherwise",
                       description="Check library files as the other commands read them: on top of the bundled, "
                       "group and personal libraries (their potential scales may be used, not redefined).")
    p.add_argument("files", nargs="+", metavar="FILE", help="library TOML file(s); every problem is listed as "
                   "file:line: couple: field: what was expected")
    p.set_defaults(func=run_validate)

    p = sub.add_parser("list", help="list the couples of the layered library")
    add_library_option(p)
    p.add_argument("--tag", action="append", default=[], metavar="TAG", help="only couples with this tag (repeatable)")
    p.add_argument("--medium", metavar="NAME", help="only couples measured in this solvent (solvent key, e.g. water)")
    p.add_argument("--format", choices=("table", "json", "csv"), default="table", help="output form (default table)")
    p.set_defaults(func=run_list)

    p = sub.add_parser("show", help="every field of one couple, where it comes from and what it shadows")
    add_library_option(p)
    p.add_argument("couple_id", metavar="ID", help="id of the couple")
    p.add_argument("--format", choices=("text", "json"), default="text", help="output form (default text)")
    p.set_defaults(func=run_show)

    p = sub.add_parser(
        "add", allow_abbrev=False,
        help="add a couple to a library file (created when missing); comments and other couples stay as they are",
        description="Add a couple to FILE. Give the fields as options (units as in libraries/README.md) and/or "
        "a TOML snippet with --from-toml; options override the snippet. Fields the file's [library] table "
        "gives defaults for (medium, temperature, E_scale) may be left out.",
    )
    p.add_argument("file", metavar="FILE", help="library file to add to")
    p.add_argument("--id", dest="couple_id", metavar="ID", help="id of the new couple (lower-case letters, digits, . _ -)")
    p.add_argument("--from-toml", metavar="SNIPPET", help="TOML file with the fields, bare or as one [couple.<id>] table")
    g = p.add_argument_group("fields")
    for s in FIELD_SPECS:
        if s.kind == "boolean":
            g.add_argument(_field_option(s.name), dest=_FIELD_DEST + s.name, action="store_const", const="true",
                           default=None, help=f"{s.help} (flag)")
            continue
        unit = f" [{s.unit}]" if s.unit else ""
        meta = {"number": "X", "integer": "N", "text list": "A,B", "bonds": "COUNT:DD:FOX:FRED[;...]"}.get(s.kind, "TEXT")
        g.add_argument(_field_option(s.name), dest=_FIELD_DEST + s.name, metavar=meta, default=None,
                       choices=s.choices or None, help=f"{s.help}{unit}")
    p.set_defaults(func=run_add)

    p = sub.add_parser("rename", help="change a couple's id in a library file (the previous version is kept as "
                       "FILE.bak)")
    p.add_argument("file", metavar="FILE", help="library file holding the couple")
    p.add_argument("old_id", metavar="OLD", help="current id")
    p.add_argument("new_id", metavar="NEW", help="new id (lower-case letters, digits, . _ -)")
    p.set_defaults(func=run_rename)

    p = sub.add_parser("remove", help="remove a couple from a library file (the previous version is kept as FILE.bak)")
    p.add_argument("file", metavar="FILE", help="library file holding the couple")
    p.add_argument("couple_id", metavar="ID", help="id of the couple to remove")
    p.set_defaults(func=run_remove)

    from . import library_audit_cmd, library_diff_cmd, library_export_cmd, library_import_cmd

    for module in (library_export_cmd, library_import_cmd, library_diff_cmd, library_audit_cmd):
        module.register(sub)

    from . import library_new_cmd

    library_new_cmd.register(sub)


def _no_action(parser) -> int:
    parser.print_help(sys.stderr)
    return 2


# --- validate -----------------------------------------------------------------------------------------

def _bundled_scales() -> dict:
    """Custom potential scales of the bundled libraries, which any file may use (layered after them)."""
    from ..library.layers import layer_files
    from ..library.toml_reader import read_library_file

    known = {}
    for lf_spec in layer_files(bundled=True, group=False, personal=False):
        try:
            known.update(read_library_file(lf_spec.path, "bundled").scales)
        except LibraryError:
            continue  # a broken bundled file is reported when it is validated itself
    return known


def run_validate(args) -> int:
    from ..library.layered_validation import layered_context, validate_in_context

    # Each file is judged on top of the layers the other commands put under it (bundled, group, personal).
    context = layered_context(exclude=args.files)
    where = context.describe()
    n_bad = n_problems = 0
    for f in args.files:
        try:
            lf = validate_in_context(f, context)
        except LibraryError as exc:
            n_bad += 1
            n_problems += len(exc.problems)
            for prob in exc.problems:
                print(prob, file=sys.stderr)
            continue
        n = len(lf.couples)
        print(f"{f}: valid ({n} couple{'' if n == 1 else 's'}; checked on top of {where})")
    if n_bad:
        print(f"crossrate: {n_problems} problem{'s' if n_problems != 1 else ''} in {n_bad} "
              f"file{'s' if n_bad != 1 else ''}", file=sys.stderr)
        return 2
    return 0


# --- list / show / export -----------------------------------------------------------------------------

def _selected(cs, tags, medium):
    if medium is not None:
        from ..core.solvents import solvent_table

        if medium not in solvent_table():
            raise CrossrateError(f"unknown medium {medium!r}; expected one of {', '.join(sorted(solvent_table()))}")
    out = []
    for c in cs:
        if medium is not None and c.medium != medium:
            continue
        if tags and not all(t in c.tags for t in tags):
            continue
        out.append(c)
    return out


def run_list(args) -> int:
    from ..library.couple_export import couple_record, records_csv, records_json

    cs = load_set(args, allow_empty=True)
    if not len(cs):
        from .common_options import EMPTY_HINT

        # said in words; JSON and CSV stay machine-readable (empty), the words go to stderr
        print(f"{cs.empty_reason()}; {EMPTY_HINT}", file=sys.stdout if args.format == "table" else sys.stderr)
        if args.format == "table":
            return 0
    couples = _selected(cs, args.tag, args.medium)
    if args.format in ("json", "csv"):
        records = [couple_record(c) for c in couples]
        if args.format == "csv":
            sys.stdout.write(records_csv(records))
            return 0
        hides = {}
        for s in cs.shadowed:
            hides.setdefault(s.couple_id, []).append(f"{s.hidden.path}:{s.hidden.line}")
        for r in records:
            r["shadows"] = hides.get(r["id"], [])
        sys.stdout.write(records_json(records))
        return 0
    from .render_library import print_couple_list

    print_couple_list(couples, len(cs), cs.shadowed, sys.stdout)
    return 0


def _show_value(spec, v) -> str:
    if v is None or v == () or v == "":
        return "-"
    if spec.name == "bonds":
        return "; ".join(f"{b.count} x (delta_d {b.delta_d:g} angstrom, f_ox {b.f_ox:g} N/m, f_red {b.f_red:g} N/m)"
                         for b in v)
    if spec.name == "tags":
        return ", ".join(v)
    if isinstance(v, bool):
        return "yes" if v else "no"
    unit = f" {spec.unit}" if spec.unit else ""
    if isinstance(v, float):
        return f"{v:.6g}{unit}"
    return f"{v}{unit}"


def run_show(args) -> int:
    from ..library.couple_export import couple_record, records_json
    from ..library.schema import FIELD_SPECS

    cs = load_set(args)
    c = cs[args.couple_id]
    hidden = [s for s in cs.shadowed if s.couple_id == c.id]
    if args.format == "json":
        rec = couple_record(c)
        rec["shadows"] = [f"{s.hidden.path}:{s.hidden.line}" for s in hidden]
        sys.stdout.write(records_json([rec]))
        return 0
    o = c.origin
    lines = [f"couple {c.id}: {c.name}"]
    if o is not None:
        lines.append(f"  from            {o.path}:{o.line} ({o.layer} layer)")
    if c.invented:
        lines.append("  INVENTED        made-up values (demo, teaching), not measurements; never use them for real "
                     "predictions")
    elif not c.verified:
        lines.append("  UNVERIFIED      values recalled or estimated, not checked against the primary source")
    for s in FIELD_SPECS:
        if s.name == "name":
            continue
        v = getattr(c, s.name)
        where = ""
        if o is not None and v not in (None, (), "") and dict(o.field_lines).get(s.name):
            where = f"   (line {o.line_of(s.name)})"
        lines.append(f"  {s.name:<16}{_show_value(s, v)}{where}")
    try:
        E_root, root = cs.E_on_root(c)
        state = " (excited state)" if c.E00 is not None else ""
        lines.append(f"  E on root scale {E_root:+.3f} V vs {root}{state}")
    except (KeyError, ValueError) as exc:
        lines.append(f"  E on root scale cannot be placed ({exc})")
    for s in hidden:
        lines.append(f"  shadows         {s.hidden.path}:{s.hidden.line} ({s.hidden.layer} layer)")
    from .render_common import wrap_text

    # Long free text (source, notes, bonds) wraps under its value; a file path is never broken.
    print("\n".join(w for line in lines
                    for w in ([line] if line.startswith(("  from ", "  shadows ")) else
                              wrap_text(line, subsequent=" " * 18))))
    return 0


# --- add / rename / remove ----------------------------------------------------------------------------

def _snippet(path: str, couple_id: str | None):
    """(raw fields, id, table span, display path) from a --from-toml file."""
    from ..library.line_index import LineIndex
    from ..library.toml_reader import TomlSyntaxProblem, read_library_bytes

    data = read_library_bytes(path)
    try:
        text = data.decode("utf-8")
    except UnicodeDecodeError:
        raise LibraryError([Problem(path, None, None, None, "not UTF-8 text; expected a TOML snippet")]) from None
    from ..library.toml_loads import loads

    try:
        raw = loads(text)
    except ValueError as exc:
        raise LibraryError([TomlSyntaxProblem(path, getattr(exc, "lineno", None), None, None,
                                              f"TOML syntax error: {getattr(exc, 'msg', exc)}; expected valid TOML",
                                              getattr(exc, "colno", None))]) from None
    index = LineIndex.scan(text)
    if isinstance(raw.get("couple"), dict) and len(raw) == 1:
        tables = raw["couple"]
        if len(tables) != 1:
            raise LibraryError([Problem(path, None, None, None, f"holds {len(tables)} couple tables; expected one")])
        (sid, fields), = tables.items()
        if couple_id is not None and couple_id != sid:
            raise LibraryError([Problem(path, index.couple_line(sid), sid, None,
                                        f"id differs from --id {couple_id}; expected the same id (or leave out --id)")])
        return fields, sid, index.couples.get(sid)
    return raw, couple_id, None


def run_add(args) -> int:
    from ..core.potential_scales import builtin_scales
    from ..core.solvents import solvent_table
    from ..library.couple_edits import add_couple
    from ..library.schema import FIELD_SPECS, parse_field_text
    from ..library.toml_reader import read_library_file
    from ..library.validation import ValidationContext, validate_couple

    path = Path(args.file)
    if not path.parent.is_dir():
        raise CrossrateError(f"{path}: folder {path.parent} does not exist; expected an existing folder for the "
                             "library file (nothing was written)")
    known = _bundled_scales()
    if path.exists():
        lf = read_library_file(path, known_scales=known)
        sha, defaults, scales = lf.sha256, lf.defaults, {**known, **lf.scales}
    else:
        sha, defaults, scales = None, {}, known
    raw, couple_id, span, where = {}, args.couple_id, None, "command line"
    if args.from_toml:
        raw, couple_id, span = _snippet(args.from_toml, couple_id)
        where = args.from_toml
        if not isinstance(raw, dict):
            raise LibraryError([Problem(where, span.line if span else None, couple_id, None,
                                        "not a table; expected the couple's fields")])
        raw = dict(raw)
    if not couple_id:
        raise CrossrateError("library add: no id; expected --id ID (or a [couple.<id>] table in --from-toml)")
    problems = []
    unreadable = set()
    for s in FIELD_SPECS:
        text = getattr(args, _FIELD_DEST + s.name)
        if text is None:
            continue
        try:
            raw[s.name] = parse_field_text(s.name, text)
        except ValueError as exc:
            problems.append(Problem("command line", None, couple_id, s.name, f"{_field_option(s.name)}: {exc}"))
            unreadable.add(s.name)
        if raw.get(s.name) is None:
            raw.pop(s.name, None)
    ctx = ValidationContext(where, "cli", defaults, frozenset(builtin_scales()) | frozenset(scales),
                            frozenset(solvent_table()))
    res = validate_couple(couple_id, raw, ctx, span, None)
    if isinstance(res, list):
        # A value given as an option came from the command line, not from the snippet file.
        given = {s.name for s in FIELD_SPECS if getattr(args, _FIELD_DEST + s.name) is not None}
        problems += [Problem("command line", None, p.couple, p.field, p.message)
                     if p.field in given and where != "command line" else p
                     for p in res if p.field not in unreadable]
    if problems:
        raise LibraryError(problems)
    add_couple(path, res, sha, known_scales=scales)
    print(f"added couple {couple_id} to {path}" + ("" if sha is None else f" (previous version kept as {_bak(path)})"))
    return 0


def _bak(path) -> str:
    """Where the previous version went: beside the file itself (beside the target of a symbolic link)."""
    from ..library.safe_writer import backup_path

    p = Path(path)
    return str(backup_path(Path(os.path.realpath(p)) if p.is_symlink() else p))


def _require_couple(lf, path, couple_id: str) -> None:
    """CrossrateError naming the file (and the closest id) when it holds no couple `couple_id`."""
    if lf.couple(couple_id) is not None:
        return
    from ..library.schema import closest

    hint = closest(couple_id, [c.id for c in lf.couples])
    raise CrossrateError(f"{path}: no couple {couple_id!r} in this file"
                         + (f"; did you mean {hint}?" if hint else "; expected the id of one of its couples")
                         + " (nothing was changed)")


def run_rename(args) -> int:
    from ..library.couple_edits import rename_couple
    from ..library.toml_reader import read_library_file

    known = _bundled_scales()
    lf = read_library_file(args.file, known_scales=known)
    _require_couple(lf, args.file, args.old_id)
    rename_couple(args.file, args.old_id, args.new_id, lf.sha256, known_scales=known)
    print(f"renamed couple {args.old_id} to {args.new_id} in {args.file}")
    return 0


def run_remove(args) -> int:
    from ..library.couple_edits import remove_couple
    from ..library.toml_reader import read_library_file

    known = _bundled_scales()
    lf = read_library_file(args.file, known_scales=known)
    _require_couple(lf, args.file, args.couple_id)
    remove_couple(args.file, args.couple_id, lf.sha256, known_scales=known)
    print(f"removed couple {args.couple_id} from {args.file} (previous version kept as {_bak(args.file)})")
    return 0

