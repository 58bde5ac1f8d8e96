"""Writing a result file from the workbench: a new file is created exclusively (an existing one is never
replaced without the user's yes), a confirmed replacement is written beside it and renamed over it."""

import os
from pathlib import Path

from ..errors import CrossrateError


def write_result_file(path: str, text: str, replace: bool = False) -> str:
    """Write text (UTF-8) to path; returns the path written. Raises FileExistsError when the file exists and
    replace is False (the caller asks first), CrossrateError naming the file for anything else."""
    p = Path(path).expanduser()
    if not p.parent.is_dir():
        raise CrossrateError(f"{p}: folder {p.parent} does not exist; expected an existing folder (nothing was "
                             "written)")
    try:
        if not replace:
            with open(p, "x", encoding="utf-8", newline="\n") as f:
                f.write(text)
            return str(p)
        tmp = p.with_name(f".{p.name}.{os.getpid()}.tmp")
        try:
            with open(tmp, "x", encoding="utf-8", newline="\n") as f:
                f.write(text)
            os.replace(tmp, p)
        finally:
            if tmp.exists():
                tmp.unlink()
    except FileExistsError:
        raise
    except OSError as exc:
        raise CrossrateError(f"{p}: could not be written ({exc.strerror or exc}); nothing was written") from None
    return str(p)
