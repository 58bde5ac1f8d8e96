"""Concurrent writers on one library file with an outside program editing it (issue 16). A plain script:
`python tests/benchmarks/bench_faults_concurrency.py [ROUNDS] [ADDS] [SEED]`.

ROUNDS (default 40) contests each with 2 and with 4 writers (alternately `crossrate library add` and the
Python API's add_couple, in forked processes) adding ADDS (default 10) couples each and retrying when
refused, while another program appends 40 comment lines without the lock (tests/faults/concurrency_runner.py).
Prints the updates that landed, the refusals, the outside lines (and how many crossrate saved in a conflict
copy), the lost ones and the refusals not told in one line with what to do; exit status 1 on any loss.
"""

import shutil
import sys
import time

from faults_setup import prepare, verdict


def main() -> int:
    rounds = int(sys.argv[1]) if len(sys.argv) > 1 else 40
    adds = int(sys.argv[2]) if len(sys.argv) > 2 else 10
    seed = int(sys.argv[3]) if len(sys.argv) > 3 else 16
    scratch = prepare()
    from concurrency_runner import run_concurrency

    import crossrate.cli.library_cmd  # noqa: F401  (imported before the forks)
    import crossrate.cli.main  # noqa: F401
    import crossrate.library.couple_edits  # noqa: F401

    bad = 0
    print(f"concurrent writers: {rounds} rounds per writer count, {adds} couples per writer, 40 outside lines per "
          f"round, seed {seed}")
    for writers in (2, 4):
        landed = refusals = outside = saved = lost_c = lost_o = bad_msg = errors = 0
        t0 = time.perf_counter()
        for r in range(rounds):
            folder = scratch / f"w{writers}-r{r}"
            folder.mkdir()
            s = run_concurrency(folder, writers, adds, 40, seed + 1000 * writers + r, period_s=0.02)
            landed += s.landed
            refusals += s.refusals
            outside += s.outside_lines
            saved += s.saved_outside_lines
            lost_c += len(s.lost_couples)
            lost_o += len(s.lost_outside_lines)
            bad_msg += len(s.bad_messages)
            errors += len(s.errors)
            for m in (s.lost_couples + s.lost_outside_lines + s.bad_messages + s.errors)[:3]:
                print("      " + str(m)[:300])
            shutil.rmtree(folder, ignore_errors=True)
        failed = lost_c + lost_o + bad_msg + errors
        bad += failed
        print(f"  {writers} writers: {landed} updates landed of {rounds * writers * adds}, {refusals} refusals "
              f"(then retried), {outside} outside lines ({saved} saved in a conflict copy); lost updates "
              f"{lost_c}, lost outside lines {lost_o}, unclear refusals {bad_msg}, errors {errors} "
              f"({time.perf_counter() - t0:.0f} s; target 0: {verdict(failed)})")
    shutil.rmtree(scratch, ignore_errors=True)
    return 1 if bad else 0


if __name__ == "__main__":
    sys.exit(main())
