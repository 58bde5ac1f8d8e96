"""Add, update, rename and remove a couple in a library file: the edit API the CLI and the TUI use.

Each call takes the sha256 of the file as the caller read it (LibraryFile.sha256) and returns the sha256
of the file after the edit. An edit touches only the couple's own table (table_editor), the new text is
validated before anything is written, the rest of the file is checked to parse to exactly what it was,
and the write itself is atomic and refused if the file changed since it was read (safe_writer).
"""

import os
from pathlib import Path

from ..core.potential_scales import PotentialScale
from ..errors import ConflictError
from .couple import Couple
from .safe_writer import SafeWriter
from .schema import FIELD_SPECS, FORMAT_VERSION
from .table_editor import TableEditError, TableEditor, format_value, same_value
from .toml_loads import loads
from .toml_reader import gc_paused, parse_library_text, read_library_bytes, sha256_of
from .validation import bad_id_message


def couple_to_values(couple: Couple, defaults: dict | None = None, existing: dict | None = None) -> dict:
    """TOML values of a couple's table, in field order.

    defaults: the file's [library] defaults (a field equal to its default is left out of a new table);
    existing: the table as it is in the file (a field it has is kept even when empty or default, and a
    field it lacks is not added just to spell out a default). A new table always states `verified`.
    """
    defaults = defaults or {}
    out = {}
    for spec in FIELD_SPECS:
        n = spec.name
        v = getattr(couple, n)
        if n == "bonds":
            v = [{"count": b.count, "delta_d": b.delta_d, "f_ox": b.f_ox, "f_red": b.f_red} for b in v]
        elif n == "tags":
            v = list(v)
        if v is None:
            continue
        if existing is not None and n in existing:
            out[n] = v
            continue
        if (n == "notes" and v == "") or (n in ("tags", "bonds") and not v):
            continue
        if spec.library_default and n in defaults and same_value(defaults[n], v):
            continue
        if n == "verified" and existing is not None and v is False:
            continue
        if n == "invented" and v is False:
            continue  # only made-up couples say so; a real couple's table is not cluttered with it
        out[n] = v
    return out


def _read(path: Path, expected_sha256: str | None) -> str | None:
    """The file's text (None when it does not exist and expected_sha256 is None), after a first check
    that it is still the version the caller read (the writer checks again under the lock)."""
    if expected_sha256 is None and not path.exists():
        return None
    data = read_library_bytes(path)
    if expected_sha256 is None:
        raise ConflictError(f"{path}: exists already; nothing was written: read it first and make the edit again")
    if sha256_of(data) != expected_sha256:
        raise ConflictError(f"{path}: changed on disk since it was read (edited by someone else or another "
                            "program); nothing was written: reload the file and make the edit again")
    return data.decode("utf-8")


def _raw(text: str):
    try:
        with gc_paused():
            return loads(text)
    except ValueError:
        return None


def _defaults(raw) -> dict:
    lib = raw.get("library") if isinstance(raw, dict) else None
    return {k: lib[k] for k in ("medium", "temperature", "E_scale") if isinstance(lib, dict) and k in lib}


def _check_rest_kept(old_raw, new_raw, path: Path, changed: set[str], renamed: dict[str, str] | None = None):
    """Refuse an edit whose text would change anything but the couples it is meant to change (a safety
    net over the text-level editor: e.g. a table boundary misread inside an unusual multi-line value).
    Plain == on the parsed documents: the untouched tables are the same text, so they parse the same."""
    if old_raw is None:
        return
    old_rest = {k: v for k, v in old_raw.items() if k != "couple"}
    new_rest = {k: v for k, v in new_raw.items() if k != "couple"}
    old_c = dict(old_raw.get("couple", {}))
    new_c = dict(new_raw.get("couple", {}))
    if renamed:
        old_c = {renamed.get(k, k): v for k, v in old_c.items()}
    for cid in changed:
        old_c.pop(cid, None)
        new_c.pop(cid, None)
    if not (old_rest == new_rest and old_c == new_c and list(old_c) == list(new_c)):
        raise TableEditError(f"{path}: the edit would also change other parts of the file (an unusual layout "
                             "crossrate cannot edit safely); nothing was written: edit the file by hand")


def _writer(path: Path, known_scales, old_raw, changed: set[str], renamed: dict[str, str] | None = None) -> SafeWriter:
    """A SafeWriter whose check of the new text is: it validates (LibraryError otherwise), and it parses to the
    old document except for the couples being edited (TableEditError otherwise)."""

    def validate(text: str):
        lf = parse_library_text(text, str(path), known_scales=known_scales)
        _check_rest_kept(old_raw, lf.raw, path, changed, renamed)
        return lf

    return SafeWriter(path, validate=validate)


def _new_file_text(path: Path) -> str:
    title = path.stem.replace('"', "'")
    return f"[library]\ntitle = {format_value(title)}\nformat = {FORMAT_VERSION}\n"


def _check_id(couple_id: str, path: Path) -> None:
    bad = bad_id_message(couple_id)
    if bad:
        raise TableEditError(f"{path}: couple {couple_id}: {bad}")


def add_couple(path, couple: Couple, expected_sha256: str | None,
               known_scales: dict[str, PotentialScale] | None = None) -> str:
    """Append a new couple table. expected_sha256=None creates the file (it must not exist yet).
    Returns the new sha256. Raises ConflictError, LibraryError (the result would not validate),
    TableEditError (id taken or not allowed), LibraryWriteError."""
    p = Path(os.fspath(path))
    _check_id(couple.id, p)
    text = _read(p, expected_sha256)
    if text is None:
        text = _new_file_text(p)
    raw = _raw(text)
    new_text = TableEditor(text).insert(couple.id, couple_to_values(couple, _defaults(raw)))
    return _writer(p, known_scales, raw, {couple.id}).write(new_text, expected_sha256)


def put_couples(path, couples: list[Couple], expected_sha256: str | None,
                known_scales: dict[str, PotentialScale] | None = None) -> str:
    """Add several couples in one checked write: a couple whose id the file has rewrites that table (as
    update_couple, its comments and unchanged lines kept), the others are appended in the order given.
    expected_sha256=None creates the file (it must not exist yet). Returns the new sha256; raises as add_couple."""
    p = Path(os.fspath(path))
    for c in couples:
        _check_id(c.id, p)
    text = _read(p, expected_sha256)
    if text is None:
        text = _new_file_text(p)
    raw = _raw(text)
    defaults = _defaults(raw)
    tables = raw.get("couple") if raw is not None and isinstance(raw.get("couple"), dict) else {}
    present = set(TableEditor(text).index.couples)
    new = []
    for c in couples:
        if c.id in present:
            existing = tables.get(c.id)
            values = couple_to_values(c, defaults, existing if isinstance(existing, dict) else {})
            text = TableEditor(text).replace(c.id, values)
        else:
            new.append((c.id, couple_to_values(c, defaults)))
    text = TableEditor(text).insert_many(new)
    return _writer(p, known_scales, raw, {c.id for c in couples}).write(text, expected_sha256)


def update_couple(path, couple: Couple, expected_sha256: str,
                  known_scales: dict[str, PotentialScale] | None = None) -> str:
    """Rewrite the table of couple.id to hold this couple's values (unchanged lines and comments kept)."""
    p = Path(os.fspath(path))
    text = _read(p, expected_sha256)
    raw = _raw(text)
    existing = None
    if raw is not None and isinstance(raw.get("couple"), dict):
        existing = raw["couple"].get(couple.id)
    values = couple_to_values(couple, _defaults(raw), existing if isinstance(existing, dict) else {})
    new_text = TableEditor(text).replace(couple.id, values)
    return _writer(p, known_scales, raw, {couple.id}).write(new_text, expected_sha256)


def rename_couple(path, old_id: str, new_id: str, expected_sha256: str,
                  known_scales: dict[str, PotentialScale] | None = None) -> str:
    """Change a couple's id (its header line only)."""
    p = Path(os.fspath(path))
    _check_id(new_id, p)
    text = _read(p, expected_sha256)
    raw = _raw(text)
    new_text = TableEditor(text).rename(old_id, new_id)
    return _writer(p, known_scales, raw, set(), {old_id: new_id}).write(new_text, expected_sha256)


def remove_couple(path, couple_id: str, expected_sha256: str,
                  known_scales: dict[str, PotentialScale] | None = None) -> str:
    """Delete a couple's table (the previous version stays in <file>.bak)."""
    p = Path(os.fspath(path))
    text = _read(p, expected_sha256)
    raw = _raw(text)
    new_text = TableEditor(text).remove(couple_id)
    return _writer(p, known_scales, raw, {couple_id}).write(new_text, expected_sha256)
