"""Coverage and speed of `crossrate fit` (issues 11 and 14). Prints figures; asserts nothing (not a pytest test).

Run: .venv/bin/python tests/benchmarks/bench_series_fit.py [N]   (N series per kind, default 50)
Targets: coverage of the reported 95 % lambda interval >= 90 % for every kind (an open side counts as
covering); semiclassical series (recovery cases, hbar omega fixed at the generating value): lambda_s and
lambda_v within 10 % of the truth in >= 95 % of the series whose fit calls them separately determined, with
the fraction determined and the coverage of their 95 % intervals shown; one fit <= 0.5 s. The series are generated from formulas written here (the same as tests/analysis/
test_analysis_fit_models.py), not from the fitting code.
"""

import math
import os
import statistics
import sys
import time
from pathlib import Path

REPO = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(REPO))
sys.path.insert(0, str(REPO / "tests" / "analysis"))

import numpy as np  # noqa: E402
from test_analysis_fit_models import (  # noqa: E402
    CM1_KJ,
    EV_KJ,
    covers,
    log10_levelled,
    log10_marcus,
    log10_mlj_cold,
    series,
    with_cap,
)

from crossrate.errors import ScienceError  # noqa: E402
from crossrate.services.series_fit import fit_series  # noqa: E402

LAM = 0.8 * EV_KJ
LS, LV, HW = 0.35 * EV_KJ, 0.45 * EV_KJ, 1500.0 * CM1_KJ


def kinds():
    wide = -np.linspace(-0.2, 1.6, 13) * EV_KJ
    fall = -np.linspace(-0.2, 2.0, 13) * EV_KJ
    intra = -np.linspace(0.0, 2.4, 16) * EV_KJ
    few = -np.array([-0.2, 0.2, 0.5, 0.8, 1.1, 1.4]) * EV_KJ
    return {
        "plateau, no falloff (k_D, levelled curve)": (wide, with_cap(log10_levelled(wide, LAM, 11.0), 9.7), 0.15,
                                                      "bimolecular", LAM),
        "falloff (k_D, classical curve)": (fall, with_cap(log10_marcus(fall, LAM, 11.0), 9.7), 0.15,
                                           "bimolecular", LAM),
        "no cap, semiclassical (s^-1)": (intra, log10_mlj_cold(intra, LS, LV, HW, 11.0), 0.1, "unimolecular",
                                         LS + LV),
        "few points (6, k_D)": (few, with_cap(log10_marcus(few, LAM, 11.0), 9.7), 0.15, "bimolecular", LAM),
        "large noise (0.5 log10, k_D)": (fall, with_cap(log10_marcus(fall, LAM, 11.0), 9.7), 0.5,
                                         "bimolecular", LAM),
    }


def recovery_cases():
    """Semiclassical series (lambda_s = 0.35 eV, lambda_v = 0.45 eV, hbar omega 1500 cm^-1, the fit's hbar
    omega fixed at that value): (-Delta G deg values in kJ/mol, noise in log10 k, log10 k_D or None)."""
    return {
        "16 points, 0-2.4 eV, noise 0.05 (well designed)": (-np.linspace(0.0, 2.4, 16) * EV_KJ, 0.05, None),
        "16 points, 0-2.4 eV, noise 0.10": (-np.linspace(0.0, 2.4, 16) * EV_KJ, 0.10, None),
        "10 points, 0.2-2.0 eV, noise 0.10": (-np.linspace(0.2, 2.0, 10) * EV_KJ, 0.10, None),
        "10 points, 0-1.0 eV, noise 0.05 (narrow range)": (-np.linspace(0.0, 1.0, 10) * EV_KJ, 0.05, None),
        "16 points, 0-2.4 eV, noise 0.05, k_D 10^9.7": (-np.linspace(0.0, 2.4, 16) * EV_KJ, 0.05, 9.7),
    }


def _pct(k, n):
    return f"{100.0 * k / n:5.1f} %" if n else "    - (none)"


def recovery(n: int, times, cpu) -> None:
    print(f"recovery of lambda_s = {LS:.1f} and lambda_v = {LV:.1f} kJ/mol, {n} series per case "
          "(target: >= 95 % within 10 % when the fit calls the split determined)")
    for name, (dG, noise, log_kd) in recovery_cases().items():
        log_k = log10_mlj_cold(dG, LS, LV, HW, 11.0)
        kind = "unimolecular" if log_kd is None else "bimolecular"
        if log_kd is not None:
            log_k = with_cap(log_k, log_kd)
        det = det_within = within = cov_s = cov_v = 0
        case_cpu = []
        for seed in range(n):
            data = series(dG, log_k, noise, 2000 + seed, kind=kind)
            t0, c0 = time.perf_counter(), time.process_time()
            fit = fit_series(data)
            times.append(time.perf_counter() - t0)
            cpu.append(time.process_time() - c0)
            case_cpu.append(cpu[-1])
            sc = fit.model_fit("semiclassical")
            ok = abs(sc.lambda_s_kJ_per_mol / LS - 1.0) <= 0.10 and abs(sc.lambda_v_kJ_per_mol / LV - 1.0) <= 0.10
            within += ok
            det += fit.lambda_split_determined
            det_within += ok and fit.lambda_split_determined
            cov_s += covers_interval(sc.lambda_s_95, LS)
            cov_v += covers_interval(sc.lambda_v_95, LV)
        case_cpu.sort()
        print(f"  {name}: determined {_pct(det, n)}; within 10 % when determined {_pct(det_within, det)}"
              f" ({det_within}/{det}); within 10 % overall {_pct(within, n)}; interval coverage lambda_s "
              f"{_pct(cov_s, n)}, lambda_v {_pct(cov_v, n)}; CPU per fit median {statistics.median(case_cpu):.3f} s, "
              f"95th percentile {case_cpu[math.ceil(0.95 * n) - 1]:.3f} s, slowest {case_cpu[-1]:.3f} s")


def covers_interval(iv, truth):
    """An open side counts as covering (the fit said it did not bound that side)."""
    lo, hi = iv if iv is not None else (None, None)
    return (lo is None or lo <= truth) and (hi is None or truth <= hi)


def main(n: int) -> None:
    print(f"{n} series per kind; truth lambda = {LAM:.1f} kJ/mol (classical kinds), "
          f"lambda_s = {LS:.1f}, lambda_v = {LV:.1f} kJ/mol (semiclassical)")
    t0 = time.perf_counter()
    fit_series(series(*kinds()["falloff (k_D, classical curve)"][:3], 999))
    print(f"first fit in this process (imports scipy.optimize): {time.perf_counter() - t0:.3f} s; not counted below")
    times, cpu = [], []
    for name, (dG, log_k, noise, kind, truth) in kinds().items():
        hit = opened = refused = 0
        models = {}
        for seed in range(n):
            data = series(dG, log_k, noise, 1000 + seed, kind=kind)
            t0, c0 = time.perf_counter(), time.process_time()
            try:
                fit = fit_series(data)
            except ScienceError:
                refused += 1  # e.g. the noise hides every point below the plateau: said so, no number
                continue
            times.append(time.perf_counter() - t0)
            cpu.append(time.process_time() - c0)
            hit += covers(fit, truth)
            opened += not fit.lambda_identified
            models[fit.model] = models.get(fit.model, 0) + 1
        done = n - refused
        line = (f"{name:45s} coverage {100.0 * hit / max(done, 1):5.1f} % (target >= 90 %) of {done} fitted; "
                f"{refused} refused; open intervals {opened}; favoured {models}")
        print(line)
    recovery(n, times, cpu)
    for what, t in (("wall-clock", times), ("CPU", cpu)):
        t.sort()
        print(f"one fit ({what}): median {statistics.median(t):.3f} s, 95th percentile "
              f"{t[math.ceil(0.95 * len(t)) - 1]:.3f} s, slowest {t[-1]:.3f} s over {len(t)} fits (target <= 0.5 s)")
    print(f"load average {' '.join(f'{v:.2f}' for v in os.getloadavg())} (other work on the machine slows the "
          "wall-clock figures)")


if __name__ == "__main__":
    main(int(sys.argv[1]) if len(sys.argv) > 1 else 50)
