"""`crossrate library audit [--check MEASURED.csv]`: which couples are invented, unverified or estimated, and
which of them the predictions of a measured-rates check file use. A thin face over services.library_audit."""

import json
import sys

from .common_options import add_library_option, load_set


def register(sub) -> None:
    """Add `audit` to the `library` subcommands."""
    p = sub.add_parser(
        "audit", help="list the invented, unverified and estimated couples (and those a check file relies on)",
        description="List the couples a reviewer should look at: invented (made-up values, '!'), unverified "
        "(recalled or estimated, not checked against the primary source, '?') and estimated (no measured "
        "k_self: the rate comes from a reorganization-energy estimate), with DOI, date and where each was "
        "read. With --check: which couples the predictions of that measured-rates file (the CSV of "
        "`crossrate check`) use, and how many of its rows rely on each kind.",
    )
    add_library_option(p)
    p.add_argument("--check", metavar="MEASURED.csv", help="measured-rates file (columns oxidant, reductant, "
                   "k_measured, ...) whose predictions' couples to list")
    p.add_argument("--all", action="store_true", help="list every couple, not only the flagged ones")
    p.add_argument("--format", choices=("table", "json"), default="table", help="output form (default table)")
    p.set_defaults(func=run_audit)


def _rows(audits, tail=None) -> list[str]:
    """One line per couple (mark, id, provenance, k_self basis, DOI, date, line), under one line per file."""
    from ..errors import printable
    from ..library.provenance import mark_of

    w = max(len(a.couple_id) for a in audits)
    out, path = [], None
    for a in audits:
        file, _, line = a.where.rpartition(":")
        if file != path:
            path = file
            out.append(printable(f"  {file} ({a.layer} layer)", keep_newlines=False))
        mark = mark_of(a.provenance) or " "
        extra = ", ".join(x for x in (f"doi {a.doi}" if a.doi else "no doi", a.date) if x)
        text = f"  {mark} {a.couple_id:<{w}}  {a.provenance:<10}  {a.k_self_basis}; {extra}; line {line}"
        out.append(printable(text + (tail(a) if tail else ""), keep_newlines=False))
    return out


def render_audit(report, show_all: bool) -> list[str]:
    """The audit as text lines: counts, the flagged (or all) couples, then the check file's use."""
    n = report.counts
    out = [f"{n['couples']} couples: {n['invented']} invented (!), {n['unverified']} unverified (?), "
           f"{n['estimated']} with an estimated k_self, {n['without_doi']} without a DOI"]
    listed = [a for a in report.couples if show_all or a.flagged]
    if listed:
        out += ["", "every couple:" if show_all else "couples to review (invented, unverified or estimated):"]
        out += _rows(listed)
    c = report.check
    if c is not None:
        out += ["", f"the {c.rows} predictions of {c.path} use {len(c.couples)} couples:"]
        if c.couples:
            out += _rows(c.couples, lambda a: f"; on lines {', '.join(map(str, a.check_lines))}")
        on = c.rows_on
        out.append(f"rows relying on an invented couple: {on['invented']} of {c.rows}; on an unverified one: "
                   f"{on['unverified']}; on an estimated k_self: {on['estimated']}")
        for line, cid in c.unknown:
            out.append(f"{c.path}:{line}: couple {cid!r} is not in the loaded library (the check would refuse it)")
    out += ["", "Predictions are estimates, not a safety assessment: follow your lab's safety rules and local "
            "regulations."]
    return out


def run_audit(args) -> int:
    from ..services.library_audit import audit_library

    cs = load_set(args)
    rows = None
    if args.check is not None:
        from ..services.measured_csv import read_measured_csv

        rows = read_measured_csv(args.check)
    report = audit_library(cs, rows, args.check)
    if args.format == "json":
        sys.stdout.write(json.dumps(report.to_dict(), indent=2, allow_nan=False) + "\n")
        return 0
    from .render_common import wrap_text

    for line in render_audit(report, args.all):
        # couple rows and file paths stay whole (a path is never broken); prose wraps
        print(line if line.startswith("  ") else "\n".join(wrap_text(line, subsequent="  ")))
    return 0
