"""kill -9 at random moments of each kind of write (issue 16). A plain script:
`python tests/benchmarks/bench_faults_crash.py [ROUNDS] [SEED] [KIND...]`.

For each kind (library add, update, remove, rename and import, the workbench's save path, `map --out`; or
only the KINDs named) runs ROUNDS
(default 120) rounds of tests/faults/crash_runner.py: a forked write killed with SIGKILL after a random delay
over its usual run time, then the file checked (old content, or a complete valid new one) and, after one
more unkilled write, the folder checked for leftovers. Prints per kind the rounds, how many kills landed
before the write ended, old/new outcomes and failures; exit status 1 on any failure.
"""

import shutil
import sys
import time

from faults_setup import prepare, verdict


def main() -> int:
    rounds = int(sys.argv[1]) if len(sys.argv) > 1 else 120
    seed = int(sys.argv[2]) if len(sys.argv) > 2 else 16
    scratch = prepare()
    from crash_runner import KINDS, crash_rounds

    import crossrate.cli.library_cmd  # noqa: F401
    import crossrate.cli.library_import_cmd  # noqa: F401
    import crossrate.cli.main  # noqa: F401
    import crossrate.cli.map_cmd  # noqa: F401
    import crossrate.library.couple_edits  # noqa: F401
    import crossrate.library.couple_import  # noqa: F401  (imported before the forks)
    import crossrate.tui.library_access  # noqa: F401

    total_fail = 0
    total = 0
    print(f"kill -9 during writes: {rounds} rounds per kind, seed {seed}")
    print(f"  {'kind':<15} {'rounds':>6} {'killed':>6} {'old':>5} {'new':>5} {'failed':>6}  time")
    only = sys.argv[3:] or KINDS
    for i, kind in enumerate(KINDS):
        if kind not in only:
            continue
        folder = scratch / kind
        folder.mkdir()
        t0 = time.perf_counter()
        s = crash_rounds(kind, folder, rounds, seed + i)
        total += s.rounds
        total_fail += len(s.failures)
        print(f"  {kind:<15} {s.rounds:>6} {s.killed_before_end:>6} {s.old_after_kill:>5} {s.new_after_kill:>5} "
              f"{len(s.failures):>6}  {time.perf_counter() - t0:.0f} s")
        for f in s.failures[:5]:
            print("      " + f[:300])
    print(f"total: {total} killed writes, {total_fail} failures (torn or invalid file, leftovers after the next "
          f"write; target 0: {verdict(total_fail)})")
    shutil.rmtree(scratch, ignore_errors=True)
    return 1 if total_fail else 0


if __name__ == "__main__":
    sys.exit(main())
