"""The lock a library writer takes: an exclusive flock on a sibling `.<name>.lock` file.

The lock file is shared by everyone who edits the library file, so it is created with the library file's
permission bits and group (a group-writable file gets a group-writable lock), and an existing lock file
that the user may only read is still usable: flock needs no write access. The lock file is never removed
(removing it would race with a process that is about to lock it).
"""

import errno
import fcntl
import os
import time
from pathlib import Path

from ..errors import ConflictError, CrossrateError

#: How long a writer waits for another writer's lock before giving up, s.
LOCK_TIMEOUT_S = 10.0


class LibraryWriteError(CrossrateError):
    """The file could not be written (permissions, full disk...); the original file is unchanged."""


def lock_path(path: Path) -> Path:
    """The sibling lock file of a library file: `.<name>.lock` in the same folder."""
    return path.with_name(f".{path.name}.lock")


def open_lock(path: Path, file_stat: os.stat_result | None) -> int:
    """A file descriptor on the lock file of `path`, created when missing.

    file_stat: the library file's stat (None for a new file): the lock gets its mode bits (read/write
    only) and, where the process may, its group. Raises LibraryWriteError with what to do.
    """
    lock = lock_path(path)
    mode = 0o666 if file_stat is None else (file_stat.st_mode & 0o666) | 0o600
    nofollow = getattr(os, "O_NOFOLLOW", 0)
    try:
        fd = os.open(lock, os.O_RDWR | os.O_CREAT | os.O_EXCL | nofollow, mode)
    except FileExistsError:
        return _open_existing(path, lock, nofollow)
    except OSError as exc:
        raise LibraryWriteError(f"{path}: cannot create the lock file {lock.name} in {lock.parent} "
                                f"({exc.strerror}); expected a folder you may write in (nothing was "
                                "changed)") from None
    if file_stat is not None:
        try:
            os.fchmod(fd, mode)  # the umask must not make the lock private to its creator
            os.fchown(fd, -1, file_stat.st_gid)
        except OSError:
            pass  # not a member of the file's group: the lock keeps the creator's group
    return fd


def _open_existing(path: Path, lock: Path, nofollow: int) -> int:
    for flags in (os.O_RDWR, os.O_RDONLY):
        try:
            return os.open(lock, flags | nofollow)
        except PermissionError:
            continue
        except OSError as exc:
            if exc.errno == errno.ELOOP:
                raise LibraryWriteError(f"{path}: the lock file {lock.name} is a symbolic link; expected a "
                                        "plain file: remove the link (nothing was changed)") from None
            raise LibraryWriteError(f"{path}: cannot open the existing lock file {lock.name} ({exc.strerror}); "
                                    "nothing was changed") from None
    raise LibraryWriteError(f"{path}: the lock file {lock.name} exists but you may not read it (Permission "
                            f"denied); expected a lock readable by everyone who edits the file: ask its owner "
                            f"to run chmod a+r {lock} (nothing was changed)")


def acquire(fd: int, path: Path, timeout_s: float) -> None:
    """Take the exclusive lock on fd, polling until timeout_s; ConflictError when another writer keeps it."""
    deadline = time.monotonic() + timeout_s
    while True:
        try:
            fcntl.flock(fd, fcntl.LOCK_EX | fcntl.LOCK_NB)
            return
        except OSError as exc:
            if exc.errno not in (errno.EAGAIN, errno.EACCES, errno.EWOULDBLOCK):
                raise LibraryWriteError(f"{path}: cannot lock {lock_path(path).name} "
                                        f"({exc.strerror}); the file was not changed") from None
        if time.monotonic() > deadline:
            raise ConflictError(f"{path}: another crossrate is writing it (locked for over "
                                f"{timeout_s:g} s); nothing was written: try again")
        time.sleep(0.02)
