"""Speed figures of the analysis services (issue 6): check, solve, fit. Prints figures; asserts nothing.

Run: .venv/bin/python tests/benchmarks/bench_analysis.py
No targets are set by the issue; the figures show what a user waits for (a CI check over a group's file,
one solve with its interval, a series fit with profile and bootstrap intervals).
"""

import math
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT))
sys.path.insert(0, str(ROOT / "tests" / "analysis"))

import numpy as np  # noqa: E402
from conftest import COUPLES  # noqa: E402

from crossrate.core.constants import KJ  # noqa: E402
from crossrate.core.driving_force_series import marcus_ln_k_act, series_ln_k_obs  # noqa: E402
from crossrate.library.couple_set import CoupleSet  # noqa: E402
from crossrate.services.measured_check import check_measured  # noqa: E402
from crossrate.services.measured_csv import MeasuredRow, SeriesData  # noqa: E402
from crossrate.services.series_fit import fit_series  # noqa: E402
from crossrate.services.solving import solve_k_self, solve_potential  # noqa: E402


def best_of(n, fn):
    best = math.inf
    for _ in range(n):
        t0 = time.perf_counter()
        fn()
        best = min(best, time.perf_counter() - t0)
    return best


def show(label, seconds):
    print(f"{label:<60} {seconds * 1000:9.1f} ms")


def main() -> None:
    cs = CoupleSet(list(COUPLES))
    pairs = [("hl-phen", "hl-aqua"), ("hl-bpy", "hl-amm"), ("hl-phen", "hl-amm"), ("hl-amm", "hl-spin")]
    rows = [MeasuredRow("bench.csv", i + 2, *pairs[i % 4], 1e5) for i in range(200)]
    show("check 200 rows, 5000 Monte Carlo draws each", best_of(3, lambda: check_measured(cs, rows, samples=5000)))
    show("check 200 rows, linear interval only (--samples 0)", best_of(3, lambda: check_measured(cs, rows, samples=0)))
    solve_k_self(cs, "hl-aqua", "hl-phen", 1e6)  # first call imports scipy.optimize
    show("solve k-self with its 95 % interval (9 root solves)", best_of(20, lambda: solve_k_self(cs, "hl-aqua", "hl-phen", 1e6)))
    show("solve potential, both roots with intervals", best_of(20, lambda: solve_potential(cs, "hl-aqua", "hl-phen", 1e6)))
    x = np.concatenate([np.linspace(20.0, -90.0, 8), [-170.0, -200.0, -230.0, -260.0]]) * KJ
    y = series_ln_k_obs(marcus_ln_k_act(x, 100 * KJ, 11 * math.log(10), 298.15), 9.7 * math.log(10)) / math.log(10)
    y = y + 0.1 * np.random.default_rng(1).standard_normal(len(y))
    data = SeriesData("bench", x, 10.0**y, np.full(len(y), 0.1), tuple(range(len(y))), ("",) * len(y))
    show("fit 12 points, profile-likelihood interval", best_of(5, lambda: fit_series(data)))
    show("fit 12 points, bootstrap interval (200 refits)", best_of(2, lambda: fit_series(data, interval="bootstrap")))


if __name__ == "__main__":
    main()
