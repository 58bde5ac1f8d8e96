"""Fuzzing the library reader/validator and the CSV inputs (quick part; the long run with tens of thousands of
files is tests/benchmarks/bench_faults_fuzz.py): zero tracebacks, every message names the file (and the line
where there is one), exit 2 for every invalid file, no invalid value accepted."""

import collections
import math

import pytest
from fault_corpus import (
    LIBRARY_CASES,
    NUMERIC_FIELDS,
    VALID_CSV,
    VALID_LIBRARY,
    check_csv_file,
    check_library_file,
    check_validate_command,
    csv_corpus,
    library_corpus,
)
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from crossrate.errors import LibraryError
from crossrate.library.schema import FIELDS_BY_NAME
from crossrate.library.toml_reader import read_library_file

SEED = 20261202


def test_seeded_library_corpus(tmp_path):
    verdicts = collections.Counter()
    failures = []
    for i, (kind, data) in enumerate(library_corpus(360, SEED)):
        p = tmp_path / f"lib{i}.toml"
        p.write_bytes(data)
        verdict, fails = check_library_file(p)
        if i % 4 == 0 or verdict == "valid":  # the command line for a share of them (it costs more)
            fails += check_validate_command(p, verdict)
        verdicts[verdict] += 1
        failures += [f"{kind} #{i}: {f}" for f in fails]
    assert failures == []
    assert verdicts["crash"] == 0 and verdicts["invalid"] > 250 and verdicts["valid"] > 5
    assert len(LIBRARY_CASES) == 12  # every kind ran 30 times


def test_seeded_csv_corpus(tmp_path):
    failures = []
    verdicts = collections.Counter()
    for i, (kind, case, data) in enumerate(csv_corpus(240, SEED)):
        p = tmp_path / f"in{i}.csv"
        p.write_bytes(data)
        verdict, fails = check_csv_file(p, kind)
        verdicts[verdict] += 1
        failures += [f"{kind}/{case} #{i}: {f}" for f in fails]
    assert failures == []
    assert verdicts["crash"] == 0 and verdicts["invalid"] > 100 and verdicts["valid"] > 10


def test_the_valid_bases_are_valid(tmp_path):
    p = tmp_path / "lib.toml"
    p.write_text(VALID_LIBRARY, encoding="utf-8")
    assert check_library_file(p) == ("valid", [])
    for kind, text in VALID_CSV.items():
        q = tmp_path / f"{kind}.csv"
        q.write_text(text, encoding="utf-8")
        assert check_csv_file(q, kind) == ("valid", [])


_numbers = st.one_of(
    st.integers(min_value=-(10**500), max_value=10**500),
    st.floats(allow_nan=True, allow_infinity=True),
    st.floats(min_value=-1e-300, max_value=1e-300),
    st.sampled_from(["nan", "inf", "-inf", "1e400", "0x1F", "1_0", '"5"', "true", "[]", "{}", "1979-05-27"]),
)


def _toml_number(v) -> str:
    if isinstance(v, str):
        return v
    if isinstance(v, float):
        return "nan" if math.isnan(v) else ("inf" if v > 0 else "-inf") if math.isinf(v) else repr(v)
    return str(v)


@settings(max_examples=150, deadline=None, suppress_health_check=[HealthCheck.function_scoped_fixture])
@given(field=st.sampled_from([f for f in NUMERIC_FIELDS if f in FIELDS_BY_NAME]), value=_numbers)
def test_any_number_in_any_numeric_field(tmp_path, field, value):
    # Put the value into couple hl-a (adding the field when it is absent); the file is either refused with
    # a message on that field's line, or accepted with the value inside the field's documented range.
    text = VALID_LIBRARY.replace("[couple.hl-a]\n", f"[couple.hl-a]\n{field} = {_toml_number(value)}\n", 1)
    lines = text.split("\n")
    # drop the field's own later line in hl-a so the key is not duplicated
    start = lines.index("[couple.hl-a]")
    end = lines.index("[couple.hl-b]")
    for i in range(start + 2, end):
        if lines[i].startswith(f"{field} = "):
            lines[i] = ""
    if field in ("E00",):
        lines.insert(start + 1, 'excited_form = "ox"')
    p = tmp_path / "lib.toml"
    p.write_text("\n".join(lines), encoding="utf-8")
    spec = FIELDS_BY_NAME[field]
    try:
        lf = read_library_file(p)
    except LibraryError as exc:
        assert all(str(q).startswith(str(p)) for q in exc.problems)
        hit = [q for q in exc.problems if q.couple == "hl-a" and q.field in (field, "charge_ox")]
        syntax = [q for q in exc.problems if "TOML syntax error" in q.message]
        assert hit or syntax, [str(q) for q in exc.problems]
        assert all(q.line for q in hit + syntax)
        return
    got = getattr(lf.couple("hl-a"), field)
    assert got is not None and math.isfinite(got) and spec.in_range(got)


@pytest.mark.parametrize("kind", sorted(VALID_CSV))
@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.function_scoped_fixture])
@given(cell=st.one_of(st.text(max_size=12), _numbers.map(_toml_number)), col=st.integers(min_value=0, max_value=7))
def test_any_cell_in_any_csv_column(tmp_path, kind, cell, col):
    lines = VALID_CSV[kind].rstrip("\n").split("\n")
    row = len(lines) - 1
    cells = lines[row].split(",")
    cells[col % len(cells)] = '"' + cell.replace('"', '""') + '"'
    lines[row] = ",".join(cells)
    p = tmp_path / f"{kind}.csv"
    p.write_text("\n".join(lines) + "\n", encoding="utf-8")
    verdict, failures = check_csv_file(p, kind)
    assert verdict != "crash" and failures == []


def test_csv_inputs_through_the_command_line(tmp_path):
    # A share of the corpus through the commands themselves: exit 2 for an unreadable input, and nothing on
    # stderr but crossrate's own lines (no traceback, no library warning).
    import io
    import warnings
    from contextlib import redirect_stderr, redirect_stdout

    from crossrate.cli.main import main

    lib = tmp_path / "lib.toml"
    lib.write_text(VALID_LIBRARY, encoding="utf-8")
    commands = {
        "measured": lambda p: ["check", str(p), "--samples", "200"],
        "series": lambda p: ["fit", str(p)],
        "partner": lambda p: ["solve", "k-self", "hl-a", "--from-csv", str(p)],
        "candidates": lambda p: ["screen", "hl-a", "--role", "oxidant", "--candidates", str(p)],
    }
    failures = []
    for i, (kind, case, data) in enumerate(csv_corpus(60, SEED + 1)):
        if kind not in commands:
            continue
        p = tmp_path / f"cli{i}.csv"
        p.write_bytes(data)
        verdict, _ = check_csv_file(p, kind)
        argv = commands[kind](p)
        if kind != "series":
            argv += ["--no-bundled", "--library", str(lib)]
        err = io.StringIO()
        with warnings.catch_warnings(record=True) as caught, redirect_stdout(io.StringIO()), redirect_stderr(err):
            warnings.simplefilter("always")
            try:
                rc = main(argv)
            except SystemExit as exc:  # argparse usage errors
                rc = exc.code
        text = err.getvalue()
        if verdict == "invalid" and rc != 2:
            failures.append(f"{kind}/{case} #{i}: invalid input, exit {rc}: {text[:200]}")
        if "Traceback" in text or caught:
            failures.append(f"{kind}/{case} #{i}: {text[:200]} {[str(w.message) for w in caught][:2]}")
    assert failures == []


def test_header_only_candidate_table_is_one_line(tmp_path):
    import io
    import warnings
    from contextlib import redirect_stderr, redirect_stdout

    from crossrate.cli.main import main

    lib = tmp_path / "lib.toml"
    lib.write_text(VALID_LIBRARY, encoding="utf-8")
    cand = tmp_path / "cand.csv"
    cand.write_text("id,charge_ox,charge_red,E,radius,k_self\n", encoding="utf-8")
    err = io.StringIO()
    with warnings.catch_warnings(record=True) as caught, redirect_stdout(io.StringIO()), redirect_stderr(err):
        warnings.simplefilter("always")
        rc = main(["screen", "hl-a", "--role", "oxidant", "--candidates", str(cand), "--no-bundled", "--library",
                   str(lib)])
    assert rc == 2 and caught == []  # numpy's "input contained no data" stays inside
    assert err.getvalue().count("\n") == 1 and "a header but no candidates" in err.getvalue()


def test_pipes_and_devices_are_refused_at_once(tmp_path):
    # A FIFO nobody writes to would block a plain open() forever: every CSV reader refuses it at once.
    import os
    import signal

    from crossrate.errors import CrossrateError
    from crossrate.library.candidate_table import read_candidate_table
    from crossrate.library.couple_import import read_couples_csv
    from crossrate.services.measured_csv import read_measured_csv, read_partner_csv, read_series_csv

    fifo = tmp_path / "pipe.csv"
    os.mkfifo(fifo)
    readers = (read_measured_csv, read_partner_csv, read_series_csv, read_couples_csv, read_candidate_table)

    def hung(*_):
        raise TimeoutError("a reader waited on the FIFO")

    old = signal.signal(signal.SIGALRM, hung)
    signal.alarm(10)
    try:
        for reader in readers:
            for path in (fifo, "/dev/zero"):
                with pytest.raises(CrossrateError, match=r"(pipe|device|not a regular file)"):
                    reader(path)
    finally:
        signal.alarm(0)
        signal.signal(signal.SIGALRM, old)
