"""Speed figures of the Python API (issue 8). Prints figures; asserts nothing (not a pytest test).

Run: .venv/bin/python tests/benchmarks/bench_api.py
Targets: `import crossrate` in a fresh process <= 0.3 s wall; predict_many of 100,000 (oxidant, reductant)
id pairs drawn from a 2,000-couple library <= 0.2 s in-process.
"""

import statistics
import subprocess
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))

from bench_predict import _clean_env, best_of, figure, synthetic_set  # noqa: E402


def main() -> None:
    env = _clean_env()
    code = "import crossrate"
    subprocess.run([sys.executable, "-c", code], env=env, check=True)
    times = []
    for _ in range(9):
        t0 = time.perf_counter()
        subprocess.run([sys.executable, "-c", code], env=env, check=True)
        times.append(time.perf_counter() - t0)
    figure("`import crossrate`, fresh process (median of 9)", statistics.median(times), 0.300)
    bare = []
    for _ in range(9):
        t0 = time.perf_counter()
        subprocess.run([sys.executable, "-c", "pass"], env=env, check=True)
        bare.append(time.perf_counter() - t0)
    print(f"{'  bare interpreter start (median of 9)':<58} {statistics.median(bare) * 1000:9.1f} ms")

    t0 = time.perf_counter()
    subprocess.run([sys.executable, "-c", "import crossrate; crossrate.predict"], env=env, check=True)
    print(f"{'  first use of crossrate.predict (numpy, scipy.constants)':<58} {(time.perf_counter() - t0) * 1000:9.1f} ms")

    import numpy as np

    import crossrate

    cs = synthetic_set(2000, seed=2)
    cs.arrays  # noqa: B018
    rng = np.random.default_rng(3)
    ids = np.asarray(cs.ids(), dtype=object)
    ox = ids[rng.integers(0, 2000, 100_000)].tolist()
    red = ids[rng.integers(0, 2000, 100_000)].tolist()
    figure("predict_many, 100,000 id pairs from 2,000 couples (ids as str)",
           best_of(lambda: crossrate.predict_many(cs, ox, red), 5), 0.200)
    ox_i = rng.integers(0, 2000, 100_000)
    red_i = rng.integers(0, 2000, 100_000)
    figure("predict_many, 100,000 pairs as integer positions",
           best_of(lambda: crossrate.predict_many(cs, ox_i, red_i), 5), 0.200)


if __name__ == "__main__":
    main()
