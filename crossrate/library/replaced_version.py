"""Watching the version of a library file that a write is about to replace, for programs that edit it
without taking crossrate's lock.

On Linux a read lease (fcntl F_SETLEASE) on the open file tells whether any other process opened it for
writing while crossrate held the lease: the opener is held until the lease is released, and the lease then
reports the break. So: take the lease before the last comparison; if it was broken by then, refuse the write
(the other program goes on as if crossrate had not been there); otherwise rename the new version into place,
and if the lease was broken in that last instant, let the other program go on and wait until it has closed
the file; its edit is then in the replaced version, where SafeWriter finds it and saves it. Where leases are not available (another
user's file without CAP_LEASE, a network file system), a short pause before that last look stands in.
"""

import errno
import fcntl
import os
import signal
import time

#: How long to wait for another program that opened the replaced version to close it, s.
CLOSE_WAIT_S = 2.0
#: Pause before looking at the replaced version again when no lease can be taken, s.
FALLBACK_PAUSE_S = 0.01


class OpenForWriting(Exception):
    """Another process has the file open for writing right now (no lease possible)."""


class ReplacedVersionWatch:
    """A read lease on fd (a read-only descriptor of the file about to be replaced), when one can be had."""

    def __init__(self, fd: int):
        self.fd = fd
        self.leased = False
        try:
            # the lease-break signal defaults to SIGIO, which would end the process; SIGURG is ignored by default
            fcntl.fcntl(fd, fcntl.F_SETSIG, signal.SIGURG)
            fcntl.fcntl(fd, fcntl.F_SETLEASE, fcntl.F_RDLCK)
            self.leased = True
        except OSError as exc:
            if exc.errno == errno.EAGAIN:
                raise OpenForWriting from None
            # EACCES (another user's file), EINVAL/ENOSYS (file system without leases): no lease

    def broken(self) -> bool:
        """True when another process has opened the file for writing since the lease was taken."""
        if not self.leased:
            return False
        try:
            return fcntl.fcntl(self.fd, fcntl.F_GETLEASE) != fcntl.F_RDLCK
        except OSError:
            return False

    def settle(self) -> None:
        """After the rename: return once no other program still has the replaced version open for writing
        (or after CLOSE_WAIT_S), releasing the lease."""
        if not self.leased:
            time.sleep(FALLBACK_PAUSE_S)
            return
        try:
            broken = fcntl.fcntl(self.fd, fcntl.F_GETLEASE) != fcntl.F_RDLCK
            fcntl.fcntl(self.fd, fcntl.F_SETLEASE, fcntl.F_UNLCK)
        except OSError:
            return
        self.leased = False
        if not broken:
            return  # nobody opened it for writing while the lease was held
        deadline = time.monotonic() + CLOSE_WAIT_S
        while time.monotonic() < deadline:
            try:
                fcntl.fcntl(self.fd, fcntl.F_SETLEASE, fcntl.F_RDLCK)  # possible again once the writer closed
            except OSError:
                time.sleep(0.002)
                continue
            fcntl.fcntl(self.fd, fcntl.F_SETLEASE, fcntl.F_UNLCK)
            return

    def release(self) -> None:
        if self.leased:
            try:
                fcntl.fcntl(self.fd, fcntl.F_SETLEASE, fcntl.F_UNLCK)
            except OSError:
                pass
            self.leased = False


def no_lease_possible() -> bool:
    """True where this platform has no leases at all (the watch then only pauses)."""
    return not hasattr(fcntl, "F_SETLEASE") or os.name != "posix"
