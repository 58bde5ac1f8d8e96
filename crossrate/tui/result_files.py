"""Writing a result file from the workbench: a new file is created exclusively (an existing one is never
replaced without the user's yes), a confirmed replacement is renamed over it; both go through
library.output_writer (temporary file in the same folder, the umask's permissions)."""

from pathlib import Path

from ..errors import CrossrateError


def write_result_file(path: str, text: str, replace: bool = False) -> str:
    """Write text (UTF-8) to path; returns the path written. Raises FileExistsError when the file exists and
    replace is False (the caller asks first), CrossrateError naming the file for anything else."""
    p = Path(path).expanduser()
    if not p.parent.is_dir():
        raise CrossrateError(f"{p}: folder {p.parent} does not exist; expected an existing folder (nothing was "
                             "written)")
    from ..library.output_writer import write_output

    try:
        # through a temporary file: a killed save leaves no half file, and the next save removes its temporary
        write_output(p, lambda fh: fh.write(text.encode("utf-8")), replace=replace)
    except FileExistsError:
        raise
    except OSError as exc:
        raise CrossrateError(f"{p}: could not be written ({exc.strerror or exc}); nothing was written") from None
    return str(p)
