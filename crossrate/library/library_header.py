"""The `[library]` table of a library file: title, format, couple defaults and custom potential scales.

A custom scale is `[library.scales.<key>]` with name, relative_to, offset_V and source:
E(vs relative_to) = E(vs key) + offset_V. Leaving out offset_V makes the scale unrelated to every other
(its own root): potentials on it are never combined with potentials on another root (see
core/potential_scales.py).
"""

from dataclasses import dataclass, field

from ..core.potential_scales import PotentialScale, ScaleRegistry, builtin_scales
from ..core.solvents import solvent_table
from ..errors import Problem
from .line_index import LineIndex
from .schema import (
    FIELDS_BY_NAME,
    FORMAT_VERSION,
    LIBRARY_KEYS,
    SCALE_KEY_CHARS,
    SCALE_KEYS,
    closest,
)
from .validation import describe, is_finite_number

_TOP_KEYS = ("library", "couple")


@dataclass(frozen=True)
class LibraryHeader:
    """What the `[library]` table says. defaults: medium / temperature (K) / E_scale for couples that
    leave them out; scales: the file's own potential scales by key."""

    title: str
    format: int
    description: str = ""
    defaults: dict = field(default_factory=dict)
    scales: dict[str, PotentialScale] = field(default_factory=dict)


def _line(index: LineIndex, key: tuple[str, ...], name: str | None = None) -> int | None:
    span = index.table(*key)
    if span is None:
        return None
    if name is not None:
        for k, ln in span.fields:
            if k == name:
                return ln
    return span.line


def check_top_level(raw: dict, path: str, index: LineIndex) -> list[Problem]:
    """Problems with keys outside [library] and [couple.*]."""
    problems = []
    top_lines = dict(index.top_fields)
    for k in raw:
        if k in _TOP_KEYS:
            continue
        hint = closest(k, _TOP_KEYS)
        did = f" (did you mean [{hint}]?)" if hint else ""
        line = top_lines.get(k) or next((t.line for t in index.tables if t.key[0] == k), None)
        problems.append(Problem(path, line, None, None, f"unknown top-level key or table {k!r}{did}; "
                                "expected only a [library] table and [couple.<id>] tables"))
    return problems


def read_library_header(raw: dict, path: str, index: LineIndex,
                        known_scales: dict[str, PotentialScale] | None = None
                        ) -> tuple[LibraryHeader, list[Problem]]:
    """Check the [library] table. known_scales: scales of earlier layers that this file may refer to."""
    problems: list[Problem] = []
    lib = raw.get("library")
    stem = path.rsplit("/", 1)[-1]
    if lib is None:
        problems.append(Problem(path, 1, None, None, f"no [library] table; expected [library] with "
                                f"format = {FORMAT_VERSION} (and a title) at the top of the file"))
        return LibraryHeader(stem, FORMAT_VERSION), problems
    if type(lib) is not dict:
        problems.append(Problem(path, dict(index.top_fields).get("library"), None,
                                "library", f"got {describe(lib)}; expected a [library] table"))
        return LibraryHeader(stem, FORMAT_VERSION), problems

    def bad(name, message, key=("library",)):
        problems.append(Problem(path, _line(index, key, name.split(".")[-1]), None,
                                ".".join(key + (name,)), message))

    for k in lib:
        if k not in LIBRARY_KEYS:
            hint = closest(k, LIBRARY_KEYS)
            did = f" (did you mean {hint}?)" if hint else ""
            if k in FIELDS_BY_NAME:
                did = f" ({k} is a couple field, not a library default)"
            bad(k, f"unknown key{did}; expected one of {', '.join(LIBRARY_KEYS)}")
    title = lib.get("title", stem)
    if type(title) is not str:
        bad("title", f"got {describe(title)}; expected text in quotes")
        title = stem
    description = lib.get("description", "")
    if type(description) is not str:
        bad("description", f"got {describe(description)}; expected text in quotes")
        description = ""
    fmt = lib.get("format")
    if fmt is None:
        problems.append(Problem(path, _line(index, ("library",)), None, "library.format",
                                f"missing; expected format = {FORMAT_VERSION}"))
    elif type(fmt) is not int or fmt != FORMAT_VERSION:
        newer = " (a newer crossrate wrote this file?)" if type(fmt) is int and fmt > FORMAT_VERSION else ""
        bad("format", f"got {describe(fmt)}{newer}; expected {FORMAT_VERSION}")

    scales = _read_scales(lib.get("scales"), path, index, known_scales or {}, problems)
    known = set(builtin_scales()) | set(known_scales or {}) | set(scales)
    defaults = {}
    if "medium" in lib:
        m = lib["medium"]
        media = solvent_table()
        if type(m) is not str or m not in media:
            hint = closest(m, media) if type(m) is str else None
            did = f' (did you mean "{hint}"?)' if hint else ""
            bad("medium", f"got {describe(m)}{did}; expected one of {', '.join(sorted(media))}")
        else:
            defaults["medium"] = m
    if "temperature" in lib:
        t = lib["temperature"]
        spec = FIELDS_BY_NAME["temperature"]
        if not is_finite_number(t) or not spec.in_range(t):
            bad("temperature", f"got {describe(t)}; expected {spec.expected()}")
        else:
            defaults["temperature"] = float(t)
    if "E_scale" in lib:
        s = lib["E_scale"]
        if type(s) is not str or s not in known:
            hint = closest(s, known) if type(s) is str else None
            did = f' (did you mean "{hint}"?)' if hint else ""
            bad("E_scale", f"got {describe(s)}{did}; expected one of {', '.join(sorted(known))}")
        else:
            defaults["E_scale"] = s
    return LibraryHeader(title, FORMAT_VERSION, description, defaults, scales), problems


def _read_scales(raw, path, index, known_scales, problems) -> dict[str, PotentialScale]:
    if raw is None:
        return {}
    if type(raw) is not dict:
        problems.append(Problem(path, _line(index, ("library",), "scales"), None, "library.scales",
                                f"got {describe(raw)}; expected [library.scales.<key>] tables"))
        return {}
    builtins = builtin_scales()
    out: dict[str, PotentialScale] = {}
    for key, entry in raw.items():
        where = ("library", "scales", key)

        def bad(name, message, where=where):
            problems.append(Problem(path, _line(index, where, name) or _line(index, ("library",)), None,
                                    ".".join(where + ((name,) if name else ())), message))

        if not key or not SCALE_KEY_CHARS.issuperset(key):
            bad(None, "bad scale key; expected letters, digits, '.', '_', '-' and '+' only")
            continue
        if key in builtins:
            bad(None, f"redefines the built-in scale {key}; expected a new key (built in: {', '.join(builtins)})")
            continue
        if type(entry) is not dict:
            bad(None, f"got {describe(entry)}; expected a [library.scales.{key}] table")
            continue
        ok = True
        for k in entry:
            if k not in SCALE_KEYS:
                hint = closest(k, SCALE_KEYS)
                did = f" (did you mean {hint}?)" if hint else ""
                bad(k, f"unknown key{did}; expected one of {', '.join(SCALE_KEYS)}")
                ok = False
        for k in ("name", "source", "relative_to"):
            if k in entry and type(entry[k]) is not str:
                bad(k, f"got {describe(entry[k])}; expected text in quotes")
                ok = False
        offset = entry.get("offset_V")
        if offset is not None and (not is_finite_number(offset) or abs(offset) > 5):
            bad("offset_V", f"got {describe(offset)}; expected a finite number from -5 to 5 V")
            ok = False
        rel = entry.get("relative_to")
        if offset is not None and rel is None:
            bad("relative_to", "missing while offset_V is given; expected the key of the scale the offset is "
                "measured against, e.g. \"SHE\"")
            ok = False
        if not ok:
            continue
        if offset is None:
            # no offset: a root of its own, never combined with other roots
            out[key] = PotentialScale(key, entry.get("name", key), "", 0.0, entry.get("source", ""))
        else:
            out[key] = PotentialScale(key, entry.get("name", key), rel, float(offset), entry.get("source", ""))
    # relative_to must name a known scale, and the definitions must not loop
    known = {**builtins, **known_scales, **out}
    registry = ScaleRegistry({**known_scales, **out})
    for key, sc in list(out.items()):
        if sc.relative_to and sc.relative_to not in known:
            hint = closest(sc.relative_to, known)
            did = f' (did you mean "{hint}"?)' if hint else ""
            problems.append(Problem(path, _line(index, ("library", "scales", key), "relative_to"), None,
                                    f"library.scales.{key}.relative_to",
                                    f'unknown scale "{sc.relative_to}"{did}; expected one of {", ".join(sorted(known))}'))
            del out[key]
            continue
        try:
            registry.resolve(key)
        except ValueError as exc:
            problems.append(Problem(path, _line(index, ("library", "scales", key), "relative_to"), None,
                                    f"library.scales.{key}.relative_to", f"{exc}; expected a chain ending at a root"))
            del out[key]
    return out
