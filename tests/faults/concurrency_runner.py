"""Several writers on one library file at once, plus an outside program editing it without the lock.

Writers are forked children (half through the command line `library add`, half through the Python API's
add_couple), each adding its own couples and retrying when refused; the outside program appends comment
lines at random moments, as a script or an editor's append would. Afterwards: every couple a writer was
told had landed is in the file, every outside line is in the file or in the conflict copy crossrate saved,
and every refusal was one line saying what happened and what to do. Shared by
tests/faults/test_faults_concurrency.py and tests/benchmarks/bench_faults_concurrency.py.
"""

import io
import json
import os
import random
import time
from contextlib import redirect_stderr, redirect_stdout
from dataclasses import dataclass, field
from pathlib import Path

from fault_corpus import VALID_LIBRARY

#: Words a refusal must contain: what happened, and what to do.
WHAT_TO_DO = ("reload", "try again", "merge", "make the edit again")


@dataclass
class ConcurrencyStats:
    writers: int
    landed: int = 0
    refusals: int = 0
    outside_lines: int = 0
    saved_outside_lines: int = 0
    lost_couples: list[str] = field(default_factory=list)
    lost_outside_lines: list[str] = field(default_factory=list)
    bad_messages: list[str] = field(default_factory=list)
    errors: list[str] = field(default_factory=list)


def _couple_args(cid: str) -> list[str]:
    return ["--id", cid, "--name", f"concurrent {cid}", "--charge-ox", "3", "--charge-red", "2", "--E", "0.3",
            "--radius", "4", "--ionic-strength", "0.1", "--source", "invented"]


def _add_cli(path: Path, cid: str) -> tuple[bool, str | None]:
    from crossrate.cli.main import main

    err = io.StringIO()
    with redirect_stdout(io.StringIO()), redirect_stderr(err):
        rc = main(["library", "add", str(path), *_couple_args(cid)])
    if rc == 0:
        return True, None
    message = err.getvalue()
    return "crossrate's edit is in the file" in message, message


def _add_api(path: Path, cid: str) -> tuple[bool, str | None]:
    from crossrate import Couple
    from crossrate.errors import CrossrateError
    from crossrate.library.couple_edits import add_couple
    from crossrate.library.toml_reader import read_library_file

    try:
        lf = read_library_file(path)
        c = Couple(id=cid, name=f"concurrent {cid}", charge_ox=3, charge_red=2, E=0.3, E_scale="SHE", radius=4.0,
                   medium="water", ionic_strength=0.1, temperature=298.15, source="invented")
        add_couple(path, c, lf.sha256)
        return True, None
    except CrossrateError as exc:
        message = str(exc)
        return "crossrate's edit is in the file" in message, message + "\n"


def _writer_child(path: Path, w: int, adds: int, via: str, log: Path, seed: int) -> None:
    rng = random.Random(seed)
    add = _add_cli if via == "cli" else _add_api
    with open(log, "w", encoding="utf-8") as out:
        for n in range(adds):
            cid = f"w{w}-n{n:03d}"
            for _attempt in range(200):
                landed, message = add(path, cid)
                out.write(json.dumps({"id": cid, "landed": landed, "message": message}) + "\n")
                out.flush()
                if landed:
                    break
                time.sleep(rng.uniform(0, 0.01))


def _outside_child(path: Path, lines: int, log: Path, seed: int, period_s: float) -> None:
    rng = random.Random(seed)
    with open(log, "w", encoding="utf-8") as out:
        for n in range(lines):
            time.sleep(rng.uniform(0, period_s))
            text = f"# outside edit {n:04d}\n"
            with open(path, "a", encoding="utf-8") as fh:  # no lock: another program
                fh.write(text)
            out.write(text)
            out.flush()


def _fork(fn, *args) -> int:
    pid = os.fork()
    if pid == 0:
        code = 0
        try:
            fn(*args)
        except BaseException:
            import traceback

            traceback.print_exc()
            code = 1
        os._exit(code)
    return pid


def run_concurrency(folder: Path, writers: int, adds: int, outside_lines: int, seed: int,
                    period_s: float = 0.05) -> ConcurrencyStats:
    """One contest: `writers` writers (alternately CLI and API) adding `adds` couples each, and an outside
    program appending `outside_lines` comment lines; the ConcurrencyStats of what was lost or misreported."""
    path = folder / "lib.toml"
    path.write_text(VALID_LIBRARY, encoding="utf-8")
    pids = []
    logs = []
    for w in range(writers):
        log = folder / f"writer{w}.jsonl"
        logs.append(log)
        pids.append(_fork(_writer_child, path, w, adds, "cli" if w % 2 == 0 else "api", log, seed + w))
    outside_log = folder / "outside.log"
    pids.append(_fork(_outside_child, path, outside_lines, outside_log, seed + 100, period_s))
    stats = ConcurrencyStats(writers)
    for pid in pids:
        _, status = os.waitpid(pid, 0)
        if os.waitstatus_to_exitcode(status) != 0:
            stats.errors.append(f"a child exited with {os.waitstatus_to_exitcode(status)}")
    final = path.read_text(encoding="utf-8")
    saved = "".join(p.read_text(encoding="utf-8") for p in folder.iterdir() if ".conflict-" in p.name)
    for log in logs:
        for line in log.read_text(encoding="utf-8").splitlines():
            rec = json.loads(line)
            if rec["message"] is not None:
                stats.refusals += 1
                msg = rec["message"]
                lines = msg.rstrip("\n").split("\n")
                if len(lines) != 1 or not any(word in msg for word in WHAT_TO_DO):
                    stats.bad_messages.append(msg[:300])
            if rec["landed"]:
                stats.landed += 1
                if f"[couple.{rec['id']}]" not in final:
                    stats.lost_couples.append(rec["id"])
    for text in outside_log.read_text(encoding="utf-8").splitlines(keepends=True):
        stats.outside_lines += 1
        if text not in final:
            if text in saved:
                stats.saved_outside_lines += 1
            else:
                stats.lost_outside_lines.append(text.strip())
    return stats
