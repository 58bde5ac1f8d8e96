"""A new library file: the `[library]` header (format, title, default medium, temperature and potential scale)
and a commented example couple naming every required field with its unit, written through the safe writer
(never over an existing file)."""

import math
import os
from pathlib import Path

from ..core.potential_scales import builtin_scales
from ..core.solvents import solvent_table
from ..errors import CrossrateError
from .schema import FIELDS_BY_NAME, FORMAT_VERSION
from .table_editor import format_value

#: Defaults of a new file: the conditions most couples of the trade are quoted at (common practice).
DEFAULT_MEDIUM = "water"
DEFAULT_E_SCALE = "SHE"
DEFAULT_TEMPERATURE_K = 298.15


def new_library_text(title: str, medium: str = DEFAULT_MEDIUM, E_scale: str = DEFAULT_E_SCALE,
                     temperature: float = DEFAULT_TEMPERATURE_K) -> str:
    """The text of a new library file (valid, no couple yet). temperature in K; E_scale a built-in scale key."""
    return f"""\
# {title.replace(chr(10), ' ')}: a crossrate library file (the format: libraries/README.md of crossrate).
#
# One [couple.<id>] table per couple. Units: E and E_sd in V on E_scale, k_self in M^-1 s^-1, radius in
# angstrom, ionic_strength in M (mol/L), temperature in K. Name where every value comes from in `source`
# (say "from memory" for a recalled value) and set verified = true only once it is checked against the
# primary source. Add couples with `crossrate library add FILE ...`, in the workbench (a), or by hand.

[library]
title = {format_value(title)}
format = {FORMAT_VERSION}
medium = {format_value(medium)}  # default for couples that leave it out
temperature = {format_value(float(temperature))}  # K, default
E_scale = {format_value(E_scale)}  # default potential scale

# An example couple: remove the leading "# " and put your own values in (these are placeholders, not data).
# [couple.my-couple]
# name = "my compound 1+/0"
# charge_ox = 1
# charge_red = 0
# E = 0.40                 # V vs {E_scale}
# k_self = 1.0e6           # M^-1 s^-1; leave out when unknown
# radius = 4.0             # angstrom
# ionic_strength = 0.1     # M
# source = "author, journal, year"
# verified = false
"""


def _check_choices(medium: str, E_scale: str, temperature: float) -> None:
    media = solvent_table()
    if medium not in media:
        raise CrossrateError(f"medium {medium!r}: expected one of {', '.join(sorted(media))} (nothing was written)")
    scales = builtin_scales()
    if E_scale not in scales:
        raise CrossrateError(f"E_scale {E_scale!r}: expected one of {', '.join(scales)} (a scale of your own is "
                             "defined in the file's [library.scales] later; nothing was written)")
    spec = FIELDS_BY_NAME["temperature"]
    if not (math.isfinite(temperature) and spec.in_range(temperature)):
        raise CrossrateError(f"temperature {temperature!r}: expected {spec.expected()} (nothing was written)")


def create_library(path, title: str | None = None, medium: str = DEFAULT_MEDIUM, E_scale: str = DEFAULT_E_SCALE,
                   temperature: float = DEFAULT_TEMPERATURE_K) -> str:
    """Create a new library file at path (title: the file name's stem when None); temperature in K.

    Returns the sha256 of what was written. Raises CrossrateError when the file exists already (it is never
    overwritten), its folder does not exist, or a default is not one crossrate knows; nothing is written then.
    """
    from .safe_writer import SafeWriter
    from .toml_reader import parse_library_text

    p = Path(os.fspath(path))
    if p.exists() or p.is_symlink():
        raise CrossrateError(f"{p}: exists already; expected the name of a new file (nothing was written)")
    if not p.parent.is_dir():
        raise CrossrateError(f"{p}: folder {p.parent} does not exist; expected an existing folder (nothing was "
                             "written)")
    if p.suffix != ".toml":
        raise CrossrateError(f"{p}: expected a file name ending in .toml (nothing was written)")
    _check_choices(medium, E_scale, float(temperature))
    text = new_library_text(title if title else p.stem, medium, E_scale, temperature)
    return SafeWriter(p, validate=lambda t: parse_library_text(t, str(p))).write(text, None)
