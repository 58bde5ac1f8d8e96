"""Where `library diff` reads a version of a library file from: a file, or a git revision of one.

Forms:
* a path that exists: that file;
* `REV:PATH` (e.g. `HEAD~1:group.toml`, `main:libs/group.toml`): the file as committed in revision REV, read
  with `git show REV:PATH` run in the current folder (PATH relative to the repository's top, or `./PATH`
  relative to the current folder, as git reads it);
* revision_of(REV, FILE): FILE as committed in REV, FILE's own folder deciding the repository.
Git is run with a fixed argument list (no shell); anything it refuses becomes one clear CrossrateError.
"""

import os
import shutil
import subprocess
from dataclasses import dataclass

from ..errors import CrossrateError
from .toml_reader import read_library_bytes


@dataclass(frozen=True)
class LibrarySource:
    """One version of a library file: name (for messages, e.g. `HEAD~1:group.toml`) and its bytes."""

    name: str
    data: bytes


def _git(args: list[str], cwd: str, what: str) -> bytes:
    git = shutil.which("git")
    if git is None:
        raise CrossrateError(f"{what}: git is not installed; expected git on the PATH to read a revision")
    try:
        done = subprocess.run([git, *args], cwd=cwd, capture_output=True, timeout=60, check=False)
    except (OSError, subprocess.TimeoutExpired) as exc:
        raise CrossrateError(f"{what}: git could not be run ({exc}); expected a readable git repository") from None
    if done.returncode != 0:
        why = done.stderr.decode("utf-8", "replace").strip().splitlines()
        reason = why[-1] if why else f"exit code {done.returncode}"
        raise CrossrateError(f"{what}: git cannot read it ({reason.removeprefix('fatal: ')}); expected REV:PATH of "
                             "a file committed in that revision, e.g. HEAD~1:group.toml")
    return done.stdout


def read_source(spec: str) -> LibrarySource:
    """The bytes of a file path, or of `REV:PATH` read from git (see the module docstring)."""
    if os.path.exists(spec) or ":" not in spec:
        return LibrarySource(spec, read_library_bytes(spec))
    rev, _, path = spec.partition(":")
    if not rev or not path:
        raise CrossrateError(f"{spec}: expected a file or REV:PATH (e.g. HEAD~1:group.toml)")
    return LibrarySource(spec, _git(["show", f"{rev}:{path}"], os.getcwd(), spec))


def revision_of(rev: str, path: str) -> LibrarySource:
    """FILE as committed in revision REV (the repository is the one FILE's folder belongs to)."""
    folder = os.path.dirname(os.path.abspath(path)) or "."
    name = f"{rev}:{path}"
    if not os.path.isdir(folder):
        raise CrossrateError(f"{name}: folder {folder} does not exist; expected a file in a git repository")
    return LibrarySource(name, _git(["show", f"{rev}:./{os.path.basename(path)}"], folder, name))


def parse_source(src: LibrarySource, known_scales=None):
    """The validated LibraryFile of a source (LibraryError listing every problem, named by src.name)."""
    from ..errors import LibraryError
    from .toml_reader import TomlSyntaxProblem, parse_library_text, sha256_of

    try:
        text = src.data.decode("utf-8")
    except UnicodeDecodeError as exc:
        line = src.data.count(b"\n", 0, exc.start) + 1
        raise LibraryError([TomlSyntaxProblem(src.name, line, None, None, "not UTF-8 text; expected a UTF-8 "
                                              "encoded TOML file")]) from None
    return parse_library_text(text, src.name, "cli", known_scales, sha256_of(src.data))
