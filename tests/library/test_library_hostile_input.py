"""Hostile library files through the reader and `library validate`: integers too large for a float, FIFOs,
devices and folders. Each gives the usual `file:line: couple: field: ...` line and exit 2, at once."""

import os

import pytest
from library_helpers import BASE

from crossrate.cli.main import main
from crossrate.errors import LibraryError
from crossrate.library.toml_reader import read_library_file
from crossrate.library.validation import describe

HUGE = "1" + "0" * 400


def _validate(capsys, *paths):
    rc = main(["library", "validate", *map(str, paths)])
    out, err = capsys.readouterr()
    return rc, out, err


@pytest.mark.parametrize("old,new,field", [
    ("k_self = 1.0e3", f"k_self = {HUGE}", "k_self"),
    ("radius = 3.5", f"radius = -{HUGE}", "radius"),
    ("charge_ox = 3", f"charge_ox = {HUGE}", "charge_ox"),
    ("temperature = 298.15", f"temperature = {HUGE}", "temperature"),
    ("offset_V = 0.63", f"offset_V = {HUGE}", "offset_V"),
])
def test_integer_too_large_for_a_float_is_a_field_problem(capsys, write_lib, old, new, field):
    p = write_lib(BASE.replace(old, new, 1))
    rc, out, err = _validate(capsys, p)
    assert rc == 2 and out == ""
    assert "Traceback" not in err and "OverflowError" not in err
    line = next(i for i, ln in enumerate(BASE.split("\n"), 1) if ln.startswith(old))
    assert f"{p}:{line}: " in err and field in err and "e+400" in err


def test_describe_huge_integers():
    # 10**400 is beyond any float (max about 1.8e308): written from its digits
    assert describe(10**400) == "1e+400"
    assert describe(-(25 * 10**399)) == "-2.50e+400"
    assert describe(10**20000).startswith("about 1e+")  # str() itself refuses integers this long


def test_fifo_device_and_folder_are_refused_at_once(capsys, tmp_path):
    fifo = tmp_path / "pipe.toml"
    os.mkfifo(fifo)  # nobody writes to it: opening it for reading the usual way would wait forever
    folder = tmp_path / "folder.toml"
    folder.mkdir()
    rc, out, err = _validate(capsys, fifo, folder, "/dev/zero")
    assert rc == 2 and out == ""
    assert f"{fifo}: is a named pipe (FIFO), not a regular file; expected a library TOML file" in err
    assert f"{folder}: is a folder; expected a library TOML file" in err
    assert "/dev/zero: is a device, not a regular file" in err
    with pytest.raises(LibraryError, match="named pipe"):
        read_library_file(fifo)
