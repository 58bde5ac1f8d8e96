"""Output forms of `crossrate map`: CSV matrix and JSON, and the Rich progress bar shown on a terminal."""

import csv
import io
import sys
from contextlib import contextmanager

from ..library.spreadsheet_cells import safe_row, spreadsheet_safe


def map_csv(rate_map) -> str:
    """CSV matrix: header `oxidant\\reductant,<ids>,oxidant_provenance`, one row per oxidant, log10 k_obs
    (log10 M^-1 s^-1) with 4 decimals, empty cells where the pair cannot be computed; the last column says
    how far the row's couple can be trusted (invented, unverified or verified; rows and columns are the
    same couples)."""
    buf = io.StringIO()
    writer = csv.writer(buf, lineterminator="\n")
    writer.writerow(safe_row(["oxidant\\reductant", *rate_map.ids, "oxidant_provenance"]))
    values = rate_map.log10_k_obs
    kinds = rate_map.provenance or ("",) * len(rate_map.ids)
    for i, cid in enumerate(rate_map.ids):
        writer.writerow([spreadsheet_safe(cid), *("" if v != v else f"{v:.4f}" for v in values[i].tolist()), kinds[i]])
    return buf.getvalue()


@contextmanager
def progress_bar(stream=None):
    """Yield a progress(done, total) callback: a Rich bar when stream (default stderr) is a terminal,
    otherwise a callback that does nothing (pipes and files get no bar)."""
    stream = stream or sys.stderr
    isatty = getattr(stream, "isatty", None)
    if not (isatty and isatty()):
        yield None
        return
    from rich.progress import BarColumn, MofNCompleteColumn, Progress, TextColumn, TimeElapsedColumn

    from .terminal_output import console_for

    with Progress(
        TextColumn("rate map"), BarColumn(), MofNCompleteColumn(), TimeElapsedColumn(),
        console=console_for(stream), transient=True,
    ) as bar:
        task = bar.add_task("rows", total=None)

        def callback(done: int, total: int) -> None:
            bar.update(task, completed=done, total=total)

        yield callback
