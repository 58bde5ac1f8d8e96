"""The safe writer under faults: an outside edit during the write, leftovers of a crashed write, symbolic and
hard links, shared group files (owner, group, mode, lock file)."""

import os
import shutil
import stat
import tempfile
from pathlib import Path

import pytest
from library_helpers import BASE

from crossrate.errors import ConflictError
from crossrate.library import safe_writer
from crossrate.library.safe_writer import LibraryWriteError, SafeWriter, backup_path, lock_path
from crossrate.library.toml_reader import sha256_of

NEW = BASE.replace("E = 0.50", "E = 0.55")


def _sha(p):
    return sha256_of(Path(p).read_bytes())


def _append_from_another_process(path, text: str) -> int:
    """Fork a process that appends text to path (no lock, as another program would); its pid, returned once
    the child is about to open the file (and, a moment later, inside open())."""
    import time

    r, w = os.pipe()
    pid = os.fork()
    if pid == 0:
        try:
            os.close(r)
            os.write(w, b"x")
            with open(path, "a") as fh:
                fh.write(text)
        finally:
            os._exit(0)
    os.close(w)
    os.read(r, 1)
    os.close(r)
    time.sleep(0.02)
    return pid


class _NoLease:
    """A file system without leases (a network share): the watch only pauses."""

    def __init__(self, fd):
        self.leased = False

    def settle(self):
        return None

    def release(self):
        return None


def test_outside_edit_before_the_last_check_is_refused(base_file, monkeypatch):
    # Another program (no lock) appends to the file and closes it after crossrate read it: the comparison
    # before the rename sees it, nothing is written and the outside edit stays.
    monkeypatch.setattr(safe_writer, "ReplacedVersionWatch", _NoLease)
    sha = _sha(base_file)
    real = os.fsync
    calls = {"n": 0}

    def fsync_then_outside_edit(fd):
        real(fd)
        calls["n"] += 1
        if calls["n"] == 3:  # 1 backup temporary, 2 folder, 3 the new text's temporary
            os.waitpid(_append_from_another_process(base_file, "# appended by another program\n"), 0)

    writer = SafeWriter(base_file)
    monkeypatch.setattr(os, "fsync", fsync_then_outside_edit)
    with pytest.raises(ConflictError, match="changed on disk while crossrate was writing it.*nothing was written"):
        writer.write(NEW, sha)
    monkeypatch.undo()
    assert base_file.read_text() == BASE + "# appended by another program\n"
    assert not [p for p in base_file.parent.iterdir() if p.suffix == ".tmp"]


def test_outside_edit_during_the_write_is_refused_and_kept(base_file):
    # Another program opens the file to append while crossrate writes its temporary: the read lease holds
    # it back and tells crossrate, which refuses the write before the rename and lets the other program go on.
    sha = _sha(base_file)
    real = os.fsync
    calls = {"n": 0}
    children = []

    def fsync_then_outside_edit(fd):
        real(fd)
        calls["n"] += 1
        if calls["n"] == 3:
            children.append(_append_from_another_process(base_file, "# appended during the write\n"))

    os.fsync = fsync_then_outside_edit
    try:
        with pytest.raises(ConflictError, match="another program opened it for writing while crossrate was writing "
                           "it; nothing was written: try again"):
            SafeWriter(base_file).write(NEW, sha)
    finally:
        os.fsync = real
    for pid in children:
        os.waitpid(pid, 0)
    assert base_file.read_text() == BASE + "# appended during the write\n"
    assert not [p for p in base_file.parent.iterdir() if ".conflict-" in p.name or p.suffix == ".tmp"]


def test_leftovers_of_a_crashed_write_are_removed_by_the_next_write(base_file):
    folder = base_file.parent
    stale = [folder / ".lib.toml.0123456789ab.tmp", folder / ".lib.toml.bak.ba9876543210.tmp"]
    for p in stale:
        p.write_text("half a file")
    other = folder / ".other.toml.0123456789ab.tmp"
    other.write_text("not ours")
    SafeWriter(base_file).write(NEW, _sha(base_file))
    assert not any(p.exists() for p in stale)
    assert other.exists()
    assert base_file.read_text() == NEW and backup_path(base_file).read_text() == BASE


def test_symbolic_link_edits_its_target(tmp_path):
    shared = tmp_path / "shared"
    home = tmp_path / "home"
    shared.mkdir()
    home.mkdir()
    real = shared / "group.toml"
    real.write_text(BASE)
    link = home / "group.toml"
    link.symlink_to(real)
    SafeWriter(link).write(NEW, _sha(link))
    assert link.is_symlink() and os.readlink(link) == str(real)
    assert real.read_text() == NEW
    assert backup_path(real).read_text() == BASE and lock_path(real).exists()
    assert sorted(p.name for p in home.iterdir()) == ["group.toml"]


def test_dangling_symbolic_link_is_refused(tmp_path):
    link = tmp_path / "lib.toml"
    link.symlink_to(tmp_path / "elsewhere" / "x.toml")
    with pytest.raises(LibraryWriteError, match="is a symbolic link to .*which does not exist"):
        SafeWriter(link).write(BASE, None)
    assert not (tmp_path / "elsewhere").exists()


def test_hard_linked_file_is_refused(base_file):
    other = base_file.with_name("other-name.toml")
    os.link(base_file, other)
    with pytest.raises(LibraryWriteError, match="has 2 names .hard links.*symbolic link instead"):
        SafeWriter(base_file).write(NEW, _sha(base_file))
    assert base_file.read_text() == BASE == other.read_text()


def test_file_replaced_by_a_link_to_elsewhere_is_not_written_through(base_file, tmp_path):
    # Read, then someone swaps the file for a link to another file: the content check refuses.
    sha = _sha(base_file)
    victim = tmp_path / "victim.txt"
    victim.write_text("do not touch\n")
    base_file.unlink()
    base_file.symlink_to(victim)
    with pytest.raises(ConflictError):
        SafeWriter(base_file).write(NEW, sha)
    assert victim.read_text() == "do not touch\n"


def test_lock_file_mode_follows_the_file(base_file):
    os.chmod(base_file, 0o664)
    old = os.umask(0o022)
    try:
        SafeWriter(base_file).write(NEW, _sha(base_file))
    finally:
        os.umask(old)
    assert stat.S_IMODE(os.stat(lock_path(base_file)).st_mode) == 0o664
    assert stat.S_IMODE(os.stat(base_file).st_mode) == 0o664


def test_lock_file_one_may_only_read_still_locks(base_file):
    lock = lock_path(base_file)
    lock.write_text("")
    os.chmod(lock, 0o444)
    SafeWriter(base_file).write(NEW, _sha(base_file))
    assert base_file.read_text() == NEW


root_only = pytest.mark.skipif(os.geteuid() != 0, reason="changing owners needs root")


@root_only
def test_owner_and_group_kept_on_rewrite(base_file):
    os.chown(base_file, 4321, 4322)
    os.chmod(base_file, 0o660)
    SafeWriter(base_file).write(NEW, _sha(base_file))
    st = os.stat(base_file)
    assert (st.st_uid, st.st_gid, stat.S_IMODE(st.st_mode)) == (4321, 4322, 0o660)
    bst = os.stat(backup_path(base_file))
    assert (bst.st_uid, bst.st_gid, stat.S_IMODE(bst.st_mode)) == (4321, 4322, 0o660)


def _edit_as(uid, gid, path, line, umask=0o022):
    """Append `line` to the library file through SafeWriter as another user in group gid (a forked child:
    the shared-group case). Returns (exit status, error message)."""
    r, w = os.pipe()
    pid = os.fork()
    if pid == 0:  # child: drop to the other user, edit, report through the pipe
        code = 0
        try:
            os.close(r)
            os.setgroups([gid])
            os.setgid(gid)
            os.setuid(uid)
            os.umask(umask)
            data = Path(path).read_bytes()
            SafeWriter(path).write(data.decode() + line, sha256_of(data))
        except BaseException as exc:  # reported to the parent, which fails the test
            os.write(w, str(exc).encode())
            code = 1
        os._exit(code)
    os.close(w)
    with os.fdopen(r, "rb") as fh:
        msg = fh.read().decode()
    _, status = os.waitpid(pid, 0)
    return os.waitstatus_to_exitcode(status), msg


@pytest.fixture
def open_folder():
    """A folder every user may reach (pytest's tmp_path sits under a private folder)."""
    folder = Path(tempfile.mkdtemp(prefix="crossrate-shared-"))
    os.chmod(folder, 0o755)
    yield folder
    shutil.rmtree(folder)


@root_only
def test_shared_group_file_stays_editable_by_the_group(open_folder):
    # Two members (uids 4001, 4002) of group 4000 edit one file in a setgid group folder, in turn.
    folder = open_folder / "shared"
    folder.mkdir()
    os.chown(folder, 0, 4000)
    os.chmod(folder, 0o2775)
    lib = folder / "group.toml"
    lib.write_text(BASE)
    os.chown(lib, 4001, 4000)
    os.chmod(lib, 0o664)
    for who, uid in (("a", 4001), ("b", 4002), ("a", 4001)):
        # a strict umask must not make the file or its lock private to one member
        code, msg = _edit_as(uid, 4000, lib, f"# edited by {who}\n", umask=0o077)
        assert code == 0, msg
    st = os.stat(lib)
    assert st.st_gid == 4000 and stat.S_IMODE(st.st_mode) == 0o664
    assert lib.read_text().endswith("# edited by a\n# edited by b\n# edited by a\n")
    lst = os.stat(lock_path(lib))
    assert lst.st_gid == 4000 and stat.S_IMODE(lst.st_mode) & 0o060 == 0o060


@root_only
def test_unreadable_lock_file_is_reported_as_such(open_folder):
    base_file = open_folder / "lib.toml"
    base_file.write_text(BASE)
    lock = lock_path(base_file)
    lock.write_text("")
    os.chmod(lock, 0o600)
    os.chmod(base_file, 0o666)
    os.chmod(base_file.parent, 0o777)
    code, msg = _edit_as(4005, 4005, base_file, "#\n")
    assert code == 1
    assert "the lock file .lib.toml.lock exists but you may not read it" in msg
    assert "cannot create" not in msg
    assert base_file.read_text() == BASE


def test_outside_program_holding_the_old_version_open_across_the_rename(base_file, monkeypatch):
    # Another program opens the file for appending just before the rename and writes well after it (a slow
    # or descheduled script): the read lease tells crossrate, which waits for it to close the file and saves
    # its version. Without the lease the line would go into an unnamed file and be lost.
    import time

    sha = _sha(base_file)
    real = os.replace
    children = []

    def replace_with_a_slow_appender(src, dst):
        if Path(dst) == base_file:
            pid = os.fork()
            if pid == 0:
                try:
                    with open(base_file, "a") as fh:  # resolves the old version, held until the lease is let go
                        time.sleep(0.05)
                        fh.write("# written late by a slow program\n")
                finally:
                    os._exit(0)
            children.append(pid)
            time.sleep(0.05)  # the child is now inside open()
        return real(src, dst)

    monkeypatch.setattr(os, "replace", replace_with_a_slow_appender)
    with pytest.raises(ConflictError, match="saved as lib.toml.conflict-"):
        SafeWriter(base_file).write(NEW, sha)
    monkeypatch.undo()
    for pid in children:
        os.waitpid(pid, 0)
    assert base_file.read_text() == NEW
    saved = [p for p in base_file.parent.iterdir() if ".conflict-" in p.name]
    assert len(saved) == 1 and saved[0].read_text().endswith("# written late by a slow program\n")


def test_file_open_for_writing_elsewhere_is_refused(base_file):
    import subprocess
    import sys

    holder = subprocess.Popen([sys.executable, "-c", f"import time; f = open({str(base_file)!r}, 'a'); "
                               "print('open', flush=True); time.sleep(30)"], stdout=subprocess.PIPE, text=True)
    try:
        assert holder.stdout.readline().strip() == "open"
        with pytest.raises(ConflictError, match="another program has it open for writing right now; nothing was "
                           "written: try again"):
            SafeWriter(base_file).write(NEW, _sha(base_file))
    finally:
        holder.kill()
        holder.wait()
    assert base_file.read_text() == BASE
