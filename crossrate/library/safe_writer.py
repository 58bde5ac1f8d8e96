"""Writing a library file so that nothing anyone had is lost.

The new text is validated first (a text that does not validate is never written). Then, under an
exclusive lock on a sibling `.<name>.lock` file (fcntl.flock, so two crossrate processes editing one
group file take turns), the file's sha256 is compared with the one the caller read: if someone changed
the file since, the write is refused with ConflictError. Otherwise the previous version is kept as
`<name>.bak`, the new text goes to a temporary file in the same folder, is flushed and fsync'ed, given
the original file's permission bits, and moved over the original with os.replace (atomic on POSIX:
a reader sees the old file or the new one, never half of one). The lock file stays in place (removing
it would race with another process that is about to lock it); add `.*.lock` to the group repo's
.gitignore.
"""

import errno
import fcntl
import os
import secrets
import stat
import time
from collections.abc import Callable
from pathlib import Path

from ..errors import ConflictError, CrossrateError
from .toml_reader import sha256_of

#: How long a writer waits for another writer's lock before giving up, s.
LOCK_TIMEOUT_S = 10.0


class LibraryWriteError(CrossrateError):
    """The file could not be written (permissions, full disk...); the original file is unchanged."""


def lock_path(path: Path) -> Path:
    """The sibling lock file of a library file: `.<name>.lock` in the same folder."""
    return path.with_name(f".{path.name}.lock")


def backup_path(path: Path) -> Path:
    """Where the previous version is kept: `<name>.bak` beside the file."""
    return path.with_name(f"{path.name}.bak")


class SafeWriter:
    """Atomic, checked writes of one library file (see the module docstring for the guarantees).

    validate: called with the new text before anything is written; it raises (LibraryError) to refuse.
    """

    def __init__(self, path, validate: Callable[[str], object] | None = None, lock_timeout_s: float = LOCK_TIMEOUT_S):
        self.path = Path(path)
        self.validate = validate
        self.lock_timeout_s = lock_timeout_s

    def write(self, new_text: str, expected_sha256: str | None) -> str:
        """Replace the file with new_text if its content still has sha256 expected_sha256.

        expected_sha256: hex digest of the bytes the caller read; None means "the file must not exist yet".
        Returns the sha256 of the new content. Raises LibraryError (new text invalid), ConflictError (file
        changed or created since it was read, or locked too long), LibraryWriteError (I/O failure); in every
        one of those cases the file on disk is as it was.
        """
        if self.validate is not None:
            self.validate(new_text)
        data = new_text.encode("utf-8")
        path = self.path
        try:
            lock_fd = os.open(lock_path(path), os.O_RDWR | os.O_CREAT, 0o666)
        except OSError as exc:
            raise LibraryWriteError(f"{path}: cannot create the lock file {lock_path(path).name} "
                                    f"({exc.strerror}); the file was not changed") from None
        try:
            self._lock(lock_fd)
            old = self._current(path)
            current_sha = None if old is None else sha256_of(old)
            if current_sha != expected_sha256:
                if expected_sha256 is None:
                    why = "exists already (created since you looked)"
                elif old is None:
                    why = "was deleted or moved since it was read"
                else:
                    why = "changed on disk since it was read (edited by someone else or another program)"
                raise ConflictError(f"{path}: {why}; nothing was written: reload the file and make the edit again")
            mode = stat.S_IMODE(os.stat(path).st_mode) if old is not None else None
            try:
                if old is not None:
                    self._replace_atomically(backup_path(path), old, mode)
                self._replace_atomically(path, data, mode)
            except OSError as exc:
                raise LibraryWriteError(f"{path}: could not be written ({exc.strerror or exc}); "
                                        "the file was not changed") from None
            return sha256_of(data)
        finally:
            os.close(lock_fd)  # closing releases the flock

    def _lock(self, fd: int) -> None:
        deadline = time.monotonic() + self.lock_timeout_s
        while True:
            try:
                fcntl.flock(fd, fcntl.LOCK_EX | fcntl.LOCK_NB)
                return
            except OSError as exc:
                if exc.errno not in (errno.EAGAIN, errno.EACCES, errno.EWOULDBLOCK):
                    raise LibraryWriteError(f"{self.path}: cannot lock {lock_path(self.path).name} "
                                            f"({exc.strerror}); the file was not changed") from None
            if time.monotonic() > deadline:
                raise ConflictError(f"{self.path}: another crossrate is writing it (locked for over "
                                    f"{self.lock_timeout_s:g} s); nothing was written: try again")
            time.sleep(0.05)

    @staticmethod
    def _current(path: Path) -> bytes | None:
        try:
            return path.read_bytes()
        except FileNotFoundError:
            return None
        except OSError as exc:
            raise LibraryWriteError(f"{path}: cannot be read to check it before writing ({exc.strerror}); "
                                    "the file was not changed") from None

    @staticmethod
    def _replace_atomically(target: Path, data: bytes, mode: int | None) -> None:
        """Write data to a temporary file beside target, fsync it, then os.replace it over target.

        mode: permission bits to give it (the original file's); None for a new file (0o666 less umask).
        """
        tmp = target.with_name(f".{target.name}.{secrets.token_hex(6)}.tmp")
        fd = os.open(tmp, os.O_WRONLY | os.O_CREAT | os.O_EXCL, 0o600 if mode is not None else 0o666)
        try:
            with os.fdopen(fd, "wb") as fh:
                fh.write(data)
                fh.flush()
                os.fsync(fh.fileno())
            if mode is not None:
                os.chmod(tmp, mode)
            os.replace(tmp, target)
        except BaseException:
            # any failure (or interrupt) before the replace leaves the target untouched; drop the temporary
            try:
                os.unlink(tmp)
            except FileNotFoundError:
                pass
            raise
        _fsync_folder(target.parent)


def _fsync_folder(folder: Path) -> None:
    """Ask for the rename itself to be made durable. This runs after os.replace, when the new file is
    already in place, so a failure here must not be reported as "not written": some file systems refuse
    fsync on a folder, and then durability across a power cut is up to the file system."""
    try:
        fd = os.open(folder, os.O_RDONLY)
    except OSError:
        return
    try:
        os.fsync(fd)
    except OSError:
        return
    finally:
        os.close(fd)
