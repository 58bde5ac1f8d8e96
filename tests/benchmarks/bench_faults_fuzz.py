"""Fuzz of the library reader/validator and the CSV inputs (issue 16). A plain script:
`python tests/benchmarks/bench_faults_fuzz.py [N_LIBRARY] [N_CSV] [SEED]`.

Generates a seeded corpus (default 12,000 library files over 12 kinds: random bytes, truncated files, wrong
types, huge/tiny/NaN/inf numbers, unicode, BOM and other encodings, CRLF and other line ends, duplicate ids
and keys, deep nesting, path-like ids, odd structures, random byte edits; and 6,000 CSV files for check,
solve, fit and library import) and checks every file as tests/faults/fault_corpus.py describes: no
traceback, every message names the file (and the line where there is one), exit 2 from `library validate` for every invalid file, no
invalid value accepted. Prints what was tried, how many, what failed; exit status 1 on any failure.
"""

import collections
import shutil
import sys
import time

from faults_setup import prepare, verdict


def main() -> int:
    n_lib = int(sys.argv[1]) if len(sys.argv) > 1 else 12000
    n_csv = int(sys.argv[2]) if len(sys.argv) > 2 else 6000
    seed = int(sys.argv[3]) if len(sys.argv) > 3 else 16
    scratch = prepare()
    from fault_corpus import (
        check_csv_file,
        check_library_file,
        check_validate_command,
        csv_corpus,
        library_corpus,
    )

    t0 = time.perf_counter()
    per_kind = collections.defaultdict(collections.Counter)
    failures = []
    path = scratch / "fuzz.toml"
    for i, (kind, data) in enumerate(library_corpus(n_lib, seed)):
        path.write_bytes(data)
        v, fails = check_library_file(path)
        fails += check_validate_command(path, v)
        per_kind[kind][v] += 1
        failures += [f"library {kind} #{i}: {f}" for f in fails]
    t_lib = time.perf_counter() - t0
    print(f"library files: {n_lib} tried (seed {seed}) in {t_lib:.0f} s; each read + validated in-process and "
          "through `crossrate library validate`")
    for kind, c in sorted(per_kind.items()):
        print(f"  {kind:<16} {sum(c.values()):>6}  invalid {c['invalid']:>6}  valid {c['valid']:>5}  "
              f"crash {c['crash']}")
    t0 = time.perf_counter()
    per_csv = collections.defaultdict(collections.Counter)
    csv_fail = []
    cpath = scratch / "fuzz.csv"
    for i, (kind, case, data) in enumerate(csv_corpus(n_csv, seed)):
        cpath.write_bytes(data)
        v, fails = check_csv_file(cpath, kind)
        per_csv[kind][v] += 1
        csv_fail += [f"csv {kind}/{case} #{i}: {f}" for f in fails]
    print(f"CSV inputs: {n_csv} tried in {time.perf_counter() - t0:.0f} s")
    for kind, c in sorted(per_csv.items()):
        print(f"  {kind:<16} {sum(c.values()):>6}  invalid {c['invalid']:>6}  valid {c['valid']:>5}  "
              f"crash {c['crash']}")
    all_fail = failures + csv_fail
    print(f"failures: {len(failures)} library, {len(csv_fail)} CSV (target 0: {verdict(len(all_fail))})")
    for f in all_fail[:20]:
        print("  " + f.replace("\n", " | ")[:300])
    shutil.rmtree(scratch, ignore_errors=True)
    return 1 if all_fail else 0


if __name__ == "__main__":
    sys.exit(main())
