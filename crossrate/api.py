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
    starter: bool = True,
    demo: bool = False,
) -> CoupleSet:
    """Load the layered couple library: bundled starter -> (demo) -> group -> personal -> each of `paths`,
    later layers winning. An empty set says why in the UnknownCoupleError of its first lookup (and in
    ``couple_set.empty_reason()``).

    Args:
        *paths: extra library files (TOML) added on top, in order (like `--library PATH` on the command line).
        bundled: include the bundled libraries at all (False leaves out the starter and the demo).
        starter: include the bundled starter library (literature couples recalled from memory, unverified).
        demo: include the invented demo library (made-up Halden Lake couples, each marked ``invented``);
            never loaded unless asked for.
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
        extra_paths=tuple(str(p) for p in paths), bundled=bundled, group=group, personal=personal,
        starter=starter, demo=demo,
    )
