"""Functions of the public Python API that are not services themselves (loading a layered library).

Everything here is re-exported lazily by ``import crossrate``; see crossrate/__init__.py for the list.
"""

from os import PathLike

from .library.couple_set import CoupleSet


def load_library(
    *paths: str | PathLike,
    bundled: bool = True,
    group: bool = True,
    personal: bool = True,
) -> CoupleSet:
    """Load the layered couple library: bundled -> group -> personal -> each of `paths`, later layers winning.

    Args:
        *paths: extra library files (TOML) added on top, in order (like `--library PATH` on the command line).
        bundled: include the bundled libraries (libraries/demo.toml, libraries/starter.toml).
        group: include the group library (CROSSRATE_GROUP_LIBRARY or ~/.config/crossrate/config.toml).
        personal: include the personal library (CROSSRATE_PERSONAL_LIBRARY or ~/.config/crossrate/personal.toml).

    Returns:
        CoupleSet: look couples up with ``couple_set["id"]`` (UnknownCoupleError with suggestions otherwise);
        ``couple_set.shadowed`` lists couples replaced by a later layer.

    Raises:
        LibraryError: a file is invalid; ``.problems`` lists every file:line problem at once.
        OSError: a named file cannot be read.
    """
    from .library.layers import load_layered

    return load_layered(
        extra_paths=tuple(str(p) for p in paths), bundled=bundled, group=group, personal=personal
    )
