"""Validating library files in the layered context the other commands read them in.

`library validate FILE` must not call a file valid that `predict --library FILE` would refuse: the file may
use the potential scales of the layers below it (bundled, group, personal), and it must not define a scale
key those layers define differently. The files of the context that do not load are left out of it (they
are reported when they are validated themselves).
"""

import os
from dataclasses import dataclass

from ..core.potential_scales import PotentialScale
from ..errors import LibraryError, Problem
from .layers import layer_files, scale_conflicts
from .toml_reader import LibraryFile, read_library_file


@dataclass(frozen=True)
class LayeredContext:
    """The scales a file is checked against (key -> (scale, file defining it)) and the layers they came from."""

    scales: dict[str, tuple[PotentialScale, str]]
    layers: tuple[str, ...]

    def describe(self) -> str:
        """'the bundled and group layers', or 'no other library'."""
        if not self.layers:
            return "no other library"
        names = list(self.layers)
        joined = names[0] if len(names) == 1 else ", ".join(names[:-1]) + " and " + names[-1]
        return f"the {joined} layer{'' if len(names) == 1 else 's'}"


def layered_context(exclude=(), **layers) -> LayeredContext:
    """The context of the layered set (layers: the bundled/group/personal flags of layer_files), without the
    files in `exclude` (the files being validated)."""
    skip = {os.path.realpath(p) for p in exclude}
    merged: dict[str, tuple[PotentialScale, str]] = {}
    used: list[str] = []
    try:
        specs = layer_files((), **layers)
    except LibraryError:
        specs = []  # a malformed config file is reported by every command that reads the layers
    for spec in specs:
        if os.path.realpath(spec.path) in skip or not spec.path.is_file():
            continue
        try:
            lf = read_library_file(spec.path, spec.layer, {k: v[0] for k, v in merged.items()})
        except LibraryError:
            continue
        if scale_conflicts(lf, merged):
            continue
        for key, sc in lf.scales.items():
            merged.setdefault(key, (sc, lf.path))
        if spec.layer not in used:
            used.append(spec.layer)
    return LayeredContext(merged, tuple(used))


def validate_in_context(path, context: LayeredContext) -> LibraryFile:
    """Read and validate one file on top of the context (its scales usable, none redefined differently);
    the file's own scales join the context for the files validated after it. Raises LibraryError."""
    lf = read_library_file(path, "cli", {k: v[0] for k, v in context.scales.items()})
    conflicts: list[Problem] = scale_conflicts(lf, context.scales)
    if conflicts:
        raise LibraryError(conflicts)
    for key, sc in lf.scales.items():
        context.scales.setdefault(key, (sc, lf.path))
    return lf
