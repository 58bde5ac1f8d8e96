"""Speed figures of predict / screen / map (issue 4). Prints figures; asserts nothing (not a pytest test).

Run: .venv/bin/python tests/benchmarks/bench_predict.py
Targets: cold `crossrate predict` process <= 0.5 s wall and <= 1.6x a bare `python -c "import numpy"` measured
in the same run (interleaved, so both see the same machine load; bytecode written, library cache warm);
one prediction with 20,000 Monte Carlo draws <= 20 ms; screening one target against 10,000 couples with
linear uncertainty <= 50 ms; map of 2,000 couples <= 0.3 s; the same map under the semiclassical model
<= 10x the classical map measured in the same run (interleaved, CPU time and wall time).
Where valgrind is installed, the cold-predict ratio is also given in instructions executed (cachegrind), a figure
that does not move with the machine's load (it followed the idle wall-time ratio within 0.03 here).
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
    # Measure what a user's install runs: compiled bytecode kept between runs.
    env.pop("PYTHONDONTWRITEBYTECODE", None)
    env["PYTHONPATH"] = os.pathsep.join(filter(None, [str(REPO), env.get("PYTHONPATH", "")]))
    env["NO_COLOR"] = "1"
    return env


def interleaved_walls(argvs: list[list[str]], repeat: int = 15, cpu: list | None = None) -> list[list[float]]:
    """Wall times of fresh processes, s: the commands take turns, so machine load hits them alike. cpu, when
    given, receives one list per command of the processes' CPU times (user + system), s."""
    import resource

    env = _clean_env()
    for argv in argvs:
        subprocess.run(argv, capture_output=True, env=env, check=True)  # warm file cache, bytecode, library cache
    times: list[list[float]] = [[] for _ in argvs]
    cpus: list[list[float]] = [[] for _ in argvs]
    for _ in range(repeat):
        for argv, t, c in zip(argvs, times, cpus, strict=True):
            r0 = resource.getrusage(resource.RUSAGE_CHILDREN)
            t0 = time.perf_counter()
            subprocess.run(argv, capture_output=True, env=env, check=True)
            t.append(time.perf_counter() - t0)
            r1 = resource.getrusage(resource.RUSAGE_CHILDREN)
            c.append(r1.ru_utime + r1.ru_stime - r0.ru_utime - r0.ru_stime)
    if cpu is not None:
        cpu.extend(cpus)
    return times


def instructions(argv: list[str]) -> int | None:
    """Instructions a fresh process of argv executes (valgrind's cachegrind), None without valgrind.

    One BLAS thread and a fixed hash seed make the count repeat to the instruction: idle BLAS threads spin, and
    hash seeds change dict layouts.
    """
    import re

    if shutil.which("valgrind") is None:
        return None
    env = dict(_clean_env(), OPENBLAS_NUM_THREADS="1", PYTHONHASHSEED="0")
    run = subprocess.run(["valgrind", "--tool=cachegrind", "--cache-sim=no", "--cachegrind-out-file=/dev/null", *argv],
                         capture_output=True, text=True, env=env)
    m = re.search(r"I\s+refs:\s+([\d,]+)", run.stderr)
    return int(m.group(1).replace(",", "")) if m else None


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

    # Starter couples: loaded in every setup, so the figure needs no demo layer.
    cmd = crossrate_command() + ["predict", "fe-aq", "ru-nh3-6", "--ionic-strength", "0.1"]
    cpus: list = []
    cr_times, np_times = interleaved_walls([cmd, [sys.executable, "-c", "import numpy"]], cpu=cpus)
    med, low = statistics.median(cr_times), min(cr_times)
    np_med, np_low = statistics.median(np_times), min(np_times)
    figure("cold `crossrate predict fe-aq ru-nh3-6 ...` (median of 15)", med, 0.5)
    print(f"{'  fastest run':<58} {low * 1000:9.1f} ms")
    label = '  bare `python -c "import numpy"` (median of 15)'
    print(f"{label:<58} {np_med * 1000:9.1f} ms   (fastest {np_low * 1000:.1f} ms)")
    ratio = med / np_med
    verdict = "ok" if ratio <= 1.6 else "MISSES TARGET"
    print(f"{'  ratio cold predict / bare import numpy (medians)':<58} {ratio:9.2f} x    (target <= 1.60 x)  {verdict}"
          f"   fastest/fastest {low / np_low:.2f} x")
    cpu_ratio = statistics.median(cpus[0]) / statistics.median(cpus[1])
    print(f"{'  same ratio in CPU time (user + system, medians)':<58} {cpu_ratio:9.2f} x    (less sensitive to the "
          f"machine's load; load average {os.getloadavg()[0]:.1f} on {os.cpu_count()} cores)")

    counts = [instructions(cmd), instructions([sys.executable, "-c", "import numpy"])]
    if None not in counts:
        ratio = counts[0] / counts[1]
        verdict = "ok" if ratio <= 1.6 else "MISSES TARGET"
        print(f"{'  same ratio in instructions executed (valgrind)':<58} {ratio:9.2f} x    (target <= 1.60 x)  {verdict}"
              f"   {counts[0] / 1e6:.0f} M against {counts[1] / 1e6:.0f} M; independent of the load")

    from crossrate.library.layers import load_layered
    from crossrate.services.conditions import Conditions

    bundled = load_layered(bundled=True, group=False, personal=False)
    at = Conditions(ionic_strength_M=0.1)
    t_cl = best_of(lambda: predict(bundled, "fe-aq", "ru-nh3-6", at, samples=20000, seed=1))
    figure("one prediction, 20,000 Monte Carlo draws (starter library)", t_cl, 0.020)
    semi = at.with_(rate_model="semiclassical")
    t_sc = best_of(lambda: predict(bundled, "fe-aq", "ru-nh3-6", semi, samples=20000, seed=1))
    figure("  the same, semiclassical model (quantum factor)", t_sc, 10.0 * t_cl)
    print(f"{'  ratio semiclassical / classical':<58} {t_sc / t_cl:9.2f} x    (no target)")

    big = synthetic_set(10000)
    t0 = time.perf_counter()
    big.arrays  # noqa: B018  (one-time column build, reported separately)
    build = time.perf_counter() - t0
    figure("screen one target vs 10,000 couples, linear uncertainty",
           best_of(lambda: screen(big, "syn-00001", "oxidant")), 0.050)
    print(f"{'  (one-time CoupleSet.arrays build for 10,000 couples)':<58} {build * 1000:9.1f} ms")

    two = synthetic_set(2000, seed=1)
    two.arrays  # noqa: B018
    t_map = best_of(lambda: rate_map(two), 5)
    figure("rate map of 2,000 couples (4,000,000 ordered pairs)", t_map, 0.300)
    semi_map(two)


def semi_map(two) -> None:
    """The semiclassical map of the same 2,000 couples against the classical one, interleaved (wall and CPU)."""
    from crossrate.services.conditions import Conditions
    from crossrate.services.rate_map import rate_map

    semi = Conditions(rate_model="semiclassical")
    rate_map(two), rate_map(two, conditions=semi)  # warm-up
    walls: list[list[float]] = [[], []]
    cpus: list[list[float]] = [[], []]
    for _ in range(5):
        for k, cond in enumerate((None, semi)):
            w0, c0 = time.perf_counter(), time.process_time()
            rate_map(two, conditions=cond)
            walls[k].append(time.perf_counter() - w0)
            cpus[k].append(time.process_time() - c0)
    figure("  the same map, semiclassical model (fastest of 5)", min(walls[1]), 10.0 * min(walls[0]))
    ratio, cpu_ratio = min(walls[1]) / min(walls[0]), min(cpus[1]) / min(cpus[0])
    verdict = "ok" if ratio <= 10.0 else "MISSES TARGET"
    print(f"{'  ratio semiclassical / classical map (wall, fastest)':<58} {ratio:9.2f} x    (target <= 10.00 x)  "
          f"{verdict}")
    print(f"{'  same ratio in CPU time (all threads)':<58} {cpu_ratio:9.2f} x    (load average "
          f"{os.getloadavg()[0]:.1f} on {os.cpu_count()} cores)")
    # Every couple with a mode of its own: each pair's mode differs, so the sums at zero driving force are done
    # pair by pair too (no shared-mode table). For information, no target.
    import dataclasses

    rng = np.random.default_rng(2)
    own = CoupleSet([dataclasses.replace(c, hbar_omega=float(rng.uniform(800.0, 2500.0))) for c in two])
    own.arrays  # noqa: B018
    t_own = best_of(lambda: rate_map(own, conditions=semi), 2)
    print(f"{'  the same, every couple with its own hbar_omega':<58} {t_own * 1000:9.1f} ms   "
          f"({t_own / min(walls[0]):.1f} x the classical map; no target)")


if __name__ == "__main__":
    main()
