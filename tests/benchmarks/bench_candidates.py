"""Speed of screening against a table of 1,000,000 computed candidate couples (issue 12). Prints figures;
asserts nothing (not a pytest test).

Run: .venv/bin/python tests/benchmarks/bench_candidates.py
Target: the whole `crossrate screen fe-aq --role oxidant --candidates table.csv` process (start, read and
check the CSV, load the library, 1,000,000 cross relations, rank, print) <= 3 s wall. The table is invented
(seeded random charges, potentials, radii and reorganization energies). CPU time of the process is printed
too: on a machine shared with other work, wall time above CPU time is time spent waiting for a core.
"""

import os
import resource
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

import numpy as np

REPO = Path(__file__).resolve().parents[2]
N = 1_000_000
TARGET_S = 3.0


def write_table(path: Path, n: int = N, seed: int = 7) -> None:
    rng = np.random.default_rng(seed)
    z = rng.integers(-2, 4, n)
    E = rng.uniform(-1.5, 1.5, n)
    r = rng.uniform(3.0, 8.0, n)
    lam = rng.uniform(40.0, 200.0, n)
    with open(path, "w", encoding="utf-8") as fh:
        fh.write("# invented candidate couples for the benchmark\nid,charge_ox,charge_red,E,radius,lambda_total\n")
        fh.writelines(f"cand-{i:07d},{z[i]},{z[i] - 1},{E[i]:.4f},{r[i]:.3f},{lam[i]:.2f}\n" for i in range(n))


def main() -> None:
    env = dict(os.environ, PYTHONPATH=os.pathsep.join(filter(None, [str(REPO), os.environ.get("PYTHONPATH", "")])))
    env.pop("PYTHONDONTWRITEBYTECODE", None)
    with tempfile.TemporaryDirectory() as d:
        table = Path(d) / "candidates.csv"
        t0 = time.perf_counter()
        write_table(table)
        print(f"wrote {N:,} invented candidates ({table.stat().st_size / 1e6:.0f} MB) in {time.perf_counter() - t0:.1f} s")
        cmd = [sys.executable, "-m", "crossrate.cli.main", "screen", "fe-aq", "--role", "oxidant", "--candidates",
               str(table), "--ionic-strength", "0.1", "--top", "20"]
        subprocess.run(cmd, env=env, capture_output=True, check=True)  # warm: bytecode, file cache, library cache
        walls, cpus = [], []
        for _ in range(3):
            before = resource.getrusage(resource.RUSAGE_CHILDREN)
            t0 = time.perf_counter()
            subprocess.run(cmd, env=env, capture_output=True, check=True)
            walls.append(time.perf_counter() - t0)
            after = resource.getrusage(resource.RUSAGE_CHILDREN)
            cpus.append(after.ru_utime + after.ru_stime - before.ru_utime - before.ru_stime)
    best, med = min(walls), statistics.median(walls)
    verdict = "ok" if best <= TARGET_S else "MISSES TARGET"
    print(f"whole `crossrate screen --candidates` process, {N:,} candidates: best {best:.2f} s, median {med:.2f} s "
          f"wall (target <= {TARGET_S:g} s: {verdict}); CPU {min(cpus):.2f} s; load average "
          f"{os.getloadavg()[0]:.1f} on {os.cpu_count()} cores")


if __name__ == "__main__":
    main()
