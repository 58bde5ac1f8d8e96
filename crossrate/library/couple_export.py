"""Couples as plain records (for JSON and CSV) and as a self-contained library file (TOML export).

Records use the library's field names and units (V, M^-1 s^-1, angstrom, kJ/mol, M, K, eV), plus where
each couple came from (layer, path, line). The TOML export writes every field explicitly (no
[library] defaults) and the custom potential scales the couples need, so the file reads back alone.
"""

import csv
import io
import json

from ..core.potential_scales import ScaleRegistry, builtin_scales
from .couple import Couple
from .couple_edits import couple_to_values
from .schema import FIELD_SPECS, FORMAT_VERSION
from .spreadsheet_cells import spreadsheet_safe
from .table_editor import format_key, format_value, render_table

#: Keys of a record, in order.
RECORD_KEYS = ("id",) + tuple(s.name for s in FIELD_SPECS) + ("layer", "path", "line")


def couple_record(c: Couple) -> dict:
    """A JSON-ready dict of one couple (None where a field is absent; tags a list; bonds a list of dicts; the
    date as YYYY-MM-DD text)."""
    rec = {"id": c.id}
    for s in FIELD_SPECS:
        v = getattr(c, s.name)
        if s.name == "tags":
            v = list(v)
        elif s.name == "bonds":
            v = [{"count": b.count, "delta_d": b.delta_d, "f_ox": b.f_ox, "f_red": b.f_red} for b in v]
        elif s.name == "date" and v is not None:
            v = v.isoformat()
        rec[s.name] = v
    o = c.origin
    rec["layer"] = o.layer if o else None
    rec["path"] = o.path if o else None
    rec["line"] = o.line if o else None
    return rec


def records_json(records: list[dict]) -> str:
    """JSON text of records (no NaN or Infinity can occur: library values are validated finite)."""
    return json.dumps(records, indent=2, allow_nan=False) + "\n"


def tags_cell(tags) -> str:
    """Tags in one CSV cell: joined by '; ', or as a TOML list when a tag holds ';', starts with '[' or has
    spaces at either end (so `library import` reads back exactly the same tags)."""
    tags = list(tags)
    if any(";" in t or t != t.strip() or t.startswith("[") for t in tags):
        return format_value(tags)
    return "; ".join(tags)


def records_csv(records: list[dict]) -> str:
    """CSV text with a header row; tags as tags_cell, bonds in their TOML inline form, absent = empty.
    `crossrate library import` reads this form back."""
    buf = io.StringIO()
    w = csv.DictWriter(buf, fieldnames=list(RECORD_KEYS), lineterminator="\n")
    # csv quotes a cell holding "\n" but not one holding a lone "\r", which readers take for a line end
    quoted = csv.DictWriter(buf, fieldnames=list(RECORD_KEYS), lineterminator="\n", quoting=csv.QUOTE_ALL)
    w.writeheader()
    for r in records:
        row = {}
        for k in RECORD_KEYS:
            v = r.get(k)
            if v is None:
                v = ""
            elif k == "tags":
                v = tags_cell(v)
            elif k == "bonds":
                v = format_value(v) if v else ""
            elif isinstance(v, bool):
                v = "true" if v else "false"
            row[k] = spreadsheet_safe(v)  # a name like =HYPERLINK(...) stays text
        (quoted if any("\r" in str(v) for v in row.values()) else w).writerow(row)
    return buf.getvalue()


def _scales_needed(couples, scales: ScaleRegistry) -> list[str]:
    builtin = builtin_scales()
    need: list[str] = []
    for c in couples:
        key = c.E_scale
        while key and key not in builtin and key in scales and key not in need:
            need.append(key)
            key = scales.get(key).relative_to
    return need


def export_toml(couples, scales: ScaleRegistry, title: str = "exported couples") -> str:
    """A complete library file holding these couples (every field written out) and their custom scales."""
    out = ["# Written by `crossrate library export --format toml`.", "", "[library]",
           f"title = {format_value(title)}", f"format = {FORMAT_VERSION}", ""]
    for key in _scales_needed(couples, scales):
        sc = scales.get(key)
        out.append(f"[library.scales.{format_key(key)}]")
        out.append(f"name = {format_value(sc.name)}")
        if sc.relative_to and sc.relative_to != key:
            out.append(f"relative_to = {format_value(sc.relative_to)}")
            out.append(f"offset_V = {format_value(float(sc.offset_V))}")
        if sc.source:
            out.append(f"source = {format_value(sc.source)}")
        out.append("")
    for c in couples:
        if c.origin is not None:
            out.append(f"# from the {c.origin.layer} layer: {c.origin.path}:{c.origin.line}")
        out += render_table(c.id, couple_to_values(c, None, None))
        out.append("")
    return "\n".join(out)
