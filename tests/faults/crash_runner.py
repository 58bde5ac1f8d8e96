"""kill -9 at random moments of each kind of write, and the checks after each kill.

Each round forks a child that runs one write (the modules are imported before the fork, so the child's
whole life is the command's own work), kills it with SIGKILL after a random delay drawn over its usual run
time, then checks: the file holds the old content or a complete, valid new one; and after one more
(unkilled) write of the same kind nothing of the killed run is left beside the file. Shared by
tests/faults/test_faults_crash.py (a handful of rounds) and tests/benchmarks/bench_faults_crash.py.
"""

import io
import os
import random
import re
import signal
import statistics
import time
from contextlib import redirect_stderr, redirect_stdout
from dataclasses import dataclass, field
from pathlib import Path

from fault_corpus import VALID_LIBRARY

KINDS = ("add", "update", "remove", "rename", "import", "workbench_save", "map_out")
LEFTOVER = re.compile(r"^\..*\.[0-9a-f]{12}\.tmp$")


def big_library(n: int = 150) -> str:
    """The fault-test library with n extra invented couples (so a write takes a few milliseconds)."""
    extra = "".join(
        f"\n[couple.x-{i:04d}]\nname = \"extra {i}\"\ncharge_ox = 3\ncharge_red = 2\nE = {0.1 + i * 1e-4:.4f}\n"
        f"k_self = {1.0 + i:.1f}\nradius = 4.0\nionic_strength = 0.1\nsource = \"invented\"\n"
        for i in range(n)
    )
    return VALID_LIBRARY + extra


@dataclass
class CrashStats:
    kind: str
    rounds: int = 0
    killed_before_end: int = 0
    old_after_kill: int = 0
    new_after_kill: int = 0
    failures: list[str] = field(default_factory=list)


def _quiet_main(argv) -> int:
    from crossrate.cli.main import main

    with redirect_stdout(io.StringIO()), redirect_stderr(io.StringIO()):
        return main(argv)


class Writer:
    """One kind of write on one library file (and its map output), round after round."""

    def __init__(self, kind: str, folder: Path):
        self.kind = kind
        self.folder = folder
        self.lib = folder / "lib.toml"
        self.out = folder / "map.csv"
        self.lib.write_text(big_library(), encoding="utf-8")
        self.n = 0

    def action(self):
        """A function the child runs (returns its exit code) and a predicate on the file's text after it."""
        self.n += 1
        n, lib = self.n, str(self.lib)
        if self.kind == "add":
            cid = f"new-{n:05d}"
            argv = ["library", "add", lib, "--id", cid, "--name", f"added {n}", "--charge-ox", "3", "--charge-red", "2",
                    "--E", "0.3", "--radius", "4", "--ionic-strength", "0.1", "--source", "invented"]
            return (lambda: _quiet_main(argv)), (lambda text: f"[couple.{cid}]" in text)
        if self.kind == "remove":
            cid = f"x-{(n - 1) % 150:04d}"
            if f"[couple.{cid}]" not in self.lib.read_text(encoding="utf-8"):
                self.lib.write_text(big_library(), encoding="utf-8")
            argv = ["library", "remove", lib, cid]
            return (lambda: _quiet_main(argv)), (lambda text: f"[couple.{cid}]" not in text)
        if self.kind == "rename":
            text = self.lib.read_text(encoding="utf-8")
            old = "hl-c" if "[couple.hl-c]" in text else next(m for m in re.findall(r"\[couple\.(hl-c-\d+)\]", text))
            new = f"hl-c-{n}"
            argv = ["library", "rename", lib, old, new]
            return (lambda: _quiet_main(argv)), (lambda t: f"[couple.{new}]" in t)
        if self.kind == "import":
            csv_path = self.folder / f"import-{n}.csv"
            csv_path.write_text("id,name,charge_ox,charge_red,E,radius,ionic_strength,source\n" + "".join(
                f"imp-{n}-{j},imported {n} {j},3,2,0.2,4.5,0.1,invented\n" for j in range(3)), encoding="utf-8")
            argv = ["library", "import", str(csv_path), "--into", lib]
            return (lambda: _quiet_main(argv)), (lambda text: f"[couple.imp-{n}-0]" in text)
        if self.kind in ("update", "workbench_save"):
            k = float(10 + n)
            return (lambda: self._update(k)), (lambda text: f"k_self = {k:g}" in text or f"k_self = {k!r}" in text)
        if self.kind == "map_out":
            argv = ["map", "--no-bundled", "--library", lib, "--out", str(self.out), "--force", "--format", "csv"]
            return (lambda: _quiet_main(argv)), None
        raise ValueError(self.kind)

    def _update(self, k: float) -> int:
        import dataclasses

        from crossrate.library.toml_reader import read_library_file

        lf = read_library_file(self.lib)
        c = dataclasses.replace(lf.couple("hl-a"), k_self=k)
        if self.kind == "update":
            from crossrate.library.couple_edits import update_couple

            update_couple(self.lib, c, lf.sha256)
            return 0
        # the workbench's save path: its library access module, with the form's values
        from crossrate.tui.library_access import load_layered_set, write_couple

        cs, _ = load_layered_set([str(self.lib)], bundled=False, group=False, personal=False)
        values = {f: getattr(c, f) for f in ("name", "charge_ox", "charge_red", "E", "E_sd", "k_self",
                                             "k_self_log10_sd", "radius", "ionic_strength", "source", "verified")}
        values["tags"] = list(c.tags)
        write_couple("update", cs, str(self.lib), "hl-a", values, lf.sha256)
        return 0


def _run_child(fn) -> int:
    pid = os.fork()
    if pid == 0:
        code = 70
        try:
            code = int(fn() or 0)
        except BaseException:
            code = 71
        os._exit(code)
    return pid


def _leftovers(folder: Path) -> list[str]:
    return sorted(p.name for p in folder.iterdir() if LEFTOVER.match(p.name))


def timed_runs(writer: Writer, n: int = 3) -> float:
    """Median run time of an unkilled write of this kind, s."""
    times = []
    for _ in range(n):
        fn, _ = writer.action()
        t = time.perf_counter()
        pid = _run_child(fn)
        _, status = os.waitpid(pid, 0)
        times.append(time.perf_counter() - t)
        if os.waitstatus_to_exitcode(status) != 0:
            raise RuntimeError(f"{writer.kind}: an unkilled write failed with {os.waitstatus_to_exitcode(status)}")
    return statistics.median(times)


def crash_rounds(kind: str, folder: Path, rounds: int, seed: int) -> CrashStats:
    """`rounds` kill -9 rounds of one kind of write in `folder`; CrashStats with every failure described."""
    from crossrate.errors import CrossrateError
    from crossrate.library.toml_reader import read_library_file

    rng = random.Random(seed)
    writer = Writer(kind, folder)
    median = timed_runs(writer)
    stats = CrashStats(kind)
    for r in range(rounds):
        target = writer.out if kind == "map_out" else writer.lib
        before = target.read_bytes() if target.exists() else None
        fn, is_new = writer.action()
        pid = _run_child(fn)
        time.sleep(rng.uniform(0.0, 1.2 * median))
        os.kill(pid, signal.SIGKILL)
        _, status = os.waitpid(pid, 0)
        stats.rounds += 1
        if os.WIFSIGNALED(status):
            stats.killed_before_end += 1
        after = target.read_bytes() if target.exists() else None
        if after == before:
            stats.old_after_kill += 1
        else:
            stats.new_after_kill += 1
            if kind == "map_out":
                text = after.decode("utf-8") if after is not None else ""
                rows = text.splitlines()
                if not rows or not rows[0].startswith("oxidant\\reductant") or len(rows) != len(rows[0].split(",")) - 1:
                    stats.failures.append(f"round {r}: torn map file ({len(rows)} lines)")
            else:
                try:
                    read_library_file(target)
                except CrossrateError as exc:
                    stats.failures.append(f"round {r}: invalid file after the kill: {str(exc)[:200]}")
                if after is None or not is_new(after.decode("utf-8")):
                    stats.failures.append(f"round {r}: file changed but is not the new version")
        # the next run of the same kind completes and leaves nothing of the killed one behind
        fn, _ = writer.action()
        pid = _run_child(fn)
        _, status = os.waitpid(pid, 0)
        if os.waitstatus_to_exitcode(status) != 0:
            stats.failures.append(f"round {r}: the next write failed (exit {os.waitstatus_to_exitcode(status)})")
        left = _leftovers(folder)
        if left:
            stats.failures.append(f"round {r}: leftovers after the next write: {left}")
    return stats
