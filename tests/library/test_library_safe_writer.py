"""The safe writer: refuses stale writes, is atomic, keeps permissions, makes a backup, never litters."""

import dataclasses
import fcntl
import os
import stat

import pytest
from library_helpers import BASE

from crossrate.errors import ConflictError, LibraryError
from crossrate.library.couple_edits import update_couple
from crossrate.library.safe_writer import LibraryWriteError, SafeWriter, backup_path, lock_path
from crossrate.library.toml_reader import parse_library_text, read_library_file, sha256_of


def _leftovers(folder):
    """Files other than the library, its backup and its lock (temporary files must not be left behind)."""
    return sorted(p.name for p in folder.iterdir() if p.suffix == ".tmp")


def test_conflict_when_file_changed_between_read_and_write(base_file):
    # Two people read the same version; the first one's edit lands, the second one's is refused.
    lf_a = read_library_file(base_file)
    lf_b = read_library_file(base_file)
    update_couple(base_file, dataclasses.replace(lf_a.couple("t-one"), k_self=11.0), lf_a.sha256)
    after_a = base_file.read_bytes()
    with pytest.raises(ConflictError, match="changed on disk since it was read"):
        update_couple(base_file, dataclasses.replace(lf_b.couple("t-two"), k_self=22.0), lf_b.sha256)
    assert base_file.read_bytes() == after_a  # the first edit is not lost
    assert _leftovers(base_file.parent) == []


def test_conflict_rechecked_under_the_lock(base_file):
    # The file changes after the edit computed its text but before the writer replaces it.
    sha = sha256_of(base_file.read_bytes())
    calls = []

    def validate(text):
        calls.append(text)
        base_file.write_text(BASE.replace("test one", "edited by someone else"))  # meanwhile, on disk

    writer = SafeWriter(base_file, validate=validate)
    with pytest.raises(ConflictError):
        writer.write(BASE.replace("E = 0.50", "E = 0.55"), sha)
    assert "edited by someone else" in base_file.read_text()
    assert calls


def test_invalid_new_text_leaves_file_untouched(base_file):
    sha = sha256_of(base_file.read_bytes())
    writer = SafeWriter(base_file, validate=lambda t: parse_library_text(t, str(base_file)))
    with pytest.raises(LibraryError, match="field E: got 9 V"):
        writer.write(BASE.replace("E = 0.50", "E = 9"), sha)
    assert base_file.read_text() == BASE
    assert not backup_path(base_file).exists()


# Calls in a write: fsync 1 (backup's temporary), replace 1 (backup), fsync 2 (folder), fsync 3 (new
# file's temporary), replace 2 (the file itself), fsync 4 (folder).
@pytest.mark.parametrize("victim,nth", [("replace", 1), ("replace", 2), ("fsync", 1), ("fsync", 3)])
def test_write_killed_halfway_keeps_old_file_and_no_temp(base_file, monkeypatch, victim, nth):
    sha = sha256_of(base_file.read_bytes())
    real = getattr(os, victim)
    state = {"n": 0}

    def dies(*args, **kwargs):
        state["n"] += 1
        if state["n"] == nth:
            raise OSError(5, "Input/output error")
        return real(*args, **kwargs)

    monkeypatch.setattr(os, victim, dies)
    with pytest.raises(LibraryWriteError, match="could not be written .*the file was not changed"):
        SafeWriter(base_file).write(BASE.replace("E = 0.50", "E = 0.55"), sha)
    monkeypatch.undo()
    assert base_file.read_text() == BASE
    assert _leftovers(base_file.parent) == []


def test_interrupt_during_write_keeps_old_file(base_file, monkeypatch):
    sha = sha256_of(base_file.read_bytes())

    def interrupted(*args, **kwargs):
        raise KeyboardInterrupt

    monkeypatch.setattr(os, "replace", interrupted)
    with pytest.raises(KeyboardInterrupt):
        SafeWriter(base_file).write("[library]\nformat = 1\n", sha)
    monkeypatch.undo()
    assert base_file.read_text() == BASE
    assert _leftovers(base_file.parent) == []


def test_permissions_kept_and_backup_made(base_file):
    os.chmod(base_file, 0o640)
    sha = sha256_of(base_file.read_bytes())
    new_text = BASE.replace("E = 0.50", "E = 0.55")
    new_sha = SafeWriter(base_file).write(new_text, sha)
    assert stat.S_IMODE(os.stat(base_file).st_mode) == 0o640
    assert base_file.read_text() == new_text and new_sha == sha256_of(new_text.encode())
    bak = backup_path(base_file)
    assert bak.read_text() == BASE and stat.S_IMODE(os.stat(bak).st_mode) == 0o640
    assert lock_path(base_file).name == ".lib.toml.lock" and lock_path(base_file).exists()
    assert _leftovers(base_file.parent) == []


def test_new_file_gets_ordinary_permissions(tmp_path):
    p = tmp_path / "new.toml"
    old = os.umask(0o022)
    try:
        SafeWriter(p).write("[library]\nformat = 1\n", None)
    finally:
        os.umask(old)
    assert stat.S_IMODE(os.stat(p).st_mode) == 0o644
    assert not backup_path(p).exists()


def test_lock_held_by_another_writer_is_refused_not_waited_forever(base_file):
    sha = sha256_of(base_file.read_bytes())
    fd = os.open(lock_path(base_file), os.O_RDWR | os.O_CREAT, 0o666)
    try:
        fcntl.flock(fd, fcntl.LOCK_EX)  # another process (here: another open file) holds the lock
        with pytest.raises(ConflictError, match="another crossrate is writing it"):
            SafeWriter(base_file, lock_timeout_s=0.2).write(BASE.replace("E = 0.50", "E = 0.55"), sha)
    finally:
        os.close(fd)
    assert base_file.read_text() == BASE


def test_deleted_file_is_a_conflict(base_file):
    sha = sha256_of(base_file.read_bytes())
    base_file.unlink()
    with pytest.raises(ConflictError, match="deleted or moved"):
        SafeWriter(base_file).write(BASE, sha)
    assert not base_file.exists()


def test_lock_file_that_cannot_be_created_reports_and_changes_nothing(base_file, monkeypatch):
    sha = sha256_of(base_file.read_bytes())
    real_open = os.open

    def no_lock(path, *args, **kwargs):
        if str(path).endswith(".lock"):
            raise PermissionError(13, "Permission denied")
        return real_open(path, *args, **kwargs)

    monkeypatch.setattr(os, "open", no_lock)
    with pytest.raises(LibraryWriteError, match="cannot create the lock file .lib.toml.lock"):
        SafeWriter(base_file).write(BASE.replace("E = 0.50", "E = 0.55"), sha)
    monkeypatch.undo()
    assert base_file.read_text() == BASE
