"""Speed of the couple library (issue 3). A plain script: `python tests/benchmarks/bench_library.py`.

Generates library files of 2,000 and 10,000 synthetic couples (with comments, defaults, a custom scale,
bonds and tags, as a group file would have them) in a temporary folder and prints:
* read + validate with read_library_file (targets: <= 0.15 s for 2,000 couples, <= 0.6 s for 10,000),
  best and median of several runs, beside tomli's parse alone for reference;
* the line-index scan and validation share of that time;
* one safe, comment-keeping edit (update_couple) of a couple in the middle of the 10,000-couple file;
* the whole layered load (bundled libraries plus the 10,000-couple file), first (cache cold) and on repeat
  loads (through the content-keyed cache; target <= 0.15 s), in a cache folder of its own.

Exit status 1 when a target is missed. The couples are synthetic (seeded), not chemistry.
"""

import dataclasses
import os
import random
import statistics
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
if str(ROOT) not in sys.path:  # run from a checkout without `pip install -e .`
    sys.path.insert(0, str(ROOT))

from crossrate.library.couple_edits import update_couple  # noqa: E402
from crossrate.library.layers import load_layered  # noqa: E402
from crossrate.library.line_index import LineIndex  # noqa: E402
from crossrate.library.toml_loads import loads  # noqa: E402
from crossrate.library.toml_reader import read_library_file  # noqa: E402

TARGETS_S = {2000: 0.15, 10000: 0.6}
RUNS = 7


def synthetic_library(n: int, seed: int = 3) -> str:
    """TOML text of n invented couples, in the style of a hand-kept group file."""
    rng = random.Random(seed)
    out = [
        "# Synthetic benchmark library (invented values).",
        "[library]",
        'title = "benchmark"',
        "format = 1",
        'medium = "water"',
        "temperature = 298.15",
        'E_scale = "SHE"',
        "",
        "[library.scales.Fc-MeCN]",
        'name = "ferrocenium/ferrocene in acetonitrile"',
        'relative_to = "SHE"',
        "offset_V = 0.63",
        'source = "common practice, from memory"',
        "",
    ]
    for i in range(n):
        z = rng.randint(-3, 4)
        mecn = i % 5 == 0
        out.append(f"# couple {i}: synthetic")
        out.append(f"[couple.bench-{i:05d}]")
        out.append(f'name = "bench couple {i} ({z}/{z - 1})"')
        out.append(f"charge_ox = {z}")
        out.append(f"charge_red = {z - 1}")
        out.append(f"E = {rng.uniform(-1.5, 1.5):.3f}")
        out.append(f"E_sd = {rng.uniform(0.005, 0.03):.3f}")
        if mecn:
            out.append('E_scale = "Fc-MeCN"')
        if i % 7:
            out.append(f"k_self = {10 ** rng.uniform(-4, 9):.3e}")
            out.append("k_self_log10_sd = 0.3")
        else:
            out.append(f"bonds = [{{count = 6, delta_d = {rng.uniform(0.01, 0.2):.3f}, f_ox = 230.0, f_red = 160.0}}]")
        out.append(f"radius = {rng.uniform(3.0, 7.5):.2f}")
        if mecn:
            out.append('medium = "acetonitrile"')
        out.append("ionic_strength = 0.1  # NaClO4")
        out.append('source = "synthetic benchmark data"')
        out.append('tags = ["bench", "synthetic"]')
        out.append(f"verified = {'true' if i % 3 else 'false'}")
        out.append("")
    return "\n".join(out)


def timed(fn, runs=RUNS):
    times = []
    result = None
    for _ in range(runs):
        t0 = time.perf_counter()
        result = fn()
        times.append(time.perf_counter() - t0)
    return min(times), statistics.median(times), result


def main() -> int:
    ok = True
    with tempfile.TemporaryDirectory() as d:
        folder = Path(d)
        for n, target in TARGETS_S.items():
            path = folder / f"bench_{n}.toml"
            text = synthetic_library(n)
            path.write_text(text, encoding="utf-8")
            best, med, lf = timed(lambda path=path: read_library_file(path))
            assert len(lf.couples) == n
            t_toml, _, _ = timed(lambda text=text: loads(text))
            t_index, _, _ = timed(lambda text=text: LineIndex.scan(text))
            verdict = "ok" if best <= target else "MISSED"
            ok &= best <= target
            print(f"read + validate {n:>6} couples ({len(text) / 1e6:.1f} MB): best {best:.3f} s, median {med:.3f} s "
                  f"(target <= {target:g} s: {verdict})")
            print(f"    of which tomli parse alone {t_toml:.3f} s, line-index scan {t_index:.3f} s, "
                  f"validation and records {max(best - t_toml - t_index, 0):.3f} s")
        big = folder / "bench_10000.toml"
        lf = read_library_file(big)
        c = lf.couples[len(lf.couples) // 2]
        t0 = time.perf_counter()
        update_couple(big, dataclasses.replace(c, notes="edited in the benchmark"), lf.sha256)
        t_edit = time.perf_counter() - t0
        before, after = lf.text.split("\n"), big.read_text(encoding="utf-8").split("\n")
        head = next(i for i, (a, b) in enumerate(zip(before, after, strict=False)) if a != b)
        tail = next(i for i, (a, b) in enumerate(zip(reversed(before), reversed(after), strict=False)) if a != b)
        print(f"one safe edit in the 10,000-couple file (parse, validate the new text, lock, check sha256, backup, "
              f"fsync, replace): {t_edit:.3f} s; lines kept identical: {head} before and {tail} after the "
              f"{len(after) - head - tail} written")
        os.environ["XDG_CACHE_HOME"] = str(folder / "cache")
        os.environ.pop("CROSSRATE_NO_CACHE", None)
        t0 = time.perf_counter()
        load_layered(extra_paths=(str(big),), group=False, personal=False)
        first = time.perf_counter() - t0
        c0 = time.process_time()
        best, med, cs = timed(lambda: load_layered(extra_paths=(str(big),), group=False, personal=False))
        cpu = (time.process_time() - c0) / RUNS
        verdict = "ok" if best <= 0.15 else "MISSED"
        ok &= best <= 0.15
        print(f"layered load (bundled + 10,000-couple file, {len(cs)} couples): first (parse, validate, store in the "
              f"cache) {first:.3f} s; repeat loads best {best:.3f} s, median {med:.3f} s, CPU {cpu:.3f} s per load "
              f"(target <= 0.15 s: {verdict}); load average {os.getloadavg()[0]:.1f} on {os.cpu_count()} cores")
    print("tomlkit (a style-preserving parser) is not a dependency: edits are made on the text instead "
          "(see crossrate/library/table_editor.py)")
    return 0 if ok else 1


if __name__ == "__main__":
    sys.exit(main())
