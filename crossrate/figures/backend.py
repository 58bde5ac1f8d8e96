"""Lazy access to matplotlib (Agg backend) and safe writing of a figure to an .svg or .png file."""

import os
from pathlib import Path

from ..errors import CrossrateError

#: File types a figure can be written as.
FIGURE_SUFFIXES = (".svg", ".png")


class PlottingUnavailableError(CrossrateError):
    """matplotlib, the optional plotting extra, is not installed."""


def check_figure_path(path, replace: bool = False) -> Path:
    """The figure path, checked before any work is done: .svg or .png, in an existing folder, and not an
    existing file unless replace (--force) is given."""
    p = Path(path)
    if p.suffix.lower() not in FIGURE_SUFFIXES:
        raise CrossrateError(f"--plot {p}: expected a file name ending in .svg or .png")
    if not p.parent.exists() or not p.parent.is_dir():
        raise CrossrateError(f"--plot {p}: folder {p.parent} does not exist")
    if p.exists() and p.is_dir():
        raise CrossrateError(f"--plot {p}: is a folder, expected a file name")
    if os.path.lexists(p) and not replace:
        raise CrossrateError(f"--plot {p}: file exists; choose another name or add --force to replace it "
                             "(nothing was written)")
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


def save_figure(fig, path, replace: bool = False) -> Path:
    """Write the figure atomically (library.output_writer: a temporary file in the same folder, the umask's
    permissions, an existing file replaced only when replace) and close it."""
    from ..library.output_writer import write_output

    p = check_figure_path(path, replace)
    try:
        write_output(p, lambda fh: fig.savefig(fh, format=p.suffix.lower().lstrip("."), bbox_inches="tight",
                                               dpi=150), replace=replace)
    except FileExistsError:
        raise CrossrateError(f"--plot {p}: file exists; choose another name or add --force to replace it "
                             "(nothing was written)") from None
    except OSError as exc:
        raise CrossrateError(f"--plot {p}: could not be written ({exc.strerror or exc}); nothing was written") from None
    finally:
        import matplotlib.pyplot as plt

        plt.close(fig)
    return p
