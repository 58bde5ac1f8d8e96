"""Fitting text into a fixed number of columns without hiding what tells one label from another.

A cut is always shown by '…'. Couple ids often share a long start (`hl-ferrocene-mecn`, `hl-ferrocene-dcm`)
and differ at the end, so ids keep both ends and lose the middle.
"""

ELLIPSIS = "…"


def fit_end(text: str, width: int) -> str:
    """text cut to width, the cut shown by a final '…'."""
    if len(text) <= width:
        return text
    return text[: max(0, width - 1)] + ELLIPSIS if width > 0 else ""


def fit_middle(text: str, width: int) -> str:
    """text cut to width keeping its start and its end (the end a little longer), e.g. 'hl-ferr…ne-mecn'."""
    if len(text) <= width:
        return text
    if width < 3:
        return fit_end(text, width)
    tail = (width - 1 + 1) // 2
    head = width - 1 - tail
    return text[:head] + ELLIPSIS + text[len(text) - tail :]


def display_path(path: str, width: int = 60) -> str:
    """A file path for a sentence in a dialog: relative to the working folder when inside it, '~' for the home
    folder, and when still longer than width, its start and its file name kept around a '…' (a path is one
    word: the dialog would otherwise break it anywhere)."""
    import os

    p = os.fspath(path)
    try:
        rel = os.path.relpath(p)
        if not rel.startswith(".."):
            p = rel
    except ValueError:  # another drive (Windows)
        pass
    home = os.path.expanduser("~")
    if home not in ("", "/") and p.startswith(home + os.sep):
        p = "~" + p[len(home):]
    if len(p) <= width:
        return p
    name = os.path.basename(p)
    head = max(0, width - len(name) - 2)
    return p[:head] + "…" + os.sep + name if head else fit_middle(name, width)
