"""Random numeric inputs across and just beyond the documented ranges (issue 16). A plain script:
`python tests/benchmarks/bench_faults_numeric.py [PAIRS] [CLI_ROUNDS] [SEED]`.

PAIRS (default 1,000,000) random pairs through predict_many, in rounds of 50,000 pairs over a fresh set of 80
random couples and random conditions; then CLI_ROUNDS (default 14) random library files through
`crossrate map --format json` (40 couples drawn each, so over 10^4 pairs in all) and `predict --format json`
(tests/faults/numeric_runner.py). Prints the couples and conditions tried and refused (refused exactly when
a value is beyond its range), the pairs computed, and every NaN/infinity, k_obs above min(k_act, k_D) or
non-strict JSON; exit status 1 on any failure.
"""

import shutil
import sys
import time

from faults_setup import prepare, verdict


def main() -> int:
    pairs = int(sys.argv[1]) if len(sys.argv) > 1 else 1_000_000
    cli_rounds = int(sys.argv[2]) if len(sys.argv) > 2 else 14
    seed = int(sys.argv[3]) if len(sys.argv) > 3 else 16
    scratch = prepare()
    import numpy as np
    from numeric_runner import NumericStats, cli_json_round, vectorized_round

    rng = np.random.default_rng(seed)
    s = NumericStats()
    t0 = time.perf_counter()
    chunk = 50_000
    while s.pairs < pairs:
        vectorized_round(rng, 80, min(chunk, pairs - s.pairs), s)
    t_vec = time.perf_counter() - t0
    vec_fail = len(s.failures)
    print(f"vectorized path: {s.pairs} random pairs in {t_vec:.0f} s (seed {seed}); {s.pairs_computed} computed, "
          f"{s.pairs_not_computable} not computable, each with its reason")
    print(f"  couples drawn {s.couples_tried}, refused {s.couples_refused} (each had a value beyond its range); "
          f"conditions drawn {s.conditions_tried}, refused {s.conditions_refused}")
    print(f"  NaN/inf, k_obs above min(k_act, k_D), wrong refusals: {vec_fail} (target 0: {verdict(vec_fail)})")
    t0 = time.perf_counter()
    for _ in range(cli_rounds):
        cli_json_round(rng, scratch, 40, s)
    cli_fail = len(s.failures) - vec_fail
    print(f"CLI JSON: {cli_rounds} random libraries through map and predict, {s.cli_pairs} pairs, {s.json_values} "
          f"numbers in {time.perf_counter() - t0:.0f} s; non-strict JSON, NaN/inf or tracebacks: {cli_fail} "
          f"(target 0: {verdict(cli_fail)})")
    for f in s.failures[:20]:
        print("  " + f[:300])
    shutil.rmtree(scratch, ignore_errors=True)
    return 1 if s.failures else 0


if __name__ == "__main__":
    sys.exit(main())
