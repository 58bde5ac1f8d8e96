"""kill -9 during each kind of write (quick part: a few rounds per kind; the long run of hundreds is
tests/benchmarks/bench_faults_crash.py): the file is always the old or a complete valid new one, and the next
write leaves nothing of the killed one behind."""

import pytest
from crash_runner import KINDS, crash_rounds


@pytest.fixture(scope="module", autouse=True)
def imported_before_fork():
    # the children are forked: everything they run is imported here, so their life is the write itself
    import crossrate.cli.library_cmd  # noqa: F401
    import crossrate.cli.library_import_cmd  # noqa: F401
    import crossrate.cli.main  # noqa: F401
    import crossrate.cli.map_cmd  # noqa: F401
    import crossrate.library.couple_edits  # noqa: F401
    import crossrate.library.couple_import  # noqa: F401
    import crossrate.tui.library_access  # noqa: F401


@pytest.mark.parametrize("kind", KINDS)
def test_kill_during_write(tmp_path, kind):
    stats = crash_rounds(kind, tmp_path, rounds=3, seed=16)
    assert stats.failures == []
    assert stats.rounds == 3 and stats.old_after_kill + stats.new_after_kill == 3
