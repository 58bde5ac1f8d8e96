"""`crossrate library diff OLD NEW` (or `diff FILE --rev REV`): couples added, removed and changed field by
field, and with --predictions how far the predicted rates move. A thin face over library.couple_diff,
library.library_source and services.rate_shifts."""

import json
import sys

from .common_options import (
    add_condition_options,
    add_library_option,
    conditions_from_args,
    load_set,
)


def register(sub) -> None:
    """Add `diff` to the `library` subcommands."""
    p = sub.add_parser(
        "diff", help="what changed between two versions of a library file (and how far predicted rates move)",
        description="Compare two versions of a library file: OLD and NEW are files, or git revisions written "
        "REV:PATH (e.g. HEAD~1:group.toml, read with `git show`); `diff FILE --rev REV` compares FILE as "
        "committed in REV with FILE as it is now. Lists the couples added, removed and changed, field by "
        "field with units. --predictions adds how far log10 k_obs of the cross reactions moves (largest "
        "first): every ordered pair in which a changed couple takes part, with the couples of the layered set "
        "(bundled, group, personal, --library) as partners, or the pairs given with --pair.",
    )
    p.add_argument("old", metavar="OLD", help="old version: a file or REV:PATH")
    p.add_argument("new", metavar="NEW", nargs="?", help="new version: a file or REV:PATH (with --rev: leave out)")
    p.add_argument("--rev", metavar="REV", help="compare OLD as committed in git revision REV with OLD as it is now")
    p.add_argument("--predictions", action="store_true", help="also show how far predicted rates move")
    p.add_argument("--pair", action="append", default=[], metavar="OX:RED",
                   help="with --predictions: only this oxidant:reductant pair (repeatable)")
    p.add_argument("--top", type=int, default=20, metavar="N", help="with --predictions: show the N largest "
                   "moves (default 20; 0 for all)")
    p.add_argument("--format", choices=("text", "json"), default="text", help="output form (default text)")
    add_library_option(p)
    add_condition_options(p)
    p.set_defaults(func=run_diff)


def _value(v, unit: str) -> str:
    from ..errors import printable

    if v is None or v == () or v == "":
        return "(absent)"
    if isinstance(v, tuple) and v and hasattr(v[0], "delta_d"):
        text = "; ".join(f"{b.count} x (delta_d {b.delta_d:g}, f_ox {b.f_ox:g}, f_red {b.f_red:g})" for b in v)
    elif isinstance(v, tuple):
        text = ", ".join(v)
    elif isinstance(v, bool):
        text = "true" if v else "false"
    elif isinstance(v, float):
        text = f"{v:.6g}"
    else:
        text = str(v)
    return printable(f"{text} {unit}".strip() if unit and not isinstance(v, tuple) else text, keep_newlines=False)


def _pairs(texts):
    from ..errors import CrossrateError

    out = []
    for t in texts:
        a, sep, b = t.partition(":")
        if not sep or not a or not b:
            raise CrossrateError(f"--pair {t}: expected OXIDANT:REDUCTANT, e.g. fe-aq:ru-nh3-6")
        out.append((a, b))
    return out


def _versions(args):
    from ..errors import CrossrateError
    from ..library.library_source import parse_source, read_source, revision_of
    from .library_cmd import _bundled_scales

    if args.rev is not None:
        if args.new is not None:
            raise CrossrateError("library diff: give FILE --rev REV, or OLD NEW; not both")
        old_src, new_src = revision_of(args.rev, args.old), read_source(args.old)
    elif args.new is None:
        raise CrossrateError("library diff: expected OLD NEW (files or REV:PATH), or FILE --rev REV")
    else:
        old_src, new_src = read_source(args.old), read_source(args.new)
    known = _bundled_scales()
    return parse_source(old_src, known), parse_source(new_src, known), known


def diff_lines(d) -> list[str]:
    """The diff as text lines."""
    from ..errors import printable

    out = [f"library diff {d.old_name} -> {d.new_name}"]
    if d.empty:
        return out + ["no couple or scale changed"]
    for c in d.added:
        out.append(printable(f"+ {c.id}  added (line {c.origin.line}): {c.name}", keep_newlines=False))
    for c in d.removed:
        out.append(printable(f"- {c.id}  removed (was line {c.origin.line}): {c.name}", keep_newlines=False))
    for ch in d.changed:
        out.append(f"~ {ch.couple_id}  changed (line {ch.old_line} -> {ch.new_line})")
        for f in ch.changes:
            out.append(f"    {f.name}: {_value(f.old, f.unit)} -> {_value(f.new, f.unit)}")
    out += [f"* {line}" for line in d.scales]
    out.append(f"{len(d.added)} added, {len(d.removed)} removed, {len(d.changed)} changed, {d.unchanged} unchanged")
    return out


def shift_lines(shifts, top: int) -> list[str]:
    """The rate moves as text lines (largest first)."""
    import math

    if not shifts:
        return ["predicted rates: no pair with a changed couple (nothing can move)"]
    moved = [s for s in shifts if math.isfinite(s.shift) and s.shift != 0.0]
    out = [f"predicted rates: {len(shifts)} ordered pairs compared, {len(moved)} move; log10 k_obs (M^-1 s^-1)"]
    shown = shifts if top == 0 else shifts[:top]
    w = max(len(f"{s.oxidant} + {s.reductant}") for s in shown)
    for s in shown:
        pair = f"{s.oxidant} + {s.reductant}"
        if math.isfinite(s.shift):
            out.append(f"  {pair:<{w}}  {s.old_log10_k:6.2f} -> {s.new_log10_k:6.2f}   {s.shift:+.2f}")
        elif math.isfinite(s.new_log10_k):
            out.append(f"  {pair:<{w}}  not computable -> {s.new_log10_k:6.2f} (was: {s.old_problem})")
        elif math.isfinite(s.old_log10_k):
            out.append(f"  {pair:<{w}}  {s.old_log10_k:6.2f} -> not computable ({s.new_problem})")
    if len(shown) < len(shifts):
        out.append(f"  ... {len(shifts) - len(shown)} more pairs (--top 0 shows all)")
    out.append("Predictions are estimates, not a safety assessment: follow your lab's safety rules and local "
               "regulations.")
    return out


def run_diff(args) -> int:
    from ..library.couple_diff import diff_libraries

    old_lf, new_lf, _ = _versions(args)
    d = diff_libraries(old_lf.couples, new_lf.couples, old_lf.scales, new_lf.scales, old_lf.path, new_lf.path)
    shifts = None
    if args.predictions:
        from ..services.rate_shifts import overlay, rate_shifts

        context = load_set(args, allow_empty=True)
        old_set = overlay(context, old_lf.couples, old_lf.scales)
        new_set = overlay(context, new_lf.couples, new_lf.scales)
        changed = {c.couple_id for c in d.changed}
        shifts = rate_shifts(old_set, new_set, _pairs(args.pair) or None, conditions_from_args(args),
                             only_ids=None if d.scales else changed)
    if args.format == "json":
        data = {"old": d.old_name, "new": d.new_name,
                "added": [c.id for c in d.added], "removed": [c.id for c in d.removed],
                "changed": [{"id": ch.couple_id, "fields": [
                    {"name": f.name, "old": _json(f.old), "new": _json(f.new), "unit": f.unit} for f in ch.changes]}
                    for ch in d.changed],
                "unchanged": d.unchanged, "scales": list(d.scales),
                "rate_shifts": None if shifts is None else [s.to_dict() for s in shifts]}
        sys.stdout.write(json.dumps(data, indent=2, allow_nan=False) + "\n")
        return 0
    lines = diff_lines(d)
    if shifts is not None:
        lines += [""] + shift_lines(shifts, args.top)
    print("\n".join(lines))
    return 0


def _json(v):
    import datetime

    if isinstance(v, tuple):
        return [x if not hasattr(x, "delta_d") else {"count": x.count, "delta_d": x.delta_d, "f_ox": x.f_ox,
                                                      "f_red": x.f_red} for x in v]
    if isinstance(v, datetime.date):
        return v.isoformat()
    return v
