"""Random numeric inputs across and just beyond the documented ranges (quick part; the 10^6-pair run is
tests/benchmarks/bench_faults_numeric.py): values beyond a range are refused when the couple or the conditions
are made, and every computable pair has finite numbers with k_obs <= min(k_act, k_D); the CLI's JSON is strict."""

import numpy as np
from numeric_runner import NumericStats, cli_json_round, vectorized_round


def test_vectorized_random_inputs():
    rng = np.random.default_rng(16)
    stats = NumericStats()
    for _ in range(4):
        vectorized_round(rng, 50, 5000, stats)
    assert stats.failures == []
    assert stats.pairs == 20000 and stats.pairs_computed > 5000
    assert stats.couples_refused > 0  # the just-beyond draws were made and refused


def test_cli_json_random_inputs(tmp_path):
    rng = np.random.default_rng(17)
    stats = NumericStats()
    for _ in range(2):
        cli_json_round(rng, tmp_path, 25, stats)
    assert stats.failures == []
    assert stats.cli_pairs > 100 and stats.json_values > 100
