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
from crossrate.library.safe_writer import LibraryWriteError, SafeWriter, backup_path, lock_path
from crossrate.library.toml_reader import sha256_of

NEW = BASE.replace("E = 0.50", "E = 0.55")


def _sha(p):
    return sha256_of(Path(p).read_bytes())


def test_outside_edit_after_the_temporary_is_written_is_refused(base_file, monkeypatch):
    # Another program (no lock) appends while crossrate fsyncs its temporary: the last check before the
    # rename sees it, nothing is written and the outside edit stays.
    sha = _sha(base_file)
    real = os.fsync
    calls = {"n": 0}

    def fsync_then_outside_edit(fd):
        real(fd)
        calls["n"] += 1
        if calls["n"] == 3:  # 1 backup temporary, 2 folder, 3 the new text's temporary
            with open(base_file, "a") as fh:
                fh.write("# appended by another program\n")

    monkeypatch.setattr(os, "fsync", fsync_then_outside_edit)
    with pytest.raises(ConflictError, match="changed on disk while crossrate was writing it.*nothing was written"):
        SafeWriter(base_file).write(NEW, sha)
    monkeypatch.undo()
    assert base_file.read_text() == BASE + "# appended by another program\n"
    assert not [p for p in base_file.parent.iterdir() if p.suffix == ".tmp"]


def test_outside_edit_at_the_rename_is_saved_and_reported(base_file, monkeypatch):
    # The outside append lands on the old version in the instant of the rename: crossrate's edit is in place,
    # the other program's version is saved beside it and the write is reported as a conflict.
    sha = _sha(base_file)
    real = os.replace

    def append_then_replace(src, dst):
        if Path(dst) == base_file:
            with open(base_file, "a") as fh:
                fh.write("# appended at the rename\n")
            # the last check already ran; the append went to the version being replaced
        return real(src, dst)

    writer = SafeWriter(base_file)
    monkeypatch.setattr(writer, "_last_check", lambda *a: None)
    monkeypatch.setattr(os, "replace", append_then_replace)
    with pytest.raises(ConflictError, match=r"another program changed it at the moment.*saved as lib\.toml\.conflict-"):
        writer.write(NEW, sha)
    monkeypatch.undo()
    assert base_file.read_text() == NEW
    saved = [p for p in base_file.parent.iterdir() if ".conflict-" in p.name]
    assert len(saved) == 1 and saved[0].read_text() == BASE + "# appended at the rename\n"


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
