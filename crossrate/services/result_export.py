"""Results that leave the workbench: the JSON the command line writes with `--format json` (one function for
both, so they are the same), and text and Markdown that name the library files and their sha256 so the result
can be reproduced from the same data later.

result: a Prediction, a PairCheck, a CheckReport or a RateMap (anything with to_dict()).
"""

import json
import math
from datetime import UTC, datetime

from ..errors import CrossrateError

#: Export formats and their usual file extensions.
FORMATS = ("text", "markdown", "json")
EXTENSIONS = {"text": ".txt", "markdown": ".md", "json": ".json"}
CAUTION = ("Predictions are estimates, not a safety assessment; follow your lab's safety rules and local "
           "regulations when handling strong oxidants and reductants.")


def result_json(result, indent: int | None = 2) -> str:
    """The result as JSON text, exactly as `crossrate predict|check|map --format json` prints it."""
    return json.dumps(result.to_dict(), indent=indent, allow_nan=False) + "\n"


def format_for_path(path: str) -> str:
    """The export format a file name asks for: .md/.markdown -> markdown, .json -> json, otherwise text."""
    low = str(path).lower()
    if low.endswith((".md", ".markdown")):
        return "markdown"
    if low.endswith(".json"):
        return "json"
    return "text"


def library_files(couple_set, ids=None) -> list[tuple[str, str]]:
    """(path, sha256 hex of the content the set was read from) of the files holding the couples `ids` (every
    file of the set when None), in the set's file order; the hash is computed now for a file the set does not
    know the hash of."""
    paths: list[str] = []
    wanted = None if ids is None else set(ids)
    for c in couple_set:
        if c.origin is not None and (wanted is None or c.id in wanted) and c.origin.path not in paths:
            paths.append(c.origin.path)
    known = getattr(couple_set, "file_sha256", {}) or {}
    out = []
    for p in paths:
        sha = known.get(p)
        if sha is None:
            from ..library.toml_reader import read_library_bytes, sha256_of

            try:
                sha = sha256_of(read_library_bytes(p))
            except CrossrateError:  # gone since it was loaded: the saved result says so
                sha = "(file not readable now)"
        out.append((p, sha))
    return out


def _value_text(v) -> str:
    if v is None:
        return "-"
    if isinstance(v, bool):
        return "true" if v else "false"
    if isinstance(v, float):
        return f"{v:.6g}" if math.isfinite(v) else "-"
    return str(v)


def flat_rows(d, prefix: str = "") -> list[tuple[str, str]]:
    """A to_dict() result as (key, value text) rows: nested tables as 'a.b', list items as 'a.1'; a list of
    plain values on one row."""
    rows: list[tuple[str, str]] = []
    if isinstance(d, dict):
        for k, v in d.items():
            rows += flat_rows(v, f"{prefix}.{k}" if prefix else str(k))
    elif isinstance(d, list) and any(isinstance(x, (dict, list)) for x in d):
        for n, v in enumerate(d, 1):
            rows += flat_rows(v, f"{prefix}.{n}")
    elif isinstance(d, list):
        rows.append((prefix, ", ".join(_value_text(x) for x in d)))
    else:
        rows.append((prefix, _value_text(d)))
    return rows


def _map_table(rate_map) -> tuple[list[str], list[list[str]]]:
    """(header, rows) of a RateMap: oxidants down, reductants across, log10 k_obs with two decimals."""
    head = ["ox \\ red (log10 k_obs / M^-1 s^-1)", *rate_map.ids]
    body = []
    for i, ox in enumerate(rate_map.ids):
        vals = [float(rate_map.log10_k_obs[i, j]) for j in range(len(rate_map.ids))]
        body.append([ox, *(f"{v:.2f}" if math.isfinite(v) else "-" for v in vals)])
    return head, body


def export_text(result, fmt: str, title: str, couple_set, ids=None, when: datetime | None = None) -> str:
    """The result as `fmt` ('text', 'markdown' or 'json'). Text and Markdown carry a title, the time, every
    value of the result (a map as its matrix), the library files with their sha256, and the caution; JSON is
    result_json(result) (a map unindented, as `crossrate map --format json` writes it)."""
    from .. import __version__

    if fmt == "json":
        is_map = hasattr(result, "log10_k_obs") and hasattr(result, "ids")
        return result_json(result, indent=None if is_map else 2)
    if fmt not in FORMATS:
        raise ValueError(f"format {fmt!r}: expected one of {', '.join(FORMATS)}")
    stamp = (when or datetime.now(UTC)).strftime("%Y-%m-%d %H:%M UTC")
    files = library_files(couple_set, ids) if couple_set is not None else []
    if hasattr(result, "log10_k_obs") and hasattr(result, "ids"):
        head, body = _map_table(result)
        conditions = [(k, v) for k, v in flat_rows(result.to_dict()) if k.startswith(("conditions", "medium"))]
    else:
        head, body = ["quantity", "value"], [list(r) for r in flat_rows(result.to_dict())]
        conditions = []
    md = fmt == "markdown"
    out = [f"# {title}" if md else title, "", f"crossrate {__version__}, saved {stamp}", ""]
    for k, v in conditions:
        out.append(f"- {k}: {v}" if md else f"{k}: {v}")
    if conditions:
        out.append("")
    if md:
        out.append("| " + " | ".join(h.replace("|", "\\|") for h in head) + " |")
        out.append("|" + "---|" * len(head))
        out += ["| " + " | ".join(c.replace("|", "\\|") for c in row) + " |" for row in body]
    else:
        widths = [max(len(r[k]) for r in [head, *body]) for k in range(len(head))]
        out += ["  ".join(c.ljust(w) for c, w in zip(row, widths, strict=True)).rstrip() for row in [head, *body]]
    out += ["", "## Library files (sha256 of the content used)" if md else "library files (sha256 of the content used):"]
    out += [f"- `{p}` sha256 `{sha}`" if md else f"  {p}  sha256 {sha}" for p, sha in files] or ["  (none)"]
    out += ["", f"*{CAUTION}*" if md else CAUTION]
    return "\n".join(out) + "\n"
