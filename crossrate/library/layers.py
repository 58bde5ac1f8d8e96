"""The layered couple set: the bundled starter library, the invented demo (only when asked for), then the
group's library, a personal one, then --library files.

A couple in a later layer replaces (shadows) one of the same id from an earlier layer; every shadowing
is recorded. Where the files are:
- bundled: `starter.toml` of the bundled libraries (see `bundled_dir`), left out with starter=False;
- demo: `demo.toml` beside it, the invented Halden Lake couples, read only with demo=True (never by default:
  invented numbers must not creep into real predictions);
- group: the paths in the environment variable CROSSRATE_GROUP_LIBRARY (several separated by ':'), else
  `group_library` (a path or a list of paths) in `$XDG_CONFIG_HOME/crossrate/config.toml`
  (`~/.config/crossrate/config.toml` when XDG_CONFIG_HOME is unset); a configured group file that does not
  exist is an error (a share not mounted should not go unnoticed);
- personal: CROSSRATE_PERSONAL_LIBRARY, else `personal_library` in the config file, else
  `personal.toml` beside the config file; a personal file that does not exist yet is skipped;
- cli: the paths given with --library, in order.
Relative paths in the config file are relative to the config file's folder. A file met twice is read once.
Custom potential scales of all files are merged; a later file may use the scales of earlier ones, and a
scale key defined twice with different definitions is refused. Files are read through the content-keyed
cache of load_cache (a repeat load of an unchanged file skips parsing and validation).
"""

from __future__ import annotations

import os
from pathlib import Path
from typing import TYPE_CHECKING, NamedTuple

from ..core.potential_scales import PotentialScale, ScaleRegistry
from ..errors import LibraryError
from .couple_set import CoupleSet
from .load_cache import LoadedLibrary, read_library_cached

if TYPE_CHECKING:
    from ..errors import Problem
    from .shadowing import Shadowing
    from .toml_reader import LibraryFile

LAYERS = ("bundled", "demo", "group", "personal", "cli")
STARTER_FILE = "starter.toml"
DEMO_FILE = "demo.toml"
GROUP_ENV = "CROSSRATE_GROUP_LIBRARY"
PERSONAL_ENV = "CROSSRATE_PERSONAL_LIBRARY"


# A NamedTuple, not a frozen dataclass: an internal record on the path of every prediction, and Python 3.11
# compiles a dataclass's six methods at import (about 1 ms a class of a cold command; see DEVELOPERS.md).
class LayerFile(NamedTuple):
    """One file of the layered set: its layer, path, and what put it there (for messages and `list`)."""

    layer: str
    path: Path
    why: str
    must_exist: bool = True


#: Where an installed crossrate (wheel, `pip install .`) keeps the bundled libraries, inside the package.
INSTALLED_DIR = "bundled_libraries"


def bundled_dir() -> Path:
    """The folder of the bundled libraries: `crossrate/bundled_libraries/` of an installed package (the build
    maps the top-level `libraries/` folder there, see pyproject.toml), else `libraries/` beside the package
    (a source checkout or an editable install, where the package is the checkout's own folder)."""
    package = Path(__file__).resolve().parents[1]
    installed = package / INSTALLED_DIR
    if installed.is_dir():
        return installed
    return package.parent / "libraries"


def config_path() -> Path:
    """`$XDG_CONFIG_HOME/crossrate/config.toml`, or `~/.config/crossrate/config.toml`."""
    base = os.environ.get("XDG_CONFIG_HOME") or os.path.join(os.path.expanduser("~"), ".config")
    return Path(base) / "crossrate" / "config.toml"


def read_config(path: Path | None = None) -> dict:
    """The config file's `group_library` and `personal_library` entries as lists of Paths (other keys
    belong to other parts of crossrate and are left alone). LibraryError for a malformed file."""
    path = path or config_path()
    try:
        text = path.read_text(encoding="utf-8")
    except FileNotFoundError:
        return {}
    except (OSError, UnicodeDecodeError) as exc:
        # here, not at import: a cold start that meets no problem never defines the class (crossrate.problem)
        from ..errors import Problem

        raise LibraryError([Problem(str(path), None, None, None, f"cannot be read ({exc}); expected a UTF-8 "
                                    "TOML config file")]) from None
    # here, not at import: a cache hit with no config file parses no TOML (cold start)
    from .toml_loads import loads

    try:
        raw = loads(text)
    except ValueError as exc:
        from .toml_reader import TomlSyntaxProblem

        line, col = getattr(exc, "lineno", None), getattr(exc, "colno", None)
        msg = getattr(exc, "msg", str(exc))
        raise LibraryError([TomlSyntaxProblem(str(path), line, None, None, f"TOML syntax error: {msg}; "
                                              "expected valid TOML", col)]) from None
    out = {}
    for key in ("group_library", "personal_library"):
        if key not in raw:
            continue
        v = raw[key]
        items = v if isinstance(v, list) else [v]
        if not items or not all(isinstance(x, str) and x for x in items):
            from ..errors import Problem

            line = next((i for i, ln in enumerate(text.split("\n"), 1) if ln.lstrip().startswith(key)), None)
            raise LibraryError([Problem(str(path), line, None, key, "expected a file path in quotes "
                                        '(or a list of them, e.g. ["/srv/group/couples.toml"])')])
        out[key] = [(path.parent / os.path.expanduser(x)) for x in items]
    return out


def _env_paths(name: str) -> list[Path]:
    value = os.environ.get(name, "")
    return [Path(os.path.expanduser(p)) for p in value.split(os.pathsep) if p.strip()]


def layer_files(extra_paths=(), bundled: bool = True, group: bool = True, personal: bool = True,
                starter: bool = True, demo: bool = False) -> list[LayerFile]:
    """The files of the layered set, in layer order (see the module docstring for where they come from).

    bundled=False leaves out every bundled layer (starter and demo); starter=False only the starter library;
    demo=True adds the invented demo library.
    """
    out: list[LayerFile] = []
    if bundled:
        folder = bundled_dir()
        # A bundled file missing is an installation fault: said as a problem, never silently skipped.
        if starter:
            out.append(LayerFile("bundled", folder / STARTER_FILE, "bundled with crossrate"))
        if demo:
            out.append(LayerFile("demo", folder / DEMO_FILE, "invented demo library, asked for with --demo"))
    config = read_config() if (group or personal) else {}
    cfg = str(config_path())
    if group:
        env = _env_paths(GROUP_ENV)
        if env:
            out += [LayerFile("group", p, f"set by {GROUP_ENV}") for p in env]
        else:
            out += [LayerFile("group", p, f"group_library in {cfg}") for p in config.get("group_library", [])]
    if personal:
        env = _env_paths(PERSONAL_ENV)
        if env:
            out += [LayerFile("personal", p, f"set by {PERSONAL_ENV}", False) for p in env]
        elif "personal_library" in config:
            out += [LayerFile("personal", p, f"personal_library in {cfg}", False) for p in config["personal_library"]]
        else:
            out.append(LayerFile("personal", config_path().parent / "personal.toml", "default personal file", False))
    out += [LayerFile("cli", Path(os.fspath(p)), "given with --library") for p in extra_paths]
    return out


def scale_conflicts(lf: LibraryFile | LoadedLibrary, merged: dict[str, tuple[PotentialScale, str]]) -> list[Problem]:
    """Problems for each scale key of lf that merged (key -> (scale, defining file)) defines differently."""
    problems = []
    for key, sc in lf.scales.items():
        if key in merged:
            prev, where = merged[key]
            if (prev.relative_to, prev.offset_V) != (sc.relative_to, sc.offset_V):
                from ..errors import Problem

                if isinstance(lf, LoadedLibrary):
                    line = lf.scale_line(key)
                else:
                    span = lf.index.table("library", "scales", key)
                    line = span.line if span else None
                problems.append(Problem(lf.path, line, None, f"library.scales.{key}",
                                        f"defined differently in {where} (relative_to {prev.relative_to or 'none'}, "
                                        f"offset_V {prev.offset_V:g}); expected the same definition or another key"))
    return problems


def load_layered(extra_paths=(), bundled: bool = True, group: bool = True, personal: bool = True,
                 starter: bool = True, demo: bool = False) -> CoupleSet:
    """Read every layer's files and combine them into one CoupleSet (later layers shadow earlier ones).

    extra_paths: --library files (layer "cli"); bundled, starter, demo as in layer_files. Raises
    LibraryError listing the problems of every file.
    """
    couple_set, problems = load_layered_partial(extra_paths, bundled, group, personal, starter, demo)
    if problems:
        raise LibraryError(problems)
    return couple_set


def load_layered_partial(extra_paths=(), bundled: bool = True, group: bool = True, personal: bool = True,
                         starter: bool = True, demo: bool = False) -> tuple[CoupleSet, list[Problem]]:
    """Like load_layered, but a file with problems is left out instead of failing the whole set:
    (the CoupleSet of the files that are fine, every problem of the files left out). A left-out file is not
    among the set's files, so nothing is ever written to it. LibraryError only for a malformed config file.
    """
    problems: list[Problem] = []
    couples: dict = {}
    shadowed: list[Shadowing] = []
    merged: dict[str, tuple[PotentialScale, str]] = {}
    files: list[str] = []
    shas: dict[str, str] = {}
    layers: dict[str, str] = {}
    seen: set[str] = set()
    specs = layer_files(extra_paths, bundled, group, personal, starter, demo)
    for lf_spec in specs:
        real = os.path.realpath(lf_spec.path)
        if real in seen:
            continue
        seen.add(real)
        if not lf_spec.path.exists():
            if lf_spec.must_exist:
                from ..errors import Problem

                problems.append(Problem(str(lf_spec.path), None, None, None,
                                        f"no such file ({lf_spec.why}); expected a library TOML file there"))
            continue
        try:
            lf = read_library_cached(lf_spec.path, lf_spec.layer, {k: v[0] for k, v in merged.items()})
        except LibraryError as exc:
            problems.extend(exc.problems)
            continue
        conflicts = scale_conflicts(lf, merged)
        if conflicts:
            problems.extend(conflicts)
            continue
        for key, sc in lf.scales.items():
            merged.setdefault(key, (sc, lf.path))
        files.append(lf.path)
        shas[lf.path] = lf.sha256
        layers[lf.path] = lf.layer
        for c in lf.couples:
            prev = couples.get(c.id)
            if prev is not None:
                from .shadowing import Shadowing  # here: only a layer that shadows another needs it

                shadowed.append(Shadowing(c.id, prev.origin, c.origin))
            couples[c.id] = c
    return CoupleSet(
        list(couples.values()),
        ScaleRegistry({k: v[0] for k, v in merged.items()}),
        shadowed,
        files,
        file_sha256=shas,
        file_layers=layers,
        searched=tuple((lf.layer, str(lf.path), os.path.realpath(lf.path) in {os.path.realpath(f) for f in files})
                       for lf in specs),
    ), problems
