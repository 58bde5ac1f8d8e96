"""The content-keyed cache of validated library files: hits give what a fresh read gives, and it is never
stale; a cache folder that is read-only, missing or damaged only costs speed."""

import errno
import os
import stat

import pytest
from library_helpers import BASE

from crossrate.errors import LibraryError
from crossrate.library import safe_writer
from crossrate.library.layers import load_layered
from crossrate.library.load_cache import cache_dir, read_library_cached
from crossrate.library.toml_reader import read_library_file


@pytest.fixture
def cache_home(tmp_path, monkeypatch):
    home = tmp_path / "xdg-cache"
    monkeypatch.setenv("XDG_CACHE_HOME", str(home))
    monkeypatch.delenv("CROSSRATE_NO_CACHE", raising=False)
    return home


def _entries():
    folder = cache_dir()
    return sorted(folder.glob("*.pickle")) if folder.is_dir() else []


def test_cache_folder_honours_xdg_cache_home(cache_home):
    assert cache_dir() == cache_home / "crossrate" / "library"


def test_repeat_load_comes_from_the_cache_and_equals_a_fresh_read(cache_home, base_file):
    first = read_library_cached(base_file)
    assert not first.from_cache and len(_entries()) == 1
    again = read_library_cached(base_file)
    assert again.from_cache
    fresh = read_library_file(base_file)
    assert again.couples == fresh.couples
    for a, b in zip(again.couples, fresh.couples, strict=True):
        # origins (not part of Couple equality) carry the same file, line, layer and field lines
        assert a.origin == b.origin and a.origin.line_of("radius") == b.origin.line_of("radius")
    assert (again.title, again.defaults, again.scales, again.sha256) == (
        fresh.title, fresh.defaults, fresh.scales, fresh.sha256)
    assert again.scale_line("Fc-MeCN") == fresh.index.table("library", "scales", "Fc-MeCN").line


def test_changed_content_is_never_served_from_an_old_entry(cache_home, write_lib):
    path = write_lib(BASE)
    assert read_library_cached(path).couples[0].E == 0.5
    read_library_cached(path)
    # same length, one digit changed, mtime forced back: only the content can tell
    st = os.stat(path)
    path.write_text(BASE.replace("E = 0.50", "E = 0.51"), encoding="utf-8")
    os.utime(path, ns=(st.st_atime_ns, st.st_mtime_ns))
    changed = read_library_cached(path)
    assert not changed.from_cache and changed.couples[0].E == 0.51
    assert len(_entries()) == 1  # the entry of the old content was dropped
    path.write_text(BASE, encoding="utf-8")  # back to the first content: read afresh (its entry is gone)
    assert read_library_cached(path).couples[0].E == 0.5


def test_a_file_with_problems_is_never_cached(cache_home, write_lib):
    path = write_lib(BASE.replace("radius = 3.5", "radius = -3.5"))
    for _ in range(2):
        with pytest.raises(LibraryError) as exc:
            read_library_cached(path)
        assert "field radius" in str(exc.value)
    assert _entries() == []


def test_the_scales_of_earlier_layers_are_part_of_the_key(cache_home, write_lib, tmp_path):
    scales = write_lib(BASE.split("# --- aqueous ---")[0], "scales.toml")
    user = write_lib('[library]\ntitle = "u"\nformat = 1\n\n[couple.u-one]\nname = "u"\ncharge_ox = 1\n'
                     'charge_red = 0\nE = 0.1\nE_scale = "Fc-MeCN"\nradius = 4.0\nmedium = "acetonitrile"\n'
                     'ionic_strength = 0.1\ntemperature = 298.15\nsource = "invented for the tests"\n', "user.toml")
    assert len(load_layered(extra_paths=(scales, user), bundled=False, group=False, personal=False)) == 1
    assert len(load_layered(extra_paths=(scales, user), bundled=False, group=False, personal=False)) == 1
    # without the file that defines Fc-MeCN, the same user file must fail, not come back from the cache
    with pytest.raises(LibraryError, match="unknown potential scale"):
        load_layered(extra_paths=(user,), bundled=False, group=False, personal=False)


def test_cache_folder_that_cannot_be_made(cache_home, base_file):
    cache_home.write_text("a file where the cache folder would go", encoding="utf-8")
    assert len(read_library_cached(base_file).couples) == 3
    assert len(read_library_cached(base_file).couples) == 3
    assert cache_home.is_file()


def test_read_only_cache_folder(cache_home, base_file, monkeypatch):
    def refuse(*_args, **_kwargs):
        raise OSError(errno.EROFS, "Read-only file system")

    monkeypatch.setattr(safe_writer, "replace_atomically", refuse)
    for _ in range(2):
        loaded = read_library_cached(base_file)
        assert not loaded.from_cache and len(loaded.couples) == 3
    assert _entries() == []


@pytest.mark.skipif(os.geteuid() == 0, reason="root writes into a folder without write permission")
def test_read_only_cache_folder_by_permissions(cache_home, base_file):
    folder = cache_dir()
    folder.mkdir(parents=True)
    folder.chmod(stat.S_IRUSR | stat.S_IXUSR)
    try:
        assert len(read_library_cached(base_file).couples) == 3
        assert _entries() == []
    finally:
        folder.chmod(stat.S_IRWXU)


def test_damaged_entry_is_ignored_and_replaced(cache_home, base_file):
    read_library_cached(base_file)
    (entry,) = _entries()
    entry.write_bytes(b"\x80\x05not a pickle at all")
    loaded = read_library_cached(base_file)
    assert not loaded.from_cache and len(loaded.couples) == 3
    assert read_library_cached(base_file).from_cache


def test_entries_in_a_folder_writable_by_others_are_not_trusted(cache_home, base_file):
    read_library_cached(base_file)
    cache_dir().chmod(0o777)
    assert not read_library_cached(base_file).from_cache
    cache_dir().chmod(0o700)
    assert read_library_cached(base_file).from_cache


def test_cache_can_be_turned_off(cache_home, base_file, monkeypatch):
    monkeypatch.setenv("CROSSRATE_NO_CACHE", "1")
    read_library_cached(base_file)
    assert not read_library_cached(base_file).from_cache
    assert _entries() == []


def test_a_change_to_the_validating_code_gives_another_key(tmp_path, monkeypatch):
    # The code's fingerprint is taken from each file's identity (inode, size, modification and status-change
    # times), not its content: an edit of the same size whose modification time is put back (cp -p, tar)
    # still gives another key, because a write always sets the status-change time.
    import time

    from crossrate.library import load_cache

    code = tmp_path / "validation_rule.py"
    code.write_text("LIMIT = 0.5\n")
    monkeypatch.setattr(load_cache, "_CODE_FILES", (str(code),))  # an absolute path: joined as it is
    load_cache.code_fingerprint.cache_clear()
    before = load_cache.code_fingerprint()
    assert load_cache.code_fingerprint() == before  # stable while nothing changes
    st = code.stat()
    time.sleep(0.05)  # file times tick at the kernel's clock (a few ms)
    code.write_text("LIMIT = 0.6\n")
    os.utime(code, ns=(st.st_atime_ns, st.st_mtime_ns))
    assert code.stat().st_size == st.st_size and code.stat().st_mtime_ns == st.st_mtime_ns
    load_cache.code_fingerprint.cache_clear()
    assert load_cache.code_fingerprint() != before
    code.unlink()
    load_cache.code_fingerprint.cache_clear()
    assert load_cache.code_fingerprint() not in (before, "")
    monkeypatch.undo()
    load_cache.code_fingerprint.cache_clear()
