"""Lazy access to matplotlib (Agg backend) and safe writing of a figure to an .svg or .png file."""

import os
import tempfile
from pathlib import Path

from ..errors import CrossrateError

#: File types a figure can be written as.
FIGURE_SUFFIXES = (".svg", ".png")


class PlottingUnavailableError(CrossrateError):
    """matplotlib, the optional plotting extra, is not installed."""


def check_figure_path(path) -> Path:
    """The figure path, checked before any work is done: .svg or .png, in an existing folder."""
    p = Path(path)
    if p.suffix.lower() not in FIGURE_SUFFIXES:
        raise CrossrateError(f"--plot {p}: expected a file name ending in .svg or .png")
    if not p.parent.exists() or not p.parent.is_dir():
        raise CrossrateError(f"--plot {p}: folder {p.parent} does not exist")
    if p.exists() and p.is_dir():
        raise CrossrateError(f"--plot {p}: is a folder, expected a file name")
    return p


def pyplot():
    """matplotlib.pyplot on the Agg backend; PlottingUnavailableError with the install hint when missing."""
    try:
        import matplotlib
    except ImportError:
        raise PlottingUnavailableError(
            "--plot needs matplotlib, the optional plotting extra: pip install 'crossrate[plot]' "
            "(or pip install matplotlib)"
        ) from None
    matplotlib.use("Agg", force=True)
    import matplotlib.pyplot as plt

    return plt


def save_figure(fig, path) -> Path:
    """Write the figure atomically (temporary file in the same folder, then os.replace) and close it."""
    p = check_figure_path(path)
    fd, tmp = tempfile.mkstemp(prefix=f".{p.name}.", suffix=p.suffix, dir=p.parent)
    os.close(fd)
    try:
        fig.savefig(tmp, format=p.suffix.lower().lstrip("."), bbox_inches="tight", dpi=150)
        # mkstemp makes the file private; give it the permissions an ordinary new file would get.
        umask = os.umask(0)
        os.umask(umask)
        os.chmod(tmp, p.stat().st_mode & 0o777 if p.exists() else 0o666 & ~umask)
        os.replace(tmp, p)
    finally:
        if os.path.exists(tmp):
            os.unlink(tmp)
        import matplotlib.pyplot as plt

        plt.close(fig)
    return p
