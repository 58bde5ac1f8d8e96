"""Speed of the computational core (issue 2). A plain script: `python tests/benchmarks/bench_core.py`.

Prints figures for
* all 4,000,000 ordered (oxidant, reductant) pairs of 2,000 synthetic couples, work terms and diffusion cap
  included, through the fast path crossrate.core.rate_grid (target: <= 0.15 s on the 2-core machine);
* the same equations in a scalar Python loop (math module) on a subset, per pair, side by side in this run
  (target: the fast path >= 100x faster per pair);
* the straightforward broadcast cross_rate() on the same grid, for reference;
* the import cost of the core in a fresh interpreter, and which heavy modules that import pulls in;
* the cost of the diffusion limit in the grid (issue 11: Debye's integral with the screened potential, read
  from a table made once per call): the grid with the cap minus the grid without it, and the table alone
  (target: <= 0.05 s for the k_D part of the 4M-pair map).

Exit status 1 when a target is missed. The couples are synthetic (random, seeded), not chemistry.
"""

import math
import os
import statistics
import subprocess
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
if str(ROOT) not in sys.path:  # run from a checkout without `pip install -e .`
    sys.path.insert(0, str(ROOT))

import numpy as np  # noqa: E402

from crossrate.core import constants as C  # noqa: E402
from crossrate.core.barrier import self_exchange_ln_k  # noqa: E402
from crossrate.core.cross_rate import cross_rate  # noqa: E402
from crossrate.core.rate_grid import ln_k_obs_grid, ln_k_obs_pairs  # noqa: E402
from crossrate.core.screened_debye_table import screened_debye_table  # noqa: E402
from crossrate.core.work_terms import work_term  # noqa: E402

N_COUPLES = 2000
N_SCALAR = 20000
TARGET_S = 0.15
TARGET_SPEEDUP = 100.0
TARGET_KD_S = 0.05
T, I, EPS, ETA, LN_Z = 298.15, 0.1, 78.36, 0.890e-3, math.log(C.DEFAULT_Z)


def synthetic_couples(n, seed=20240):
    """n invented one-electron couples: E in V, charges, radius in m, ln k_self at these conditions.

    lambda_ii is drawn (20-300 kJ/mol) and k_self derived from it, so every couple lies in the model's
    domain (lambda > 0); k_self then spans roughly 1e-15 to 1e10 M^-1 s^-1.
    """
    rng = np.random.default_rng(seed)
    z_ox = rng.integers(-3, 5, n).astype(float)
    r = rng.uniform(2.5e-10, 9e-10, n)
    lam = rng.uniform(20e3, 300e3, n)
    w_self = work_term(z_ox, z_ox - 1.0, 2.0 * r, EPS, T, I)
    return {
        "E": rng.uniform(-1.5, 1.5, n),
        "z_ox": z_ox,
        "z_red": z_ox - 1.0,
        "r": r,
        "ln_k": self_exchange_ln_k(lam, w_self, T, LN_Z),
    }


def scalar_ln_k_obs(E1, zo1, zr1, r1, lk1, E2, zo2, zr2, r2, lk2, table, values, slopes):
    """The same equations as the fast path, one pair at a time with the math module (the 'slow way'); the
    screened Debye factor is read from the same table (values, slopes: its columns as Python lists)."""
    RT = C.GAS_CONSTANT * T
    kappa = math.sqrt(2.0 * C.AVOGADRO * C.ELEMENTARY_CHARGE**2 * I * 1000.0 / (C.VACUUM_PERMITTIVITY * EPS * C.BOLTZMANN * T))
    coul = C.ELEMENTARY_CHARGE**2 * C.AVOGADRO / (4.0 * math.pi * C.VACUUM_PERMITTIVITY * EPS)

    def work(za, zb, d):
        return za * zb * coul / (d * (1.0 + kappa * d))

    r12 = r1 + r2
    w11, w22 = work(zo1, zr1, 2 * r1), work(zo2, zr2, 2 * r2)
    w12, w21 = work(zo1, zr2, r12), work(zr1, zo2, r12)
    lnK = C.FARADAY * (E1 - E2) / RT
    lnf = (lnK + (w12 - w21) / RT) ** 2 / (4.0 * (lk1 + lk2 - 2.0 * LN_Z + (w11 + w22) / RT))
    ln_act = 0.5 * (lk1 + lk2 + lnK + lnf) - (w12 + w21 - w11 - w22) / (2.0 * RT)
    D1 = C.BOLTZMANN * T / (6.0 * math.pi * ETA * r1)
    D2 = C.BOLTZMANN * T / (6.0 * math.pi * ETA * r2)
    t = (zo1 * zr2 - table.zz_min) * table.n + (r12 - table.r0) / table.step
    i = int(t)
    ln_F = values[i] + (t - i) * slopes[i] - 2.0 * math.log(r12)  # the table holds ln F + 2 ln r12
    ln_kD = math.log(4.0 * math.pi * C.AVOGADRO * 1000.0 * (D1 + D2) * r12) + ln_F
    hi, lo = max(ln_act, ln_kD), min(ln_act, ln_kD)
    return lo - math.log1p(math.exp(lo - hi))


def best_of(fn, repeat):
    times = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t0)
    return min(times), statistics.median(times)


def best_cpu(fn, repeat):
    """Least process CPU time of `repeat` runs, s (for single-threaded runs)."""
    times = []
    for _ in range(repeat):
        t0 = time.process_time()
        fn()
        times.append(time.process_time() - t0)
    return min(times)


def import_cost():
    code = "import crossrate.core.cross_rate, crossrate.core.solvents, crossrate.core.rate_grid"
    env = dict(os.environ, PYTHONPATH=str(ROOT))

    def run(src):
        t0 = time.perf_counter()
        subprocess.run([sys.executable, "-c", src], check=True, env=env, cwd=ROOT)
        return time.perf_counter() - t0

    base = statistics.median(run("pass") for _ in range(5))
    numpy_only = statistics.median(run("import numpy") for _ in range(5))
    core = statistics.median(run(code) for _ in range(5))
    probe = code + "; import sys; m = sys.modules; print(sum(k.startswith('scipy') for k in m), " \
        "sorted({k.split('.')[1] for k in m if k.startswith('scipy.') and not k.startswith('scipy._')}), " \
        "[k for k in ('textual', 'rich', 'scipy.optimize', 'scipy.special', 'scipy.stats') if k in m])"
    out = subprocess.run([sys.executable, "-c", probe], check=True, env=env, cwd=ROOT, capture_output=True, text=True)
    return base, numpy_only, core, out.stdout.strip()


def main() -> int:
    cp = synthetic_couples(N_COUPLES)
    cols = (cp["E"], cp["z_ox"], cp["z_red"], cp["r"], cp["ln_k"])
    cond = (T, I, EPS, ETA, LN_Z)
    n_pairs = N_COUPLES * N_COUPLES
    print(f"crossrate core benchmark: {N_COUPLES} synthetic couples -> {n_pairs:,} ordered pairs, I = {I} M, "
          f"water at {T} K, work terms and diffusion cap on; {os.cpu_count()} CPUs")

    ln_k_obs_grid(*cols, *cols, *cond)  # warm-up (page faults, thread start)
    grid_best, grid_med = best_of(lambda: ln_k_obs_grid(*cols, *cols, *cond), 7)
    one_best, _ = best_of(lambda: ln_k_obs_grid(*cols, *cols, *cond, workers=1), 3)
    cls_best, _ = best_of(lambda: ln_k_obs_grid(*cols, *cols, *cond, classify=True), 3)
    rng = np.random.default_rng(7)
    oi, ri = rng.integers(0, N_COUPLES, n_pairs), rng.integers(0, N_COUPLES, n_pairs)
    pairs_best, _ = best_of(lambda: ln_k_obs_pairs(oi, ri, *cols, *cond), 3)
    print(f"  fast grid, ln k_obs only, 2 threads : best {grid_best:.4f} s, median {grid_med:.4f} s "
          f"({grid_best / n_pairs * 1e9:.1f} ns/pair)")
    print(f"  fast grid, 1 thread                 : best {one_best:.4f} s")
    print(f"  fast grid + regime + diffusion flag : best {cls_best:.4f} s")
    print(f"  fast index pairs (4M random pairs)  : best {pairs_best:.4f} s")

    t0 = time.perf_counter()
    ref = cross_rate(
        cp["E"][:, None], cp["E"][None, :], cp["z_ox"][:, None], cp["z_red"][:, None], cp["z_ox"][None, :],
        cp["z_red"][None, :], cp["r"][:, None], cp["r"][None, :], cp["ln_k"][:, None], cp["ln_k"][None, :], *cond,
    )
    broadcast_s = time.perf_counter() - t0
    fast = ln_k_obs_grid(*cols, *cols, *cond).ln_k_obs
    dev = np.max(np.abs(fast - ref.ln_k_obs) / np.maximum(1.0, np.abs(ref.ln_k_obs)))
    del ref
    print(f"  broadcast cross_rate() (all fields) : {broadcast_s:.3f} s; fast path agrees to {dev:.1e} "
          "(|d ln k| / max(1, |ln k|))")

    sub_o, sub_r = oi[:N_SCALAR], ri[:N_SCALAR]
    lists = [c.tolist() for c in cols]
    table = screened_debye_table(cp["z_ox"], cp["r"], cp["z_red"], cp["r"], T, I, EPS)
    tab = (table, table.values.tolist(), table.slopes.tolist())
    t0 = time.perf_counter()
    slow = [
        scalar_ln_k_obs(*(c[i] for c in lists), *(c[j] for c in lists), *tab)
        for i, j in zip(sub_o.tolist(), sub_r.tolist(), strict=True)
    ]
    scalar_s = time.perf_counter() - t0
    per_pair_slow = scalar_s / N_SCALAR
    per_pair_fast = grid_best / n_pairs
    sdev = np.max(np.abs(np.array(slow) - fast[sub_o, sub_r]))
    speedup = per_pair_slow / per_pair_fast
    print(f"  scalar Python loop (math), {N_SCALAR} pairs: {scalar_s:.3f} s = {per_pair_slow * 1e6:.2f} us/pair "
          f"-> {per_pair_slow * n_pairs:.1f} s extrapolated to all pairs; max |d ln k| vs fast path {sdev:.1e}")
    print(f"  speed-up of the fast path per pair  : {speedup:,.0f}x")

    # CPU time of one thread: on a shared machine wall-clock differences of two ~0.1 s runs are mostly noise.
    cap_cpu = best_cpu(lambda: ln_k_obs_grid(*cols, *cols, *cond, workers=1), 9)
    no_cap_cpu = best_cpu(lambda: ln_k_obs_grid(*cols, *cols, *cond, diffusion=False, workers=1), 9)
    build, _ = best_of(lambda: screened_debye_table(cp["z_ox"], cp["r"], cp["z_red"], cp["r"], T, I, EPS), 7)
    kd_cost = max(cap_cpu - no_cap_cpu, 0.0)
    print(f"  k_D part of the grid, 1 thread CPU  : {kd_cost:.4f} s (grid {cap_cpu:.4f} s with the cap, "
          f"{no_cap_cpu:.4f} s without); the screened-diffusion table alone {build * 1e3:.1f} ms "
          f"({table.n} points x {len(table.zz_present)} charge products)")

    base, numpy_only, core, probe = import_cost()
    print(f"  import cost (fresh interpreter)     : core {core * 1e3:.0f} ms; bare python {base * 1e3:.0f} ms, "
          f"python + numpy {numpy_only * 1e3:.0f} ms")
    print(f"  modules after importing the core    : scipy modules, scipy subpackages, forbidden present = {probe}")

    ok_time, ok_speed, ok_kd = grid_best <= TARGET_S, speedup >= TARGET_SPEEDUP, kd_cost <= TARGET_KD_S
    print(f"target 4M pairs <= {TARGET_S} s: {'met' if ok_time else 'MISSED'} ({grid_best:.4f} s); "
          f"target >= {TARGET_SPEEDUP:.0f}x scalar loop: {'met' if ok_speed else 'MISSED'} ({speedup:,.0f}x); "
          f"target k_D part <= {TARGET_KD_S} s: {'met' if ok_kd else 'MISSED'} ({kd_cost:.4f} s)")
    return 0 if ok_time and ok_speed and ok_kd else 1


if __name__ == "__main__":
    sys.exit(main())
