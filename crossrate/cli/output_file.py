"""Writing a command's result to a file the user names (`--out FILE`) without ever losing what was there.

The path is checked before any work is done (missing folder, a folder in place of a file, an existing file
without --force), and the text is written through library.output_writer: a temporary file in the same
folder, so a failure midway leaves neither a half-written FILE nor a damaged earlier one, and the new file
gets the ordinary permissions of the user's umask.
"""

import os

from ..errors import InputFileError


def check_out_path(path: str, force: bool = False, option: str = "--out", can_force: bool = True) -> None:
    """InputFileError when `path` cannot take the output: its folder is missing, it is a folder, or it
    exists and `force` is false (`can_force`: the command has a --force to suggest)."""
    folder = os.path.dirname(os.path.abspath(path))
    if os.path.isdir(path):
        raise InputFileError(f"{option} {path}: is a folder; expected a file name (nothing was written)")
    if not os.path.isdir(folder):
        raise InputFileError(
            f"{option} {path}: folder {os.path.dirname(path) or folder} does not exist; expected an existing "
            "folder (nothing was written)"
        )
    if os.path.lexists(path) and not force:
        hint = "choose another name or add --force to replace it" if can_force else "expected a new file name"
        raise InputFileError(f"{option} {path}: file exists; {hint} (nothing was written)")


def write_out(path: str, text: str, force: bool = False, option: str = "--out", can_force: bool = True) -> None:
    """Write `text` (UTF-8, lines as given) to `path` through a temporary file in the same folder.

    force=True replaces an existing file; otherwise an existing file is refused and never touched, also
    when it appears while the text is being written.
    """
    from ..library.output_writer import write_output

    check_out_path(path, force, option, can_force)
    try:
        write_output(path, lambda fh: fh.write(text.encode("utf-8")), replace=force)
    except FileExistsError:
        raise InputFileError(f"{option} {path}: file exists; expected a new file name (nothing was written)") from None
    except OSError as exc:
        raise InputFileError(f"{option} {path}: could not be written ({exc.strerror or exc}); "
                             "nothing was written") from None
