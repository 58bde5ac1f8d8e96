"""Output files: --plot never replaces a figure without --force (as map --out), new files honour the
umask, and the temporaries of a killed write are removed by the next write of the same file."""

import os
import stat

import numpy as np
import pytest
from test_analysis_cli import _measured, _series, run  # noqa: F401 (run is a fixture)

from crossrate.library.output_writer import remove_stale_temporaries, write_output


def test_plot_refuses_an_existing_figure_unless_forced(run, tmp_path):  # noqa: F811
    path = _measured(tmp_path, [("hl-phen", "hl-amm", 2.0e9)])
    fig = tmp_path / "check.svg"
    fig.write_text("my earlier figure")
    code, out, err = run("check", str(path), "--samples", "200", "--plot", str(fig))
    assert code == 2 and out == ""
    assert f"--plot {fig}: file exists; choose another name or add --force to replace it" in err
    assert fig.read_text() == "my earlier figure"
    code, _, err = run("check", str(path), "--samples", "200", "--plot", str(fig), "--force", "--format", "json")
    assert code == 0, err and fig.read_bytes().startswith(b"<?xml")
    series = _series(tmp_path, list(np.linspace(20, -90, 8)))
    fig2 = tmp_path / "series.png"
    fig2.write_text("keep")
    code, _, err = run("fit", str(series), "--plot", str(fig2), "--format", "json")
    assert code == 2 and "file exists" in err and fig2.read_text() == "keep"


@pytest.mark.parametrize("umask,mode", [(0o022, 0o644), (0o002, 0o664), (0o077, 0o600)])
def test_output_files_honour_the_umask(run, tmp_path, umask, mode):  # noqa: F811
    old = os.umask(umask)
    try:
        out_csv = tmp_path / "map.csv"
        code, _, err = run("map", "--out", str(out_csv))
        path = _measured(tmp_path, [("hl-phen", "hl-amm", 2.0e9)])
        fig = tmp_path / "check.svg"
        code2, _, err2 = run("check", str(path), "--samples", "200", "--plot", str(fig), "--format", "json")
    finally:
        os.umask(old)
    assert code == 0 and code2 == 0, err + err2
    assert stat.S_IMODE(os.stat(out_csv).st_mode) == mode
    assert stat.S_IMODE(os.stat(fig).st_mode) == mode


def test_temporaries_of_a_killed_write_are_removed_by_the_next_write(tmp_path):
    target = tmp_path / "map.csv"
    stale = tmp_path / ".map.csv.0123456789ab.tmp"
    stale.write_text("half a map")  # left by a run killed with -9: nobody holds its lock
    other = tmp_path / ".other.csv.0123456789ab.tmp"
    other.write_text("not this file's")
    write_output(target, lambda fh: fh.write(b"a,b\n"))
    assert target.read_bytes() == b"a,b\n"
    assert not stale.exists() and other.exists()
    assert sorted(p.name for p in tmp_path.iterdir()) == [".other.csv.0123456789ab.tmp", "map.csv"]


def test_a_live_writers_temporary_is_left_alone(tmp_path):
    import fcntl

    live = tmp_path / ".map.csv.0123456789ab.tmp"
    fd = os.open(live, os.O_WRONLY | os.O_CREAT, 0o644)
    try:
        fcntl.flock(fd, fcntl.LOCK_EX)  # another crossrate writing right now
        assert remove_stale_temporaries(tmp_path / "map.csv") == []
        assert live.exists()
    finally:
        os.close(fd)
    assert remove_stale_temporaries(tmp_path / "map.csv") == [live.name]


def test_new_output_never_replaces_a_file_that_appears_meanwhile(tmp_path):
    target = tmp_path / "out.csv"

    def produce(fh):
        target.write_text("someone else's")  # appears while crossrate writes
        fh.write(b"mine")

    with pytest.raises(FileExistsError):
        write_output(target, produce)
    assert target.read_text() == "someone else's"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["out.csv"]
