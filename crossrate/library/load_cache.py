"""A cache of validated library files, keyed by the file's content: repeat loads skip parsing and validation.

`read_library_cached(path, layer, known_scales)` reads the file's bytes every time and looks for an entry
whose key is the sha256 of: those bytes, the file's absolute path, its layer, the potential scales of the
earlier layers it may use, and a fingerprint of the code and data the validation depends on (the
library package, the solvent and potential-scale tables, the Python version). Any change to any of
these gives another key, so an entry can never be stale: it is either for exactly this content and
this code, or it is not used. Entries live in `$XDG_CACHE_HOME/crossrate/library/` (`~/.cache/...` when
XDG_CACHE_HOME is unset); CROSSRATE_NO_CACHE=1 turns the cache off. The cache is only ever a shortcut:
a folder that is missing and cannot be made, read-only or full, an entry that is unreadable, not ours
or damaged, all fall back to a plain read, and a file with problems is never cached (its problems are
reported from a fresh read each time). When an entry is stored, the entries for older contents of the
same file are removed, so the folder holds one entry per library file.

Entries are pickles; one is loaded only when it and its folder are owned by the user running crossrate and
the folder is writable by no one else.
"""

import copyreg
import gc
import hashlib
import io
import os
import pickle
import stat
import sys
from functools import lru_cache
from pathlib import Path
from typing import NamedTuple

from ..core.potential_scales import PotentialScale
from .couple import Couple
from .line_index import IndexedOrigin, LineIndex

#: Version of the entries' layout; part of every key.
CACHE_LAYOUT = 1
NO_CACHE_ENV = "CROSSRATE_NO_CACHE"
#: Files whose content the validation result depends on (besides the library file itself).
_CODE_DIRS = ("library",)
_CODE_FILES = ("errors.py", "problem.py", "core/potential_scales.py", "core/solvents.py", "core/constants.py")
_DATA_DIR = "core/data"
_SUFFIX = ".pickle"


# A NamedTuple, not a frozen dataclass: an internal record on the path of every prediction, and Python 3.11
# compiles a dataclass's six methods at import (about 1 ms a class of a cold command; see DEVELOPERS.md).
class LoadedLibrary(NamedTuple):
    """What the layered loader needs of one valid library file.

    path, layer: as given; sha256: hex digest of the bytes read; title, description, defaults (medium,
    temperature K, E_scale), scales: the file's own potential scales; couples: in file order with origins;
    text: the file's text (for line numbers of anything not kept here).
    """

    path: str
    layer: str
    sha256: str
    title: str
    description: str
    defaults: dict
    scales: dict[str, PotentialScale]
    couples: list[Couple]
    text: str
    from_cache: bool = False

    def scale_line(self, key: str) -> int | None:
        """Line of the file's [library.scales.<key>] table (None when absent)."""
        span = LineIndex.scan(self.text).table("library", "scales", key)
        return span.line if span else None


def cache_dir() -> Path:
    """`$XDG_CACHE_HOME/crossrate/library`, or `~/.cache/crossrate/library`."""
    base = os.environ.get("XDG_CACHE_HOME") or os.path.join(os.path.expanduser("~"), ".cache")
    return Path(base) / "crossrate" / "library"


def cache_enabled() -> bool:
    return os.environ.get(NO_CACHE_ENV, "").strip() not in ("1", "true", "yes")


@lru_cache(maxsize=1)
def code_fingerprint() -> str:
    """sha256 over the Python version and, for each source and data table the validation depends on, its name,
    inode, size, and modification and status-change times (ns).

    Not over their content: hashing some 350 kB of source cost every cold command about 2 ms. Any change to
    one of these files is a write, which sets both times (a tool that restores the modification time, such
    as cp -p or tar, cannot restore the status-change time), and a reinstall makes new files (new inodes).
    """
    root = os.path.dirname(os.path.dirname(os.path.realpath(__file__)))
    files = []
    for folder, suffix in [(d, ".py") for d in _CODE_DIRS] + [(_DATA_DIR, ".csv")]:
        try:
            names = sorted(n for n in os.listdir(os.path.join(root, folder)) if n.endswith(suffix))
        except OSError:
            names = ["<missing>"]
        files += [f"{folder}/{n}" for n in names]
    files += _CODE_FILES
    h = hashlib.sha256(f"{CACHE_LAYOUT} {sys.version} {pickle.HIGHEST_PROTOCOL}".encode())
    for f in files:
        try:
            st = os.stat(os.path.join(root, f))
            h.update(f"{f} {st.st_ino} {st.st_size} {st.st_mtime_ns} {st.st_ctime_ns}\n".encode())
        except OSError:
            h.update(f"{f} <missing>\n".encode())
    return h.hexdigest()


def _scales_text(known_scales) -> str:
    return repr(sorted((k, v.name, v.relative_to, v.offset_V, v.source) for k, v in (known_scales or {}).items()))


def entry_name(abs_path: str, layer: str, content_sha256: str, known_scales) -> str:
    """File name of the entry: <path digest>-<key digest>.pickle (the first part groups one file's entries)."""
    where = hashlib.sha256(abs_path.encode("utf-8", "surrogatepass")).hexdigest()[:16]
    key = hashlib.sha256("\0".join((code_fingerprint(), content_sha256, abs_path, layer,
                                    _scales_text(known_scales))).encode("utf-8", "surrogatepass")).hexdigest()
    return f"{where}-{key[:40]}{_SUFFIX}"


class _Pickler(pickle.Pickler):
    """Pickles IndexedOrigin by its attributes (its own __reduce__ turns it into a plain Origin, which
    would scan every table's field lines now and rebuild each Origin through Python on load)."""

    def reducer_override(self, obj):
        if type(obj) is IndexedOrigin:
            return copyreg.__newobj__, (IndexedOrigin,), dict(obj.__dict__)
        return NotImplemented


def _owned_private(st: os.stat_result) -> bool:
    return st.st_uid == os.getuid() and not st.st_mode & (stat.S_IWGRP | stat.S_IWOTH)


def _load_entry(entry: Path, content_sha256: str, abs_path: str):
    """The pickled payload of an entry, or None when there is none or it cannot be trusted or read."""
    try:
        fd = os.open(entry, os.O_RDONLY | getattr(os, "O_NOFOLLOW", 0))
    except OSError:
        return None
    try:
        with os.fdopen(fd, "rb") as fh:
            # the folder (made 0o700) keeps others out; the entry must be ours
            if not (os.fstat(fh.fileno()).st_uid == os.getuid() and _owned_private(os.stat(entry.parent))):
                return None
            data = fh.read()
    except OSError:
        return None
    gc_was_enabled = gc.isenabled()
    gc.disable()  # as toml_reader.gc_paused: a load makes many small objects and no cycles
    try:
        payload = pickle.loads(data)
    except (pickle.UnpicklingError, EOFError, AttributeError, ImportError, IndexError, TypeError, ValueError,
            MemoryError):
        return None
    finally:
        if gc_was_enabled:
            gc.enable()
    if type(payload) is not tuple or len(payload) != 9 or payload[0] != CACHE_LAYOUT:
        return None
    if payload[1] != content_sha256 or payload[2] != abs_path:
        return None
    return payload


def _store_entry(folder: Path, name: str, payload: tuple) -> None:
    """Write an entry (atomically, through the safe writer's replace) and drop older entries of the
    same file. Any OSError (read-only or missing folder, full disk) leaves the cache as it was."""
    try:
        folder.mkdir(parents=True, exist_ok=True, mode=0o700)
        if not _owned_private(os.stat(folder)):
            return
        buf = io.BytesIO()
        _Pickler(buf, protocol=pickle.HIGHEST_PROTOCOL).dump(payload)
        from .safe_writer import replace_atomically

        replace_atomically(folder / name, buf.getvalue())
        prefix = name.split("-", 1)[0] + "-"
        for old in folder.glob(prefix + "*" + _SUFFIX):
            if old.name != name:
                old.unlink(missing_ok=True)
    except OSError:
        return


def read_library_cached(path, layer: str = "cli",
                        known_scales: dict[str, PotentialScale] | None = None) -> LoadedLibrary:
    """Read and validate one library file, through the content-keyed cache when it has this content.

    Same arguments and errors as toml_reader.read_library_file (LibraryError listing every problem).
    """
    p = os.fspath(path)
    try:
        with open(p, "rb") as fh:
            data = fh.read()
    except OSError:
        data = None
    if data is None:
        from .toml_reader import read_library_bytes

        data = read_library_bytes(p)  # raises with the reader's own words (or the file appeared since)
    sha = hashlib.sha256(data).hexdigest()
    abs_path = os.path.abspath(p)
    use_cache = cache_enabled()
    folder = cache_dir()
    name = entry_name(abs_path, layer, sha, known_scales) if use_cache else ""
    if use_cache:
        payload = _load_entry(folder / name, sha, abs_path)
        if payload is not None:
            _, _, _, title, description, defaults, scales, couples, text = payload
            return LoadedLibrary(p, layer, sha, title, description, defaults, scales, couples, text, True)
    from .toml_reader import parse_library_text, read_library_file

    try:
        text = data.decode("utf-8")
    except UnicodeDecodeError:
        read_library_file(p, layer, known_scales)  # raises, with the reader's own words for the encoding
        raise
    lf = parse_library_text(text, p, layer, known_scales, sha)
    if use_cache:
        _store_entry(folder, name, (CACHE_LAYOUT, sha, abs_path, lf.title, lf.description, lf.defaults,
                                    lf.scales, lf.couples, lf.text))
    return LoadedLibrary(p, layer, sha, lf.title, lf.description, lf.defaults, lf.scales, lf.couples, lf.text)

