"""Writing an output file the user named (a CSV map, an export, a figure) without ever leaving half a file.

The content goes to a hidden temporary `.<name>.<hex>.tmp` in the same folder, created with the ordinary
permissions of a new file (0666 less the umask), flushed and fsync'ed, then either linked into place (a new
file: fails, never replaces, when the name appeared meanwhile) or moved over the old file (replace=True).
The writer holds an flock on its temporary while it exists; a temporary found unlocked belongs to a run that
died (kill -9, power cut) and is removed by the next write of the same file.
"""

import errno
import fcntl
import os
import re
import secrets
import stat
from collections.abc import Callable
from pathlib import Path
from typing import BinaryIO

_NOFOLLOW = getattr(os, "O_NOFOLLOW", 0)


def _temp_pattern(path: Path) -> re.Pattern:
    return re.compile(rf"\.{re.escape(path.name)}\.[0-9a-f]{{12}}\.tmp")


def remove_stale_temporaries(path) -> list[str]:
    """Remove the temporaries of crashed writes of `path` (those no live writer holds locked); their names."""
    path = Path(path)
    pattern = _temp_pattern(path)
    removed = []
    try:
        names = os.listdir(path.parent)
    except OSError:
        return removed
    for name in names:
        if not pattern.fullmatch(name):
            continue
        p = path.with_name(name)
        try:
            fd = os.open(p, os.O_RDONLY | os.O_NONBLOCK | _NOFOLLOW)
        except OSError:
            continue
        try:
            if not stat.S_ISREG(os.fstat(fd).st_mode):
                continue
            try:
                fcntl.flock(fd, fcntl.LOCK_EX | fcntl.LOCK_NB)
            except OSError as exc:
                if exc.errno in (errno.EAGAIN, errno.EWOULDBLOCK, errno.EACCES):
                    continue  # a live writer's
                raise
            os.unlink(p)
            removed.append(name)
        except OSError:
            continue
        finally:
            os.close(fd)
    return removed


def write_output(path, produce: Callable[[BinaryIO], None], replace: bool = False) -> None:
    """Write the bytes produce(file) writes to `path` atomically.

    replace=False: FileExistsError when `path` exists (also when it appears while writing), and the existing
    file is never touched; replace=True: an existing file is replaced in one step. OSError on I/O failure,
    with nothing left behind.
    """
    path = Path(path)
    remove_stale_temporaries(path)
    tmp = path.with_name(f".{path.name}.{secrets.token_hex(6)}.tmp")
    fd = os.open(tmp, os.O_WRONLY | os.O_CREAT | os.O_EXCL | _NOFOLLOW, 0o666)
    try:
        fcntl.flock(fd, fcntl.LOCK_EX)  # marks the temporary as a live writer's
        with os.fdopen(fd, "wb", closefd=False) as fh:
            produce(fh)
            fh.flush()
            os.fsync(fh.fileno())
        if replace:
            os.replace(tmp, path)
        else:
            os.link(tmp, path)  # fails if path exists: never replaces someone's file
    finally:
        try:
            os.unlink(tmp)
        except FileNotFoundError:
            pass
        os.close(fd)
