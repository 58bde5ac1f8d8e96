"""Writing a library file so that nothing anyone had is lost.

The new text is validated first (a text that does not validate is never written). The file written is the
real file: a path that is a symbolic link is followed to its target (a dangling link is refused), and a file
with several names (hard links) is refused, since replacing it would split the names. Then, under an
exclusive lock on the sibling `.<name>.lock` (file_lock: crossrate writers take turns), leftovers of a
crashed earlier write (`.<name>.<hex>.tmp`, `.<name>.bak.<hex>.tmp`) are removed, and the file's sha256 is
compared with the one the caller read: if someone changed it since, the write is refused with ConflictError.
Otherwise the previous version is kept as `<name>.bak`, the new text goes to a temporary file in the same
folder (flushed, fsync'ed, given the original's owner, group and mode where the process may), the file is
read once more and compared byte for byte immediately before os.replace moves the new text over it (atomic
on POSIX: a reader sees the old file or the new one, never half of one).

What the lock does not cover: a program that edits the file without taking the lock (a text editor, a
script appending a line). Its edit is caught in three ways. Made before the last comparison, it makes the
write refuse. A program that has the file open for writing when crossrate is about to write makes it refuse
too ("open for writing right now"). Made in the instant between the last comparison and the rename, it goes
to the replaced version: crossrate holds a read lease on that version (replaced_version.py), so it knows
when another program opened it for writing, waits until that program has closed it, reads it again, and
when it differs saves it as `<name>.conflict-<time>` and reports a conflict (the edit is kept, not lost).
Where no lease can be taken (another user's file, a network file system), the replaced version is read
again after a short pause; a program that opened the file before the rename and writes to it after that
look is then outside what crossrate can see.
"""

import os
import re
import secrets
import stat
import time
from collections.abc import Callable
from pathlib import Path

from ..errors import ConflictError
from .file_lock import LOCK_TIMEOUT_S, LibraryWriteError, acquire, lock_path, open_lock
from .replaced_version import OpenForWriting, ReplacedVersionWatch
from .toml_reader import sha256_of

__all__ = ["LOCK_TIMEOUT_S", "LibraryWriteError", "SafeWriter", "backup_path", "lock_path", "remove_leftovers"]

_NOFOLLOW = getattr(os, "O_NOFOLLOW", 0)


def backup_path(path: Path) -> Path:
    """Where the previous version is kept: `<name>.bak` beside the file."""
    return path.with_name(f"{path.name}.bak")


def _temp_name(target: Path) -> Path:
    return target.with_name(f".{target.name}.{secrets.token_hex(6)}.tmp")


def remove_leftovers(path: Path) -> list[str]:
    """Remove the temporary files a crashed write of `path` left beside it; returns their names.

    Only called under the file's lock: every crossrate write holds it while its temporary files exist, so
    a temporary file found then belongs to a process that died.
    """
    pattern = re.compile(rf"\.{re.escape(path.name)}(\.bak)?\.[0-9a-f]{{12}}\.tmp")
    removed = []
    try:
        names = os.listdir(path.parent)
    except OSError:
        return removed
    for name in names:
        if pattern.fullmatch(name):
            p = path.with_name(name)
            try:
                if stat.S_ISREG(os.lstat(p).st_mode):
                    os.unlink(p)
                    removed.append(name)
            except OSError:
                continue  # not ours to remove (permissions): it never shadows the file, being hidden
    return removed


class SafeWriter:
    """Atomic, checked writes of one library file (see the module docstring for the guarantees).

    validate: called with the new text before anything is written; it raises (LibraryError) to refuse.
    """

    def __init__(self, path, validate: Callable[[str], object] | None = None, lock_timeout_s: float = LOCK_TIMEOUT_S):
        self.path = Path(path)
        self.validate = validate
        self.lock_timeout_s = lock_timeout_s
        self._watch = None  # the read lease on the version being replaced, during a write

    def target(self) -> Path:
        """The file a write changes: the path itself, or the file its symbolic link(s) lead to."""
        path = self.path
        if not path.is_symlink():
            return path
        real = Path(os.path.realpath(path))
        if not real.exists():
            raise LibraryWriteError(f"{path}: is a symbolic link to {real}, which does not exist; expected a link "
                                    "to an existing library file (nothing was written)")
        return real

    def write(self, new_text: str, expected_sha256: str | None) -> str:
        """Replace the file with new_text if its content still has sha256 expected_sha256.

        expected_sha256: hex digest of the bytes the caller read; None means "the file must not exist yet".
        Returns the sha256 of the new content. Raises LibraryError (new text invalid), ConflictError (file
        changed or created since it was read, or locked too long), LibraryWriteError (I/O failure, hard
        links, not a regular file); in every one of those cases the file on disk is as it was.
        """
        if self.validate is not None:
            self.validate(new_text)
        data = new_text.encode("utf-8")
        target = self.target()
        lock_fd = open_lock(target, _stat_or_none(target))
        try:
            acquire(lock_fd, self.path, self.lock_timeout_s)
            remove_leftovers(target)
            remove_leftovers(backup_path(target))
            if self.target() != target:
                raise ConflictError(f"{self.path}: now links to another file than when it was read; nothing was "
                                    "written: reload the file and make the edit again")
            self._write_locked(target, data, expected_sha256)
            return sha256_of(data)
        finally:
            os.close(lock_fd)  # closing releases the flock

    def _write_locked(self, target: Path, data: bytes, expected_sha256: str | None) -> None:
        cur_fd, old, st = self._open_current(target)
        watch = None
        try:
            current_sha = None if old is None else sha256_of(old)
            if current_sha != expected_sha256:
                if expected_sha256 is None:
                    why = "exists already (created since you looked)"
                elif old is None:
                    why = "was deleted or moved since it was read"
                else:
                    why = "changed on disk since it was read (edited by someone else or another program)"
                raise ConflictError(f"{self.path}: {why}; nothing was written: reload the file and make the edit again")
            if st is not None and st.st_nlink > 1:
                raise LibraryWriteError(
                    f"{self.path}: has {st.st_nlink} names (hard links); replacing it would leave the other names "
                    "with the old text; expected a file with one name: share it by a symbolic link instead "
                    "(nothing was written)")
            if cur_fd is not None:
                try:
                    watch = self._watch = ReplacedVersionWatch(cur_fd)
                except OpenForWriting:
                    raise ConflictError(f"{self.path}: another program has it open for writing right now; nothing "
                                        "was written: try again in a moment") from None
            try:
                if old is not None:
                    self._replace_atomically(backup_path(target), old, st)
                self._replace_atomically(target, data, st, expected=old, create=old is None)
            except OSError as exc:
                raise LibraryWriteError(f"{self.path}: could not be written ({exc.strerror or exc}); "
                                        "the file was not changed") from None
            if watch is not None:
                watch.settle()  # a program that opened the old version meanwhile has finished with it
                self._check_replaced_version(cur_fd, old, target)
        finally:
            self._watch = None
            if watch is not None:
                watch.release()
            if cur_fd is not None:
                os.close(cur_fd)

    def _open_current(self, path: Path):
        """(fd, bytes, stat) of the file as it is now, or (None, None, None) when it does not exist. The fd
        stays open so that the replaced version can be read again after the rename."""
        try:
            fd = os.open(path, os.O_RDONLY | os.O_NONBLOCK | _NOFOLLOW)
        except FileNotFoundError:
            return None, None, None
        except OSError as exc:
            raise LibraryWriteError(f"{self.path}: cannot be read to check it before writing ({exc.strerror}); "
                                    "the file was not changed") from None
        try:
            st = os.fstat(fd)
            if not stat.S_ISREG(st.st_mode):
                raise LibraryWriteError(f"{self.path}: is not a regular file; expected a library TOML file "
                                        "(nothing was written)")
            return fd, _read_all(fd), st
        except BaseException:
            os.close(fd)
            raise

    def _check_replaced_version(self, fd: int, old: bytes, target: Path) -> None:
        """After the rename: did a program that ignores the lock write to the version just replaced? Then
        its text is saved beside the file and the write is reported as a conflict."""
        now = _read_all(fd)
        if now == old:
            return
        stamp = time.strftime("%Y%m%d-%H%M%S")
        saved = target.with_name(f"{target.name}.conflict-{stamp}-{secrets.token_hex(2)}")
        st = os.fstat(fd)
        self._replace_atomically(saved, now, st, create=True)
        raise ConflictError(f"{self.path}: another program changed it at the moment crossrate replaced it; "
                            f"crossrate's edit is in the file and the other program's version was saved as "
                            f"{saved.name}: merge the two by hand")

    def _replace_atomically(self, target: Path, data: bytes, st: os.stat_result | None,
                            expected: bytes | None = None, create: bool = False) -> None:
        """Write data to a temporary file beside target, fsync it, then move it over target.

        st: the original file's stat (owner, group and mode are copied where the process may); None for a
        new file (0o666 less umask). expected: the bytes target must still hold just before the rename (the
        library file itself; None: no check, as for the backup). create: target must not exist (a new
        library file, a saved conflict): it is linked into place, which never replaces anyone's file.
        """
        tmp = _temp_name(target)
        fd = os.open(tmp, os.O_WRONLY | os.O_CREAT | os.O_EXCL | _NOFOLLOW, 0o600 if st is not None else 0o666)
        try:
            with os.fdopen(fd, "wb") as fh:
                if st is not None:
                    _copy_owner_and_mode(fh.fileno(), st)
                fh.write(data)
                fh.flush()
                os.fsync(fh.fileno())
            if create:
                os.link(tmp, target)
                os.unlink(tmp)
            else:
                if expected is not None:
                    self._last_check(target, expected, st)
                os.replace(tmp, target)
        except FileExistsError:
            _unlink_quietly(tmp)
            raise ConflictError(f"{self.path}: exists already (created since you looked); nothing was written: "
                                "reload the file and make the edit again") from None
        except BaseException:
            # any failure (or interrupt) before the replace leaves the target untouched; drop the temporary
            _unlink_quietly(tmp)
            raise
        _fsync_folder(target.parent)

    def _last_check(self, target: Path, expected: bytes, st: os.stat_result | None) -> None:
        """Immediately before the rename: the file is still the same file with the same bytes."""
        try:
            fd = os.open(target, os.O_RDONLY | os.O_NONBLOCK | _NOFOLLOW)
        except FileNotFoundError:
            raise ConflictError(f"{self.path}: was deleted or moved while crossrate was writing it; nothing was "
                                "written: reload the file and make the edit again") from None
        try:
            now_st = os.fstat(fd)
            same = (st is not None and (now_st.st_dev, now_st.st_ino) == (st.st_dev, st.st_ino)
                    and _read_all(fd) == expected)
        finally:
            os.close(fd)
        if not same:
            raise ConflictError(f"{self.path}: changed on disk while crossrate was writing it (edited by another "
                                "program); nothing was written: reload the file and make the edit again")
        if self._watch is not None and self._watch.broken():
            raise ConflictError(f"{self.path}: another program opened it for writing while crossrate was writing it; "
                                "nothing was written: try again in a moment")


def _copy_owner_and_mode(fd: int, st: os.stat_result) -> None:
    """Give the new file the old one's owner and group (each where permitted), then its mode bits (after the
    chown, which may clear set-id bits)."""
    try:
        os.fchown(fd, st.st_uid, st.st_gid)
    except OSError:
        try:
            os.fchown(fd, -1, st.st_gid)
        except OSError:
            pass  # not a member of the file's group: it keeps the writer's group
    os.fchmod(fd, stat.S_IMODE(st.st_mode))


def _read_all(fd: int) -> bytes:
    os.lseek(fd, 0, os.SEEK_SET)
    chunks = []
    while True:
        chunk = os.read(fd, 1 << 20)
        if not chunk:
            return b"".join(chunks)
        chunks.append(chunk)


def _stat_or_none(path: Path) -> os.stat_result | None:
    try:
        return os.stat(path)
    except OSError:
        return None


def _unlink_quietly(path: Path) -> None:
    try:
        os.unlink(path)
    except FileNotFoundError:
        pass


def replace_atomically(target, data: bytes) -> None:
    """Write bytes to a temporary file beside target, fsync it and move it over target (no lock, no
    backup, no check of what was there): for files crossrate owns alone, such as its cache entries.
    A new file gets 0o666 less umask. Raises OSError; target is then as it was."""
    target = Path(target)
    SafeWriter(target)._replace_atomically(target, data, None)


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
