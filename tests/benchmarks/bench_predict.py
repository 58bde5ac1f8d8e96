"""Speed figures of predict / screen / map (issue 4). Prints figures; asserts nothing (not a pytest test).

Run: .venv/bin/python tests/benchmarks/bench_predict.py
Targets: cold `crossrate predict` process <= 0.5 s wall (and its ratio to `python -c "import numpy"`);
one prediction with 20,000 Monte Carlo draws <= 20 ms; screening one target against 10,000 couples with
linear uncertainty <= 50 ms; map of 2,000 couples <= 0.3 s.
"""

import os
import shutil
import statistics
import subprocess
import sys
import time
from pathlib import Path

REPO = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(REPO))

import numpy as np  # noqa: E402

from crossrate.library.couple import Couple  # noqa: E402
from crossrate.library.couple_set import CoupleSet  # noqa: E402


def synthetic_set(n: int, seed: int = 0) -> CoupleSet:
    """n invented aqueous couples on SHE at I = 0.1 M with plausible charges, radii, potentials, k_self."""
    rng = np.random.default_rng(seed)
    couples = []
    for i in range(n):
        z = int(rng.integers(-2, 4))
        couples.append(Couple(
            id=f"syn-{i:05d}", name=f"synthetic couple {i}", charge_ox=z, charge_red=z - 1,
            E=float(rng.uniform(-1.0, 1.2)), E_scale="SHE", radius=float(rng.uniform(3.0, 7.0)), medium="water",
            ionic_strength=0.1, temperature=298.15, source="synthetic benchmark couple (invented)",
            k_self=float(10.0 ** rng.uniform(-3, 9)), E_sd=0.01 if i % 2 else None,
            k_self_log10_sd=0.2 if i % 3 else None,
        ))
    return CoupleSet(couples)


def best_of(fn, repeat: int = 7) -> float:
    """Smallest wall time of `repeat` calls after one warm-up call, s."""
    fn()
    times = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t0)
    return min(times)


def _clean_env() -> dict:
    env = dict(os.environ)
    env["PYTHONPATH"] = os.pathsep.join(filter(None, [str(REPO), env.get("PYTHONPATH", "")]))
    env["NO_COLOR"] = "1"
    return env


def process_wall(argv: list[str], repeat: int = 7) -> tuple[float, float]:
    """(median, min) wall time of a fresh process, s."""
    env = _clean_env()
    subprocess.run(argv, capture_output=True, env=env, check=True)  # warm the file cache
    times = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        subprocess.run(argv, capture_output=True, env=env, check=True)
        times.append(time.perf_counter() - t0)
    return statistics.median(times), min(times)


def crossrate_command() -> list[str]:
    script = Path(sys.executable).parent / "crossrate"
    if script.exists():
        return [str(script)]
    if shutil.which("crossrate"):
        return [shutil.which("crossrate")]
    return [sys.executable, "-m", "crossrate.cli.main"]


def figure(label: str, seconds: float, target: float) -> None:
    verdict = "ok" if seconds <= target else "MISSES TARGET"
    print(f"{label:<58} {seconds * 1000:9.1f} ms   (target <= {target * 1000:.0f} ms)  {verdict}")


def main() -> None:
    from crossrate.services.prediction import predict
    from crossrate.services.rate_map import rate_map
    from crossrate.services.screening import screen

    cmd = crossrate_command() + ["predict", "hl-med1", "hl-med2"]
    med, low = process_wall(cmd)
    np_med, np_low = process_wall([sys.executable, "-c", "import numpy"])
    figure("cold `crossrate predict hl-med1 hl-med2` (median of 7)", med, 0.5)
    print(f"{'  fastest run':<58} {low * 1000:9.1f} ms")
    label = '  bare `python -c "import numpy"` (median of 7)'
    print(f"{label:<58} {np_med * 1000:9.1f} ms   ratio {med / np_med:.1f}x (fastest {np_low * 1000:.1f} ms)")

    from crossrate.library.layers import load_layered

    demo = load_layered(bundled=True, group=False, personal=False)
    figure("one prediction, 20,000 Monte Carlo draws (demo library)",
           best_of(lambda: predict(demo, "hl-med1", "hl-med2", samples=20000, seed=1)), 0.020)

    big = synthetic_set(10000)
    t0 = time.perf_counter()
    big.arrays  # noqa: B018  (one-time column build, reported separately)
    build = time.perf_counter() - t0
    figure("screen one target vs 10,000 couples, linear uncertainty",
           best_of(lambda: screen(big, "syn-00001", "oxidant")), 0.050)
    print(f"{'  (one-time CoupleSet.arrays build for 10,000 couples)':<58} {build * 1000:9.1f} ms")

    two = synthetic_set(2000, seed=1)
    two.arrays  # noqa: B018
    figure("rate map of 2,000 couples (4,000,000 ordered pairs)", best_of(lambda: rate_map(two), 5), 0.300)


if __name__ == "__main__":
    main()
