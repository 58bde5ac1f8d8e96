"""Speed of the cyclic-voltammetry simulation (issue 15). A plain script:
`python tests/benchmarks/bench_electrode.py`.

Prints the time of one voltammogram in process (Butler-Volmer, window +-0.2 V, about 3100 steps;
target: <= 50 ms on the 2-core machine), the same with Marcus-Hush-Chidsey kinetics and with an
uncompensated resistance (no target; reported), and the time of k(eta) for 2001 overpotentials (MHC).
Exit status 1 when the target is missed. Best of several repetitions, so a busy machine counts less.
"""

import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
if str(ROOT) not in sys.path:
    sys.path.insert(0, str(ROOT))

from crossrate.services.electrode_kinetics import rate_curves  # noqa: E402
from crossrate.services.voltammogram import CvSetup, simulate_voltammogram  # noqa: E402

TARGET_S = 0.050


def best(job, repeat=7):
    times = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        job()
        times.append(time.perf_counter() - t0)
    return min(times)


def main() -> int:
    bv = CvSetup(log10_k0=-2.0)
    mhc = CvSetup(log10_k0=-2.0, kinetics="mhc", lambda_el_kJ_per_mol=50.0)
    ru = CvSetup(log10_k0=-2.0, Ru_ohm=200.0)
    steps = simulate_voltammogram(bv, 1.0).E_V.size
    t_bv = best(lambda: simulate_voltammogram(bv, 1.0))
    t_mhc = best(lambda: simulate_voltammogram(mhc, 1.0))
    t_ru = best(lambda: simulate_voltammogram(ru, 1.0), repeat=3)
    t_k = best(lambda: rate_curves(-2.0, 50.0, eta_max_V=1.0, points=2001))
    print(f"one voltammogram, Butler-Volmer ({steps} steps): {t_bv * 1e3:.1f} ms (target <= {TARGET_S * 1e3:.0f} ms)")
    print(f"one voltammogram, Marcus-Hush-Chidsey:        {t_mhc * 1e3:.1f} ms")
    print(f"one voltammogram, Butler-Volmer with Ru:      {t_ru * 1e3:.1f} ms")
    print(f"k(eta) at 2001 overpotentials, BV + MHC:      {t_k * 1e3:.1f} ms")
    ok = t_bv <= TARGET_S
    print("target met" if ok else "TARGET MISSED")
    return 0 if ok else 1


if __name__ == "__main__":
    sys.exit(main())
