"""Two and four writers (command line and Python API) on one file while another program appends to it
(quick part; many more rounds in tests/benchmarks/bench_faults_concurrency.py): no couple a writer was told
had landed is missing, no outside line is lost (it is in the file or in the copy crossrate saved), and every
refused writer got one line saying what happened and what to do."""

import pytest
from concurrency_runner import run_concurrency


@pytest.fixture(scope="module", autouse=True)
def imported_before_fork():
    import crossrate.cli.library_cmd  # noqa: F401
    import crossrate.cli.main  # noqa: F401
    import crossrate.library.couple_edits  # noqa: F401


@pytest.mark.parametrize("writers,adds", [(2, 6), (4, 4)])
def test_writers_and_an_outside_program(tmp_path, writers, adds):
    stats = run_concurrency(tmp_path, writers, adds, outside_lines=30, seed=writers, period_s=0.02)
    assert stats.errors == []
    assert stats.landed == writers * adds
    assert stats.lost_couples == [] and stats.lost_outside_lines == []
    assert stats.bad_messages == []
    assert stats.outside_lines == 30
